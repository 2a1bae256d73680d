/**
 * compareRegionSets on hand-computable shapes and against an exact polygon library. Every check
 * runs with both region rasterisers (sharp tiles, the default, and the exact scanline one).
 * Marks as in docs/references.md: (a) read in a public source, (b) from memory, (c) common
 * practice or our own decision.
 * REF   docs/references.md, "Agreement between graders": squares [0,4]² and [2,6]² →
 *       intersection 4, union 28, IoU 1/7, Dice 0.25 (a); "Areas and images": a rectangle with
 *       corners on pixel corners counts exactly its area (a).
 * PC    polygon-clipping 0.15.7 (npm, general-purpose exact polygon booleans) with shoelace areas
 *       (support/exact-areas.ts); tolerance 1 % of the exact area, the coverage contract's
 *       accuracy target, and 0.01 on IoU.
 * RULE  the matching rule stated in lib/imaging/compare-regions.ts (our decision, c).
 */
import { describe, expect, it } from "vitest";
import type { MultiPolygon } from "polygon-clipping";
import type { Point, Shape } from "@/lib/geometry/shape";
import { AppError } from "@/lib/errors";
import { measureCoverage } from "@/lib/imaging/coverage";
import { compareRegionSets, type ComparedRegion, type RegionSetComparisonInput } from "@/lib/imaging/compare-regions";
import type { RegionRaster } from "@/lib/imaging/raster/region-masks";
import { exactUnion, multiPolygonArea, polygonClipping, starPolygon } from "@/support/exact-areas";
import { mulberry32 } from "@/support/prng";

const rect = (x: number, y: number, width: number, height: number): Shape => ({ kind: "rect", x, y, width, height });
const region = (id: string, defect: string, shape: Shape): ComparedRegion => ({ id, defect, shape });

describe.each<RegionRaster>(["sharp", "exact"])("compareRegionSets (regionRaster %s)", (regionRaster) => {
  const compare = (input: RegionSetComparisonInput) => compareRegionSets(input, { regionRaster });

  describe("pixel counts on rectangles with corners on pixel corners (REF a)", () => {
    it("squares [0,4]² and [2,6]² → 16 and 16 px, intersection 4, union 28, IoU 1/7, Dice 0.25", async () => {
      const result = await compare({ width: 10, height: 10, a: [region("k1", "dent", rect(0, 0, 4, 4))], b: [region("g1", "dent", rect(2, 2, 4, 4))] });
      expect(result.surfacePx).toBe(100);
      expect(result.byDefect.dent).toMatchObject({ aPx: 16, bPx: 16, intersectionPx: 4, unionPx: 28, onlyAPx: 12, onlyBPx: 12 });
      expect(result.byDefect.dent.iou).toBeCloseTo(1 / 7, 15);
      expect(result.byDefect.dent.dice).toBeCloseTo(0.25, 15);
    });

    it("clips both sides to the Surface before counting", async () => {
      // Surface [0,10)²; A [5,15)² → 5 × 5 = 25 inside; B [8,12) × [0,10) → 2 × 10 = 20 inside;
      // A ∩ B inside = [8,10) × [5,10) = 10; union 35.
      const result = await compare({
        width: 20,
        height: 20,
        surface: [rect(0, 0, 10, 10)],
        a: [region("k1", "chip", rect(5, 5, 10, 10))],
        b: [region("g1", "chip", rect(8, 0, 4, 10))],
      });
      expect(result.surfacePx).toBe(100);
      expect(result.byDefect.chip).toMatchObject({ aPx: 25, bPx: 20, intersectionPx: 10, unionPx: 35, onlyAPx: 15, onlyBPx: 10 });
      expect(result.byDefect.chip.iou).toBeCloseTo(10 / 35, 15);
      expect(result.byDefect.chip.dice).toBeCloseTo(20 / 45, 15);
    });

    it("keeps classes apart and lists every class either side named", async () => {
      // The chip of A and the dent of B lie on the same pixels; different classes never overlap.
      const result = await compare({
        width: 30,
        height: 30,
        a: [region("k1", "dent", rect(0, 0, 10, 10)), region("k2", "chip", rect(20, 20, 5, 5))],
        b: [region("g1", "dent", rect(0, 0, 10, 5)), region("g2", "dent", rect(20, 20, 5, 5)), region("g3", "scratch", rect(0, 20, 8, 1))],
      });
      expect(Object.keys(result.byDefect)).toEqual(["dent", "chip", "scratch"]);
      expect(result.byDefect.dent).toMatchObject({ aPx: 100, bPx: 75, intersectionPx: 50, unionPx: 125 });
      expect(result.byDefect.chip).toMatchObject({ aPx: 25, bPx: 0, intersectionPx: 0, iou: 0, dice: 0, onlyA: 1, onlyB: 0 });
      expect(result.byDefect.scratch).toMatchObject({ aPx: 0, bPx: 8, iou: 0, matchedB: 0, onlyB: 1 });
    });

    it("both sides empty inside the Surface: IoU = Dice = 1 and no defects (lib/agreement/masks.ts decision, c)", async () => {
      const result = await compare({
        width: 40,
        height: 40,
        surface: [rect(0, 0, 20, 20)],
        a: [region("k1", "dent", rect(25, 25, 5, 5))],
        b: [region("g1", "dent", rect(30, 30, 5, 5))],
      });
      expect(result.byDefect.dent).toMatchObject({ aPx: 0, bPx: 0, unionPx: 0, iou: 1, dice: 1, aDefects: [], bDefects: [], onlyA: 0, onlyB: 0 });
    });
  });

  describe("defects and the matching rule (RULE)", () => {
    it("a box drawn around a scratch matches it: the whole scratch lies inside", async () => {
      const result = await compare({ width: 100, height: 50, a: [region("k1", "scratch", rect(10, 10, 40, 2))], b: [region("g1", "scratch", rect(5, 5, 60, 20))] });
      expect(result.byDefect.scratch).toMatchObject({ matchedA: 1, matchedB: 1, onlyA: 0, onlyB: 0, intersectionPx: 80 });
    });

    it("one long stroke against three short ones inside it: all four matched", async () => {
      const result = await compare({
        width: 100,
        height: 50,
        a: [region("k1", "scratch", rect(0, 20, 60, 4))],
        b: [region("g1", "scratch", rect(0, 20, 15, 4)), region("g2", "scratch", rect(20, 20, 15, 4)), region("g3", "scratch", rect(40, 20, 15, 4))],
      });
      const scratch = result.byDefect.scratch;
      expect(scratch.bDefects.map((defect) => defect.regionIds)).toEqual([["g1"], ["g2"], ["g3"]]);
      expect(scratch).toMatchObject({ matchedA: 1, matchedB: 3, onlyA: 0, onlyB: 0 });
    });

    it("half of the smaller defect inside the other is the boundary: 50 of 100 px match, 40 do not", async () => {
      // 10 × 10 squares shifted by 5 (overlap 5 × 10 = 50) and by 6 (overlap 4 × 10 = 40).
      const atHalf = await compare({ width: 40, height: 20, a: [region("k1", "dent", rect(0, 0, 10, 10))], b: [region("g1", "dent", rect(5, 0, 10, 10))] });
      expect(atHalf.byDefect.dent).toMatchObject({ intersectionPx: 50, matchedA: 1, matchedB: 1 });
      const below = await compare({ width: 40, height: 20, a: [region("k1", "dent", rect(0, 0, 10, 10))], b: [region("g1", "dent", rect(6, 0, 10, 10))] });
      expect(below.byDefect.dent).toMatchObject({ intersectionPx: 40, matchedA: 0, matchedB: 0, onlyA: 1, onlyB: 1 });
      expect(below.byDefect.dent.aDefects).toEqual([{ regionIds: ["k1"], px: 100, matched: false }]);
    });

    it("overlapping regions of one side are one defect; touching ones stay two; one outside the Surface is none", async () => {
      const result = await compare({
        width: 60,
        height: 30,
        surface: [rect(0, 0, 50, 30)],
        a: [
          region("k1", "dent", rect(0, 0, 10, 10)),
          region("k2", "dent", rect(5, 5, 10, 10)),
          region("k3", "dent", rect(20, 0, 5, 5)),
          region("k4", "dent", rect(25, 0, 5, 5)),
          region("k5", "dent", rect(52, 0, 5, 5)),
        ],
        b: [],
      });
      const dent = result.byDefect.dent;
      expect(dent.aDefects.map((defect) => [defect.regionIds, defect.px])).toEqual([
        [["k1", "k2"], 175],
        [["k3"], 25],
        [["k4"], 25],
      ]);
      expect(dent).toMatchObject({ aPx: 225, bPx: 0, matchedA: 0, onlyA: 3, onlyB: 0, iou: 0 });
    });
  });

  describe("against polygon-clipping on seeded random polygons (PC)", () => {
    it.each([11, 12, 13])("seed %i: per-class areas within 1 %, IoU within 0.01", async (seed) => {
      const input = perturbedScene(seed);
      const result = await compare(input);
      const surface = polygonClipping.intersection(exactUnion(input.surface ?? []), exactUnion([rect(0, 0, input.width, input.height)]));
      expect(result.surfacePx / multiPolygonArea(surface)).toBeCloseTo(1, 2);
      for (const defect of ["dent", "chip"]) {
        const exactA = polygonClipping.intersection(exactUnion(input.a.filter((r) => r.defect === defect).map((r) => r.shape)), surface);
        const exactB = polygonClipping.intersection(exactUnion(input.b.filter((r) => r.defect === defect).map((r) => r.shape)), surface);
        const [areaA, areaB, areaBoth] = [exactA, exactB, polygonClipping.intersection(exactA, exactB) as MultiPolygon].map(multiPolygonArea);
        // A real partial overlap, so intersection and "only" figures are exercised.
        expect(areaBoth).toBeGreaterThan(2000);
        expect(areaBoth).toBeLessThan(0.95 * Math.min(areaA, areaB));
        const measured = result.byDefect[defect];
        const within = (px: number, exact: number, label: string) => expect(Math.abs(px - exact) / exact, `${defect} ${label}: ${px} px vs exact ${exact.toFixed(1)}`).toBeLessThan(0.01);
        within(measured.aPx, areaA, "A");
        within(measured.bPx, areaB, "B");
        within(measured.intersectionPx, areaBoth, "A∩B");
        within(measured.unionPx, areaA + areaB - areaBoth, "A∪B");
        expect(Math.abs(measured.onlyAPx - (areaA - areaBoth))).toBeLessThan(0.01 * areaA);
        expect(Math.abs(measured.iou - areaBoth / (areaA + areaB - areaBoth))).toBeLessThan(0.01);
        expect(Math.abs(measured.dice - (2 * areaBoth) / (areaA + areaB))).toBeLessThan(0.01);
      }
    });

    it("per-side pixels and defects equal measureCoverage's px and count for the same regions (same rasteriser)", async () => {
      const input = perturbedScene(14);
      const result = await compare(input);
      for (const [sideRegions, key] of [
        [input.a, "a"],
        [input.b, "b"],
      ] as const) {
        const coverage = await measureCoverage({ width: input.width, height: input.height, regions: sideRegions, surface: input.surface }, { regionRaster });
        for (const [defect, measured] of Object.entries(coverage.byDefect)) {
          expect(key === "a" ? result.byDefect[defect].aPx : result.byDefect[defect].bPx, `${key} ${defect}`).toBe(measured.px);
          expect((key === "a" ? result.byDefect[defect].aDefects : result.byDefect[defect].bDefects).length).toBe(measured.count);
        }
      }
    });
  });
});

/**
 * Side A: overlapping star polygons in two classes; side B: the same polygons with every vertex
 * moved up to 12 px, one dropped and one added per class; a polygon Surface that cuts some.
 */
function perturbedScene(seed: number): RegionSetComparisonInput {
  const random = mulberry32(seed);
  const a: ComparedRegion[] = [];
  const b: ComparedRegion[] = [];
  for (let k = 0; k < 12; k++) {
    const defect = k % 2 === 0 ? "dent" : "chip";
    const shape = starPolygon(random, 80 + random() * 480, 60 + random() * 360, 40 + random() * 70) as { kind: "polygon"; points: Point[] };
    a.push(region(`k${k}`, defect, shape));
    const moved: Point[] = shape.points.map(([x, y]) => [x + (random() - 0.5) * 24, y + (random() - 0.5) * 24]);
    if (k >= 2) b.push(region(`g${k}`, defect, { kind: "polygon", points: moved }));
  }
  b.push(region("g-extra-dent", "dent", starPolygon(random, 320, 240, 60)), region("g-extra-chip", "chip", starPolygon(random, 200, 120, 50)));
  return { width: 640, height: 480, a, b, surface: [starPolygon(random, 320, 240, 330, 0.8)] };
}

describe("compareRegionSets input validation", () => {
  it("rejects bad input with one bad_request error naming every bad field, per side", async () => {
    const error = await compareRegionSets({
      width: 0,
      height: 10,
      a: [
        region("k1", "dent", {
          kind: "polygon",
          points: [
            [0, 0],
            [1, 1],
          ],
        }),
      ],
      b: [region("", "dent", rect(0, 0, 1, 1))],
    }).catch((caught: unknown) => caught);
    expect(error).toBeInstanceOf(AppError);
    expect((error as AppError).code).toBe("bad_request");
    expect(Object.keys((error as AppError).fieldErrors ?? {}).sort()).toEqual(["a.0.shape.points", "b.0.id", "width"]);
    expect((error as AppError).message).toMatch(/^Invalid region comparison input — /);
  });

  it("rejects a missing side", async () => {
    const error = await compareRegionSets({ width: 10, height: 10, a: [] } as never).catch((caught: unknown) => caught);
    expect((error as AppError).fieldErrors).toHaveProperty("b");
  });
});
