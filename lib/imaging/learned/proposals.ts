/**
 * Scored cells → suggested regions, in working pixels. Decisions:
 * - Each cell goes to the class whose score is the largest multiple of that class's threshold.
 *   Cells at or above the threshold seed a region; a region grows through 8-connected cells of
 *   the same class scoring at least GROW_RATIO of the threshold (hysteresis, so a scratch that
 *   fades for a cell or two stays one region).
 * - Regions smaller than the class's `minCells` are dropped; a region's score is its best cell's.
 * - The shape follows what inspectors drew for that class in training: Line classes get a
 *   polyline through the marks (each cell's centre-versus-surround centroid, averaged in steps
 *   along the region's main axis) with the class's usual width; Outline classes the convex hull
 *   of the region's cells; Spot classes a disc at the region's centre.
 */
import type { Point, Shape } from "@/lib/geometry/shape";
import { simplifyPolyline } from "@/lib/geometry/simplify";
import type { CellGrid } from "./cell-grid";
import { ridgeCentroid } from "./features";

export type ShapeKindForClass = "line" | "outline" | "spot";

export type ClassProposalSpec = {
  kind: ShapeKindForClass;
  threshold: number;
  /** Working pixels. */
  lineWidth: number;
  spotRadius: number;
  minCells: number;
};

export type Proposal = { classIndex: number; shape: Shape; score: number };

export const GROW_RATIO = 0.6;
/** Cells per step along a Line when averaging its centreline. */
const LINE_STEP_CELLS = 2;

/**
 * `scores[c][cell]` is class c's vote share (class 0 = "no defect" is not in the list: index c
 * here is class c + 1 of the model); cells with `active[cell] = 0` are outside the Surface.
 */
export function proposeRegions(grid: CellGrid, scores: readonly Float32Array[], active: Uint8Array, specs: readonly ClassProposalSpec[], onlyClass?: number): Proposal[] {
  const cells = grid.cols * grid.rows;
  const owner = new Int16Array(cells).fill(-1);
  const seed = new Uint8Array(cells);
  for (let cell = 0; cell < cells; cell++) {
    if (!active[cell]) continue;
    let best = -1;
    let bestRatio = GROW_RATIO;
    for (let c = 0; c < specs.length; c++) {
      if (onlyClass !== undefined && c !== onlyClass) continue;
      const ratio = scores[c][cell] / specs[c].threshold;
      if (ratio >= bestRatio) [best, bestRatio] = [c, ratio];
    }
    owner[cell] = best;
    seed[cell] = best >= 0 && bestRatio >= 1 ? 1 : 0;
  }
  const visited = new Uint8Array(cells);
  const proposals: Proposal[] = [];
  for (let start = 0; start < cells; start++) {
    if (!seed[start] || visited[start]) continue;
    const c = owner[start];
    const members = [start];
    visited[start] = 1;
    for (let head = 0; head < members.length; head++) {
      const cell = members[head];
      const cx = cell % grid.cols;
      const cy = (cell - cx) / grid.cols;
      for (let y = Math.max(0, cy - 1); y <= Math.min(grid.rows - 1, cy + 1); y++) {
        for (let x = Math.max(0, cx - 1); x <= Math.min(grid.cols - 1, cx + 1); x++) {
          const n = y * grid.cols + x;
          if (!visited[n] && owner[n] === c) {
            visited[n] = 1;
            members.push(n);
          }
        }
      }
    }
    if (members.length < specs[c].minCells) continue;
    const score = Math.max(...members.map((cell) => scores[c][cell]));
    proposals.push({ classIndex: c, shape: shapeFor(grid, members, scores[c], specs[c]), score });
  }
  return proposals.sort((a, b) => b.score - a.score);
}

function shapeFor(grid: CellGrid, members: number[], scores: Float32Array, spec: ClassProposalSpec): Shape {
  if (spec.kind === "line") return lineThrough(grid, members, scores, spec.lineWidth);
  if (spec.kind === "spot") {
    let [w, sx, sy] = [0, 0, 0];
    for (const cell of members) {
      const [x, y] = ridgeCentroid(grid, cell);
      w += scores[cell];
      sx += scores[cell] * x;
      sy += scores[cell] * y;
    }
    return { kind: "spot", x: sx / w, y: sy / w, radius: spec.spotRadius * Math.sqrt(members.length) };
  }
  const corners: Point[] = [];
  const size = grid.cellSize;
  for (const cell of members) {
    const cx = cell % grid.cols;
    const cy = (cell - cx) / grid.cols;
    corners.push([cx * size, cy * size], [(cx + 1) * size, cy * size], [(cx + 1) * size, (cy + 1) * size], [cx * size, (cy + 1) * size]);
  }
  return { kind: "polygon", points: convexHull(corners) };
}

/** Andrew's monotone chain; counter-clockwise in y-up terms, no collinear points. */
export function convexHull(points: readonly Point[]): Point[] {
  const sorted = points.slice().sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  const cross = (o: Point, a: Point, b: Point) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
  const half = (list: Point[]) => {
    const chain: Point[] = [];
    for (const p of list) {
      while (chain.length >= 2 && cross(chain[chain.length - 2], chain[chain.length - 1], p) <= 0) chain.pop();
      chain.push(p);
    }
    chain.pop();
    return chain;
  };
  return [...half(sorted), ...half(sorted.slice().reverse())];
}

function lineThrough(grid: CellGrid, members: number[], scores: Float32Array, width: number): Shape {
  const points = members.map((cell) => ridgeCentroid(grid, cell));
  const weights = members.map((cell) => scores[cell]);
  const total = weights.reduce((a, b) => a + b, 0);
  const mx = points.reduce((s, p, k) => s + weights[k] * p[0], 0) / total;
  const my = points.reduce((s, p, k) => s + weights[k] * p[1], 0) / total;
  let [sxx, syy, sxy] = [0, 0, 0];
  points.forEach(([x, y], k) => {
    sxx += weights[k] * (x - mx) ** 2;
    syy += weights[k] * (y - my) ** 2;
    sxy += weights[k] * (x - mx) * (y - my);
  });
  // Main axis of the weighted scatter (the larger eigenvector of its 2 × 2 covariance).
  const angle = 0.5 * Math.atan2(2 * sxy, sxx - syy);
  const [ux, uy] = [Math.cos(angle), Math.sin(angle)];
  const along = points.map(([x, y]) => (x - mx) * ux + (y - my) * uy);
  const [tMin, tMax] = [Math.min(...along), Math.max(...along)];
  const step = LINE_STEP_CELLS * grid.cellSize;
  const bins = Math.max(1, Math.ceil((tMax - tMin) / step));
  const sums = Array.from({ length: bins }, () => ({ w: 0, x: 0, y: 0 }));
  points.forEach(([x, y], k) => {
    const bin = sums[Math.min(bins - 1, Math.floor((along[k] - tMin) / step))];
    bin.w += weights[k];
    bin.x += weights[k] * x;
    bin.y += weights[k] * y;
  });
  const centre = sums.filter((b) => b.w > 0).map((b): Point => [b.x / b.w, b.y / b.w]);
  // Reach the region's ends: move the first and last averages out to the extreme projections.
  const half = grid.cellSize / 2;
  const end = (p: Point, t: number): Point => {
    const tp = (p[0] - mx) * ux + (p[1] - my) * uy;
    return [p[0] + (t - tp) * ux, p[1] + (t - tp) * uy];
  };
  const path: Point[] = centre.length >= 2 ? [end(centre[0], tMin), ...centre.slice(1, -1), end(centre[centre.length - 1], tMax)] : [end([mx, my], tMin - half), end([mx, my], tMax + half)];
  return { kind: "line", points: simplifyPolyline(path, 1), width };
}
