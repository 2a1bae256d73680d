/**
 * IoU / Dice on masks and the Landis & Koch bands. Marks as in docs/references.md: (a) read in a
 * public source, (b) from memory, (c) common practice or our own decision.
 * REF  docs/references.md, "Agreement between graders": squares [0,4]² and [2,6]² → intersection
 *      4, union 28, IoU 1/7, Dice 0.25; Dice = 2J / (1 + J); Landis & Koch (1977) bands (a).
 */
import { describe, expect, it } from "vitest";
import { dice, iou, landisKochBand, LANDIS_KOCH_BANDS, maskOverlap } from "@/lib/agreement";
import { shapeSpans } from "@/lib/imaging/raster/exact-spans";
import { emptySpanSet } from "@/lib/imaging/raster/spans";

/** A flat 0/1 mask of a width × height image with the pixels of [x0, x1) × [y0, y1) set. */
function flatSquare(width: number, height: number, x0: number, y0: number, x1: number, y1: number): Uint8Array {
  const mask = new Uint8Array(width * height);
  for (let y = y0; y < y1; y++) for (let x = x0; x < x1; x++) mask[y * width + x] = 1;
  return mask;
}

describe("iou / dice", () => {
  it("two squares [0,4]² and [2,6]² → intersection 4, union 28, IoU 1/7, Dice 0.25 (REF a), as flat masks", () => {
    const a = flatSquare(8, 8, 0, 0, 4, 4);
    const b = flatSquare(8, 8, 2, 2, 6, 6);
    expect(maskOverlap(a, b)).toEqual({ a: 16, b: 16, intersection: 4, union: 28 });
    expect(iou(a, b)).toBeCloseTo(1 / 7, 15);
    expect(dice(a, b)).toBeCloseTo(0.25, 15);
    // Plain arrays work as well as typed ones.
    expect(iou(Array.from(a), Array.from(b))).toBeCloseTo(1 / 7, 15);
  });

  it("the same squares as span masks from the coverage rasteriser give the same figures (REF a)", () => {
    const frame = { width: 8, height: 8 };
    const a = shapeSpans({ kind: "rect", x: 0, y: 0, width: 4, height: 4 }, frame);
    const b = shapeSpans({ kind: "rect", x: 2, y: 2, width: 4, height: 4 }, frame);
    expect(maskOverlap(a, b)).toEqual({ a: 16, b: 16, intersection: 4, union: 28 });
    expect(iou(a, b)).toBeCloseTo(1 / 7, 15);
    expect(dice(a, b)).toBeCloseTo(0.25, 15);
  });

  it("Dice = 2J / (1 + J) on assorted overlaps (REF a)", () => {
    for (const shift of [0, 1, 2, 3, 5]) {
      const a = flatSquare(12, 12, 1, 1, 7, 6);
      const b = flatSquare(12, 12, 1 + shift, 2, 9, 9);
      const jaccard = iou(a, b);
      expect(dice(a, b)).toBeCloseTo((2 * jaccard) / (1 + jaccard), 15);
    }
  });

  it("empty versus empty is 1 (both agree nothing is there); empty versus marked is 0 (our decision, c)", () => {
    const empty = new Uint8Array(16);
    const marked = flatSquare(4, 4, 1, 1, 2, 2);
    expect(iou(empty, empty)).toBe(1);
    expect(dice(empty, empty)).toBe(1);
    expect(iou(emptySpanSet(), emptySpanSet())).toBe(1);
    expect(dice(emptySpanSet(), emptySpanSet())).toBe(1);
    expect(iou(empty, marked)).toBe(0);
    expect(dice(marked, empty)).toBe(0);
    expect(maskOverlap(empty, empty).union).toBe(0);
  });

  it("refuses masks of different lengths, values other than 0/1, and mixed kinds", () => {
    expect(() => iou(new Uint8Array(4), new Uint8Array(5))).toThrow(/same length \(4 vs 5 pixels\)/);
    expect(() => dice([0, 255], [0, 1])).toThrow(/0 or 1; pixel 1 has 255/);
    expect(() => iou(new Uint8Array(4), emptySpanSet())).toThrow(/same kind/);
  });
});

describe("landisKochBand: boundary rule pinned (two decimals as shown, printed upper bounds inclusive; c)", () => {
  it("names the six bands of Landis & Koch (REF a)", () => {
    expect(LANDIS_KOCH_BANDS).toEqual(["poor", "slight", "fair", "moderate", "substantial", "almost perfect"]);
    expect([-0.3, 0.1, 0.3, 0.5, 0.7, 0.9].map(landisKochBand)).toEqual([...LANDIS_KOCH_BANDS]);
  });

  it("puts each printed bound in its own band and the next hundredth in the next", () => {
    const cases: [number, string][] = [
      [-0.01, "poor"],
      [0, "slight"],
      [0.2, "slight"],
      [0.21, "fair"],
      [0.4, "fair"],
      [0.41, "moderate"],
      [0.6, "moderate"],
      [0.61, "substantial"],
      [0.8, "substantial"],
      [0.81, "almost perfect"],
      [1, "almost perfect"],
    ];
    for (const [kappa, band] of cases) expect(landisKochBand(kappa), String(kappa)).toBe(band);
  });

  it("judges the value as shown with two decimals, including the gaps of the printed table", () => {
    expect(landisKochBand(0.204)).toBe("slight"); // shows 0.20
    expect(landisKochBand(0.206)).toBe("fair"); // shows 0.21
    expect(landisKochBand(0.404)).toBe("fair"); // shows 0.40
    expect(landisKochBand(0.405)).toBe("moderate"); // shows 0.41 (stored as 0.40500000000000002665)
    expect(landisKochBand(-0.004)).toBe("slight"); // shows -0.00
    expect(landisKochBand(-0.005)).toBe("poor"); // shows -0.01
    expect(landisKochBand(0.8049)).toBe("substantial"); // shows 0.80
  });

  it("has no band for an undefined kappa", () => {
    expect(landisKochBand(Number.NaN)).toBeNull();
  });
});
