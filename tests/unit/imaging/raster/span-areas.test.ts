/**
 * Span-set difference and rectangles against the plain per-pixel definition: a bitmap of the
 * frame, one entry per pixel (HAND — the definition itself, computed independently of the span
 * code), on seeded random scenes of every shape kind; and compareRegionSets' `keepAreas` on
 * hand-computable rectangles.
 */
import { describe, expect, it } from "vitest";
import type { Shape } from "@/lib/geometry/shape";
import { compareRegionSets } from "@/lib/imaging/compare-regions";
import { shapeSpans } from "@/lib/imaging/raster/exact-spans";
import { spanRects, subtractSpanSets, type PixelRect } from "@/lib/imaging/raster/span-areas";
import { countSpans, emptySpanSet, unionSpanSets, type SpanSet } from "@/lib/imaging/raster/spans";
import { mulberry32 } from "@/support/prng";

const frame = { width: 160, height: 120 };

function bitmap(set: SpanSet): Uint8Array {
  const pixels = new Uint8Array(frame.width * frame.height);
  for (let k = 0; k < set.rowCount; k++) {
    for (let i = set.offsets[k]; i < set.offsets[k + 1]; i += 2) for (let x = set.cols[i]; x < set.cols[i + 1]; x++) pixels[(set.top + k) * frame.width + x] = 1;
  }
  return pixels;
}

function paint(rects: PixelRect[]): Uint8Array {
  const pixels = new Uint8Array(frame.width * frame.height);
  for (const r of rects) for (let y = r.y; y < r.y + r.height; y++) for (let x = r.x; x < r.x + r.width; x++) pixels[y * frame.width + x]++;
  return pixels;
}

/** Index of the first pixel where the two bitmaps differ, -1 when equal (toEqual on 19 200-entry arrays is slow). */
function firstDifference(a: Uint8Array, b: Uint8Array): number {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return i;
  return a.length === b.length ? -1 : a.length;
}

function randomShape(random: () => number): Shape {
  const x = random() * 150;
  const y = random() * 110;
  switch (Math.floor(random() * 4)) {
    case 0:
      return { kind: "rect", x, y, width: 1 + random() * 40, height: 1 + random() * 40 };
    case 1:
      return { kind: "spot", x, y, radius: 0.5 + random() * 15 };
    case 2:
      return {
        kind: "polygon",
        points: [
          [x, y],
          [x + 5 + random() * 50, y + random() * 20],
          [x + random() * 20, y + 5 + random() * 50],
        ],
      };
    default:
      return {
        kind: "line",
        points: [
          [x, y],
          [x + random() * 80 - 40, y + random() * 80 - 40],
        ],
        width: 0.5 + random() * 8,
      };
  }
}

const randomSet = (random: () => number) => unionSpanSets(Array.from({ length: 1 + Math.floor(random() * 6) }, () => shapeSpans(randomShape(random), frame)));

describe("subtractSpanSets", () => {
  it("equals the per-pixel difference on 300 seeded random pairs (HAND)", () => {
    const random = mulberry32(4711);
    for (let scene = 0; scene < 300; scene++) {
      const a = randomSet(random);
      const b = randomSet(random);
      const pixelsB = bitmap(b);
      const expected = bitmap(a).map((pixel, index) => pixel & (1 - pixelsB[index]));
      const difference = subtractSpanSets(a, b);
      expect(firstDifference(bitmap(difference), expected), `scene ${scene}`).toBe(-1);
      expect(countSpans(difference)).toBe(expected.reduce((sum, pixel) => sum + pixel, 0));
    }
  });

  it("a minus nothing is a; a minus a and nothing minus b are empty", () => {
    const a = shapeSpans({ kind: "rect", x: 10, y: 10, width: 20, height: 5 }, frame);
    expect(countSpans(subtractSpanSets(a, emptySpanSet()))).toBe(100);
    expect(countSpans(subtractSpanSets(a, a))).toBe(0);
    expect(countSpans(subtractSpanSets(emptySpanSet(), a))).toBe(0);
  });

  it("cuts a hole out of the middle of a run, leaving both ends", () => {
    const a = shapeSpans({ kind: "rect", x: 0, y: 0, width: 10, height: 1 }, frame);
    const b = shapeSpans({ kind: "rect", x: 3, y: 0, width: 4, height: 1 }, frame);
    expect(spanRects(subtractSpanSets(a, b))).toEqual([
      { x: 0, y: 0, width: 3, height: 1 },
      { x: 7, y: 0, width: 3, height: 1 },
    ]);
  });
});

describe("spanRects", () => {
  it("covers exactly the set's pixels, each once, on 300 seeded random sets (HAND)", () => {
    const random = mulberry32(1234);
    for (let scene = 0; scene < 300; scene++) {
      const set = randomSet(random);
      expect(firstDifference(paint(spanRects(set)), bitmap(set)), `scene ${scene}`).toBe(-1);
    }
  });

  it("an axis-aligned box is one rectangle; a box with a notch is three", () => {
    expect(spanRects(shapeSpans({ kind: "rect", x: 4, y: 6, width: 10, height: 7 }, frame))).toEqual([{ x: 4, y: 6, width: 10, height: 7 }]);
    const notched = subtractSpanSets(shapeSpans({ kind: "rect", x: 0, y: 0, width: 10, height: 10 }, frame), shapeSpans({ kind: "rect", x: 0, y: 4, width: 5, height: 2 }, frame));
    expect(spanRects(notched)).toEqual([
      { x: 0, y: 0, width: 10, height: 4 },
      { x: 5, y: 4, width: 5, height: 2 },
      { x: 0, y: 6, width: 10, height: 4 },
    ]);
  });
});

describe("compareRegionSets with keepAreas", () => {
  it("returns only-A, only-B and shared areas of each class (squares [0,4]² and [2,6]², docs/references.md a)", async () => {
    const result = await compareRegionSets(
      {
        width: 10,
        height: 10,
        a: [{ id: "k", defect: "dent", shape: { kind: "rect", x: 0, y: 0, width: 4, height: 4 } }],
        b: [{ id: "g", defect: "dent", shape: { kind: "rect", x: 2, y: 2, width: 4, height: 4 } }],
      },
      { keepAreas: true },
    );
    const areas = result.byDefect.dent.areas!;
    expect(countSpans(areas.onlyA)).toBe(12);
    expect(countSpans(areas.onlyB)).toBe(12);
    expect(spanRects(areas.both)).toEqual([{ x: 2, y: 2, width: 2, height: 2 }]);
    expect(spanRects(areas.onlyA)).toEqual([
      { x: 0, y: 0, width: 4, height: 2 },
      { x: 0, y: 2, width: 2, height: 2 },
    ]);
  });

  it("leaves the areas out unless asked", async () => {
    const result = await compareRegionSets({ width: 10, height: 10, a: [{ id: "k", defect: "dent", shape: { kind: "rect", x: 0, y: 0, width: 4, height: 4 } }], b: [] });
    expect(result.byDefect.dent.areas).toBeUndefined();
  });
});
