/**
 * Where pixel faults are looked for: inside every one of some regions (e.g. the part's Surface
 * and the view's active-screen zone), and at least an edge band away from each region's edge —
 * the panel's rim (rounded corners, the lit edge against the bezel, the photo's own corner)
 * makes pixel-sized outliers a uniform screen does not have. Pure.
 *
 * A region is a union of polygons (nonzero rule). The distance to a region's edge is the distance
 * to the nearest polygon edge; where polygons of one region overlap this under-reads the
 * distance (an inner edge counts), which only widens the band there. Polygons are thinned to
 * 0.5 px (Ramer–Douglas–Peucker) first, so a traced outline of thousands of points stays cheap.
 */
import { simplifyRing } from "@/lib/geometry/simplify";
import { pointInPolygon } from "@/lib/geometry/polygon";
import type { Point } from "@/lib/geometry/shape";

export type PixelSearchArea = {
  /** A point is searched only when every region contains it (each region: a union of polygons). */
  regions: { polygons: Point[][] }[];
  /** Points nearer than this (px) to any region's edge are not searched. */
  edgeBandPx: number;
};

export type Box = { x: number; y: number; width: number; height: number };
export type AreaVerdict = "inside" | "outside" | "edge-band";

export type CompiledArea = {
  /** Integer box of the photo holding every searchable point (empty: width or height 0). */
  box: Box;
  /** Signed distance of a point to the area: ≥ 0 inside every region, the smallest over regions. */
  signedDistance(x: number, y: number): number;
  classify(x: number, y: number): AreaVerdict;
};

const SIMPLIFY_PX = 0.5;

type Segment = { ax: number; ay: number; dx: number; dy: number; lengthSquared: number };

function segmentsOf(ring: readonly Point[]): Segment[] {
  return ring.map(([ax, ay], i) => {
    const [bx, by] = ring[(i + 1) % ring.length];
    const dx = bx - ax;
    const dy = by - ay;
    return { ax, ay, dx, dy, lengthSquared: dx * dx + dy * dy };
  });
}

function distanceToSegments(x: number, y: number, segments: readonly Segment[]): number {
  let best = Infinity;
  for (const s of segments) {
    let t = s.lengthSquared > 0 ? ((x - s.ax) * s.dx + (y - s.ay) * s.dy) / s.lengthSquared : 0;
    t = t < 0 ? 0 : t > 1 ? 1 : t;
    const ex = x - (s.ax + t * s.dx);
    const ey = y - (s.ay + t * s.dy);
    const d = ex * ex + ey * ey;
    if (d < best) best = d;
  }
  return Math.sqrt(best);
}

export function compileSearchArea(area: PixelSearchArea, image: { width: number; height: number }): CompiledArea {
  const regions = area.regions.map((region) => {
    const rings = region.polygons.filter((p) => p.length >= 3).map((p) => simplifyRing(p, SIMPLIFY_PX));
    const xs = rings.flat().map(([x]) => x);
    const ys = rings.flat().map(([, y]) => y);
    return { rings, segments: rings.flatMap(segmentsOf), minX: Math.min(...xs), minY: Math.min(...ys), maxX: Math.max(...xs), maxY: Math.max(...ys) };
  });
  const band = Math.max(0, area.edgeBandPx);
  const empty = regions.length === 0 || regions.some((r) => r.rings.length === 0);
  const left = empty ? 0 : Math.max(0, Math.ceil(Math.max(...regions.map((r) => r.minX)) + band));
  const top = empty ? 0 : Math.max(0, Math.ceil(Math.max(...regions.map((r) => r.minY)) + band));
  const right = empty ? 0 : Math.min(image.width, Math.floor(Math.min(...regions.map((r) => r.maxX)) - band));
  const bottom = empty ? 0 : Math.min(image.height, Math.floor(Math.min(...regions.map((r) => r.maxY)) - band));
  const box = { x: left, y: top, width: Math.max(0, right - left), height: Math.max(0, bottom - top) };

  const signedDistance = (x: number, y: number): number => {
    if (empty) return -Infinity;
    let worst = Infinity;
    for (const region of regions) {
      const inside = region.rings.some((ring) => pointInPolygon([x, y], ring));
      const d = distanceToSegments(x, y, region.segments);
      worst = Math.min(worst, inside ? d : -d);
    }
    return worst;
  };
  const classify = (x: number, y: number): AreaVerdict => {
    const d = signedDistance(x, y);
    return d < 0 ? "outside" : d < band ? "edge-band" : "inside";
  };
  return { box, signedDistance, classify };
}

/**
 * Which square tiles of `box` (side `tile` px, row-major from the box's corner) hold at least
 * one searchable point. The signed distance changes by at most the distance moved (it is
 * 1-Lipschitz), so a tile whose centre lies more than its half-diagonal short of the band's edge
 * holds none. It is read at the centres of cells of 4 × 4 tiles first; only cells near the band's
 * edge are read tile by tile.
 */
export function searchableTiles(area: CompiledArea, box: Box, tile: number, edgeBandPx: number): { columns: number; rows: number; usable: Uint8Array } {
  const columns = Math.ceil(box.width / tile);
  const rows = Math.ceil(box.height / tile);
  const usable = new Uint8Array(columns * rows);
  const reach = (side: number) => (side * Math.SQRT2) / 2;
  const cell = 4 * tile;
  for (let cy = 0; cy < Math.ceil(rows / 4); cy++) {
    for (let cx = 0; cx < Math.ceil(columns / 4); cx++) {
      // The full squares' centres: a partial tile at the box's edge still lies inside its square.
      const d = area.signedDistance(box.x + (cx + 0.5) * cell, box.y + (cy + 0.5) * cell);
      if (d + reach(cell) < edgeBandPx) continue;
      const sure = d - reach(cell) >= edgeBandPx;
      for (let ty = cy * 4; ty < Math.min(rows, cy * 4 + 4); ty++) {
        for (let tx = cx * 4; tx < Math.min(columns, cx * 4 + 4); tx++) {
          if (sure || area.signedDistance(box.x + (tx + 0.5) * tile, box.y + (ty + 0.5) * tile) + reach(tile) >= edgeBandPx) usable[ty * columns + tx] = 1;
        }
      }
    }
  }
  return { columns, rows, usable };
}
