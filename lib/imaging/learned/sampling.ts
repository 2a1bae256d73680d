/**
 * Which cells of a training photo teach what. Decisions:
 * - A cell is an example of a defect class when one accepted region of that class covers at
 *   least a quarter of it, or at least half of the region lies in it (so a dust speck smaller
 *   than a cell still yields its cell).
 * - "No defect" examples are cells at least half inside the Surface (the whole photo when none
 *   is marked) with no region pixel in them or in the 8 cells around them: a cell beside a mark
 *   is neither, because an inspector's outline is a few pixels loose.
 * - The sample is capped (per class and for "no defect") so training time stays bounded however
 *   many regions a workspace has; each photo gets its share of the cap, and half of the "no
 *   defect" share goes to the photo's busiest clean cells (edges, print, connectors), which are
 *   what a defect is confused with.
 */
import { countSpans, type SpanSet } from "@/lib/imaging/raster/spans";
import type { CellGrid } from "./cell-grid";

export type ClassMask = { classIndex: number; spans: SpanSet };
export type CellLabels = { positives: Map<number, number[]>; negatives: number[] };

const MIN_COVER_SHARE = 0.25;
const MIN_REGION_SHARE = 0.5;
const MIN_INSIDE = 0.5;

/** mulberry32 (lib/random.ts), so training is reproducible from its seed. */
export { mulberry32 as seededRandom } from "@/lib/random";

export function shuffled<T>(items: readonly T[], random: () => number): T[] {
  const copy = items.slice();
  for (let i = copy.length - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [copy[i], copy[j]] = [copy[j], copy[i]];
  }
  return copy;
}

/** Pixel count of `spans` per cell. */
function cellCounts(spans: SpanSet, grid: CellGrid): Map<number, number> {
  const counts = new Map<number, number>();
  const size = grid.cellSize;
  for (let k = 0; k < spans.rowCount; k++) {
    const rowCell = Math.floor((spans.top + k) / size) * grid.cols;
    for (let i = spans.offsets[k]; i < spans.offsets[k + 1]; i += 2) {
      for (let x = spans.cols[i]; x < spans.cols[i + 1];) {
        const cellX = Math.floor(x / size);
        const end = Math.min(spans.cols[i + 1], (cellX + 1) * size);
        counts.set(rowCell + cellX, (counts.get(rowCell + cellX) ?? 0) + end - x);
        x = end;
      }
    }
  }
  return counts;
}

export function labelCells(grid: CellGrid, masks: readonly ClassMask[], inside: Float32Array): CellLabels {
  const cellPx = grid.cellSize * grid.cellSize;
  const positives = new Map<number, Set<number>>();
  const near = new Uint8Array(grid.cols * grid.rows);
  for (const { classIndex, spans } of masks) {
    const regionPx = countSpans(spans);
    if (regionPx === 0) continue;
    const set = positives.get(classIndex) ?? new Set<number>();
    for (const [cell, px] of cellCounts(spans, grid)) {
      if (px >= Math.min(MIN_COVER_SHARE * cellPx, MIN_REGION_SHARE * regionPx)) set.add(cell);
      const cx = cell % grid.cols;
      const cy = (cell - cx) / grid.cols;
      for (let y = Math.max(0, cy - 1); y <= Math.min(grid.rows - 1, cy + 1); y++) {
        for (let x = Math.max(0, cx - 1); x <= Math.min(grid.cols - 1, cx + 1); x++) near[y * grid.cols + x] = 1;
      }
    }
    positives.set(classIndex, set);
  }
  const negatives: number[] = [];
  for (let cell = 0; cell < near.length; cell++) if (!near[cell] && inside[cell] >= MIN_INSIDE) negatives.push(cell);
  return { positives: new Map([...positives].map(([k, set]) => [k, [...set]])), negatives };
}

/** How busy a cell is: the spread of its centre-versus-surround response. */
const busyness = (grid: CellGrid, cell: number) => grid.dogMax[cell] - grid.dogMin[cell];

/**
 * Up to `quota.get(class)` examples per class and `negativeQuota` "no defect" cells from one
 * photo's labels. Returns [cell, label] pairs (label 0 = no defect, else the class index).
 */
export function pickCells(grid: CellGrid, labels: CellLabels, quota: ReadonlyMap<number, number>, negativeQuota: number, random: () => number): [number, number][] {
  const picked: [number, number][] = [];
  for (const [classIndex, cells] of labels.positives) {
    for (const cell of shuffled(cells, random).slice(0, quota.get(classIndex) ?? 0)) picked.push([cell, classIndex]);
  }
  const hardShare = Math.floor(negativeQuota / 2);
  const byBusyness = labels.negatives.slice().sort((a, b) => busyness(grid, b) - busyness(grid, a));
  // The hard half is drawn from the busiest fifth, so it is not one stretch of the same edge.
  const hardPool = byBusyness.slice(0, Math.max(hardShare, Math.ceil(byBusyness.length / 5)));
  const hard = shuffled(hardPool, random).slice(0, hardShare);
  const taken = new Set(hard);
  const rest = shuffled(
    labels.negatives.filter((cell) => !taken.has(cell)),
    random,
  ).slice(0, negativeQuota - hard.length);
  for (const cell of [...hard, ...rest]) picked.push([cell, 0]);
  return picked;
}
