/**
 * Counting separate defects by one row sweep (lib/imaging/raster/separate.ts) against the plain
 * definition — merge two regions when their masks share a pixel, through chains — computed by
 * testing every pair (spanSetsOverlap), on seeded random scenes and on the adversarial layout the
 * sweep exists for (many regions whose boxes overlap while their pixels do not).
 */
import { describe, expect, it } from "vitest";
import type { Shape } from "@/lib/geometry/shape";
import { DeadlineExceeded, deadlineCheck } from "@/lib/imaging/deadline";
import { shapeSpans } from "@/lib/imaging/raster/exact-spans";
import { countSeparateRegions } from "@/lib/imaging/raster/separate";
import { emptySpanSet, spanSetsOverlap, type SpanSet } from "@/lib/imaging/raster/spans";
import { mulberry32 } from "@/support/prng";

const frame = { width: 400, height: 300 };

function pairwiseCount(masks: SpanSet[]): number {
  const parent = masks.map((_, i) => i);
  const find = (i: number): number => (parent[i] === i ? i : (parent[i] = find(parent[i])));
  masks.forEach((a, i) => masks.forEach((b, j) => j > i && spanSetsOverlap(a, b) && (parent[find(i)] = find(j))));
  return new Set(masks.map((m, i) => (m.offsets[m.rowCount] > 0 ? find(i) : -1)).filter((r) => r >= 0)).size;
}

function randomShape(random: () => number): Shape {
  const x = random() * 380;
  const y = random() * 280;
  switch (Math.floor(random() * 4)) {
    case 0:
      return { kind: "rect", x, y, width: 2 + random() * 30, height: 2 + random() * 30 };
    case 1:
      return { kind: "spot", x, y, radius: 0.5 + random() * 12 };
    case 2:
      return {
        kind: "polygon",
        points: [
          [x, y],
          [x + 5 + random() * 40, y + random() * 20],
          [x + random() * 20, y + 5 + random() * 40],
        ],
      };
    default:
      return {
        kind: "line",
        points: [
          [x, y],
          [x + random() * 60 - 30, y + random() * 60 - 30],
        ],
        width: 0.5 + random() * 6,
      };
  }
}

describe("countSeparateRegions", () => {
  it("agrees with the pairwise definition on 200 seeded random scenes", () => {
    const random = mulberry32(1405);
    for (let scene = 0; scene < 200; scene++) {
      const count = 1 + Math.floor(random() * 40);
      const masks = Array.from({ length: count }, () => shapeSpans(randomShape(random), frame));
      expect(countSeparateRegions(masks), `scene ${scene}`).toBe(pairwiseCount(masks));
    }
  });

  it("keeps touching regions apart, merges chains, skips empty masks", () => {
    const box = (x: number, w: number) => shapeSpans({ kind: "rect", x, y: 10, width: w, height: 10 }, frame);
    // [0,10) and [10,20) touch without sharing a pixel; [15,30) overlaps the second, chaining all.
    expect(countSeparateRegions([box(0, 10), box(10, 10)])).toBe(2);
    expect(countSeparateRegions([box(0, 10), box(10, 10), box(5, 10)])).toBe(1);
    expect(countSeparateRegions([box(0, 10), emptySpanSet(), box(50, 10)])).toBe(2);
    expect(countSeparateRegions([])).toBe(0);
  });

  it("stays linear where a pair test is quadratic: 400 interleaved full-height staircases", () => {
    // Each staircase spans every row (so all boxes overlap) but its pixels never meet its neighbours'.
    const masks = Array.from({ length: 400 }, (_, k) => {
      const points: [number, number][] = [];
      for (let step = 0; step < 10; step++) points.push([k + step * 0.01, step * 30], [k + step * 0.01, step * 30 + 30]);
      for (let step = 9; step >= 0; step--) points.push([k + 0.6 + step * 0.01, step * 30 + 30], [k + 0.6 + step * 0.01, step * 30]);
      return shapeSpans({ kind: "polygon", points }, frame);
    });
    expect(countSeparateRegions(masks)).toBe(400);
    expect(pairwiseCount(masks.slice(0, 30))).toBe(30);
  });

  it("stops with DeadlineExceeded from inside the sweep once its deadline has passed", () => {
    const masks = Array.from({ length: 200 }, (_, k) => shapeSpans({ kind: "rect", x: k, y: 0, width: 0.6, height: 300 }, frame));
    expect(() => countSeparateRegions(masks, deadlineCheck(Date.now() - 1))).toThrow(DeadlineExceeded);
  });
});
