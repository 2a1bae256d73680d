/**
 * The held-out evaluation's arithmetic and rules (lib/imaging/learned-eval.ts).
 * Sources: IoU is checked against exact polygon areas from polygon-clipping 0.15.7 (npm, a
 * general-purpose polygon library; shoelace formula for the area); FNV-1a against the published
 * 32-bit test vectors of the FNV reference (Fowler/Noll/Vo, draft-eastlake-fnv; (b) from memory);
 * recall = TP / (TP + FN) and precision = TP / (TP + FP) as the detection literature defines them
 * ((c) common practice); the matching example is worked by hand below.
 */
import { describe, expect, it } from "vitest";
import * as polygonClippingModule from "polygon-clipping";
import type { Pair, Polygon } from "polygon-clipping";
import type { Shape } from "@/lib/geometry/shape";
import { compareModels, evaluateSuggestions, fnv1a, regionIou, splitByPhoto, suggestableClasses, SUGGESTION_RULE, type Evaluation } from "@/lib/imaging/learned-eval";

const polygonClipping = (polygonClippingModule as unknown as { default?: typeof polygonClippingModule }).default ?? polygonClippingModule;
const frame = { width: 1000, height: 1000 };
const box = (x: number, y: number, width: number, height: number): Shape => ({ kind: "rect", x, y, width, height });

function area(polygons: Polygon[]): number {
  const ring = (points: Pair[]) => Math.abs(points.reduce((s, [x1, y1], k) => s + x1 * points[(k + 1) % points.length][1] - points[(k + 1) % points.length][0] * y1, 0)) / 2;
  return polygons.reduce((s, [outer, ...holes]) => s + ring(outer) - holes.reduce((h, r) => h + ring(r), 0), 0);
}

describe("regionIou", () => {
  it("matches exact polygon areas (polygon-clipping) within 1 %", () => {
    const a: Pair[] = [
      [100, 100],
      [520, 140],
      [480, 560],
      [130, 430],
    ];
    const b: Pair[] = [
      [300, 250],
      [700, 260],
      [650, 700],
      [280, 610],
    ];
    const shared = area(polygonClipping.intersection([a], [b]));
    const union = area(polygonClipping.union([a], [b]));
    const exact = shared / union;
    const raster = regionIou({ kind: "polygon", points: a }, { kind: "polygon", points: b }, frame);
    expect(Math.abs(raster - exact) / exact).toBeLessThan(0.01);
  });

  it("is 1 for the same shape, 0 for disjoint ones, and 1/3 for half-overlapping equal boxes", () => {
    expect(regionIou(box(10, 10, 100, 50), box(10, 10, 100, 50), frame)).toBe(1);
    expect(regionIou(box(10, 10, 100, 50), box(300, 300, 10, 10), frame)).toBe(0);
    // Overlap 50 × 50 of two 100 × 50 boxes: 2500 / (5000 + 5000 − 2500) = 1/3.
    expect(regionIou(box(0, 0, 100, 50), box(50, 0, 100, 50), frame)).toBeCloseTo(1 / 3, 10);
  });
});

describe("evaluateSuggestions", () => {
  it("matches one-to-one, best score first, per class (a worked example)", () => {
    const accepted = [
      { defect: "scratch", shape: box(0, 0, 100, 20) },
      { defect: "scratch", shape: box(0, 200, 100, 20) },
      { defect: "stain", shape: box(500, 500, 50, 50) },
    ];
    const suggested = [
      { defect: "scratch", shape: box(0, 0, 100, 20), score: 0.9 }, // hit on the first scratch
      { defect: "scratch", shape: box(10, 0, 100, 20), score: 0.8 }, // same scratch again: a miss
      { defect: "scratch", shape: box(0, 200, 100, 80), score: 0.7 }, // IoU 2000 / 8000 = 0.25 < 0.3: a miss
      { defect: "stain", shape: box(0, 0, 100, 20), score: 0.95 }, // right place, wrong class: a miss
      { defect: "stain", shape: box(510, 510, 50, 50), score: 0.6 }, // IoU 1600 / 3400 = 0.47: a hit
    ];
    const result = evaluateSuggestions([{ width: 1000, height: 1000, accepted, suggested }]);
    // scratch: TP 1, FP 2, FN 1 → recall 1/2, precision 1/3, F1 = 2·(1/2·1/3)/(1/2 + 1/3) = 0.4.
    expect(result.byClass.scratch).toEqual({ accepted: 2, suggested: 3, hits: 1, recall: 0.5, precision: 0.333, f1: 0.4 });
    // stain: TP 1, FP 1, FN 0 → recall 1, precision 1/2, F1 2/3.
    expect(result.byClass.stain).toEqual({ accepted: 1, suggested: 2, hits: 1, recall: 1, precision: 0.5, f1: 0.667 });
    // The same suggestions at IoU 0.2 turn the 0.25 one into a hit.
    expect(evaluateSuggestions([{ width: 1000, height: 1000, accepted, suggested }], { iouThreshold: 0.2 }).byClass.scratch.hits).toBe(2);
  });

  it("counts classes that only one side names, with zeros rather than NaN", () => {
    const result = evaluateSuggestions([
      { width: 100, height: 100, accepted: [{ defect: "dent", shape: box(0, 0, 10, 10) }], suggested: [{ defect: "__proto__", shape: box(50, 50, 10, 10), score: 0.5 }] },
    ]);
    expect(result.byClass.dent).toEqual({ accepted: 1, suggested: 0, hits: 0, recall: 0, precision: 0, f1: 0 });
    expect(Object.hasOwn(result.byClass, "__proto__")).toBe(true);
  });
});

describe("splitByPhoto", () => {
  it("uses FNV-1a 32 (published test vectors)", () => {
    expect(fnv1a("")).toBe(0x811c9dc5);
    expect(fnv1a("a")).toBe(0xe40c292c);
    expect(fnv1a("foobar")).toBe(0xbf9cf968);
  });

  it("never puts a photo on both sides, and puts it on the same side every time", () => {
    const photos = Array.from({ length: 2000 }, (_, k) => ({ id: `photo-${k}` }));
    const first = splitByPhoto(photos, (p) => p.id, { testShare: 0.2 });
    const again = splitByPhoto(photos.slice().reverse(), (p) => p.id, { testShare: 0.2 });
    const testIds = new Set(first.test.map((p) => p.id));
    expect(first.train.some((p) => testIds.has(p.id))).toBe(false);
    expect(new Set(again.test.map((p) => p.id))).toEqual(testIds);
    // Binomial: 2000 × 0.2 = 400 ± 17.9 (1 σ); allow 4 σ.
    expect(Math.abs(first.test.length - 400)).toBeLessThan(72);
  });
});

const evaluation = (byClass: Record<string, [accepted: number, suggested: number, hits: number]>): Evaluation => ({
  iouThreshold: 0.3,
  photos: 20,
  byClass: Object.fromEntries(
    Object.entries(byClass).map(([d, [a, s, h]]) => [d, { accepted: a, suggested: s, hits: h, recall: a ? h / a : 0, precision: s ? h / s : 0, f1: a && s && h ? (2 * h) / (a + s) : 0 }]),
  ),
});

describe("the suggestion rule and the model switch", () => {
  const classes = [
    { defect: "scratch", regions: 40, photos: 30 },
    { defect: "stain", regions: 29, photos: 20 },
    { defect: "crack", regions: 60, photos: 25 },
    { defect: "dent", regions: 50, photos: 9 },
  ];
  it("needs enough examples, enough held-out regions and recall/precision at the floor", () => {
    const decisions = suggestableClasses({ classes } as never, evaluation({ scratch: [10, 12, 6], stain: [10, 10, 9], crack: [10, 30, 9], dent: [10, 10, 10] }));
    const byDefect = Object.fromEntries(decisions.map((d) => [d.defect, d]));
    expect(SUGGESTION_RULE).toMatchObject({ minRecall: 0.6, minPrecision: 0.4 });
    expect(byDefect.scratch.suggest).toBe(true); // recall 0.6, precision 0.5: exactly at / above the floor
    expect(byDefect.stain).toMatchObject({ suggest: false, reason: expect.stringContaining("29 regions (needs 30)") });
    expect(byDefect.crack).toMatchObject({ suggest: false, reason: expect.stringContaining("precision 0.3") });
    expect(byDefect.dent).toMatchObject({ suggest: false, reason: expect.stringContaining("9 photos") });
    const fewTest = suggestableClasses({ classes } as never, evaluation({ scratch: [7, 7, 7] }));
    expect(fewTest[0]).toMatchObject({ suggest: false, reason: expect.stringContaining("7 held-out regions") });
  });

  it("switches in a model that is at least as good on the same test photos, never a worse one", () => {
    const standing = (byClass: Record<string, [number, number, number]>) => {
      const e = evaluation(byClass);
      return { evaluation: e, suggestable: suggestableClasses({ classes } as never, e) };
    };
    const current = standing({ scratch: [10, 10, 8] });
    expect(compareModels(standing({ scratch: [10, 10, 9] }), current)).toMatchObject({ switchIn: true, candidateScore: 0.9, currentScore: 0.8 });
    expect(compareModels(standing({ scratch: [10, 10, 7] }), current)).toMatchObject({ switchIn: false });
    // Losing a class the model in use suggests counts as F1 0 for it.
    expect(compareModels(standing({ scratch: [10, 10, 5] }), current).switchIn).toBe(false);
    expect(compareModels(standing({ scratch: [10, 10, 2] }), null)).toMatchObject({ switchIn: true, reason: "The first model of this workspace: nothing was in use before it, so it is switched in." });
  });

  it("on a tie switches the new model in, unless it may suggest nothing (a tie at 0 keeps the model in use)", () => {
    const standing = (byClass: Record<string, [number, number, number]>) => {
      const e = evaluation(byClass);
      return { evaluation: e, suggestable: suggestableClasses({ classes } as never, e) };
    };
    expect(compareModels(standing({ scratch: [10, 10, 8] }), standing({ scratch: [10, 10, 8] }))).toMatchObject({ switchIn: true, candidateScore: 0.8, currentScore: 0.8 });
    // Too few held-out regions to judge either (7 < 8): both score 0; the new one may suggest nothing.
    const unjudged = standing({ scratch: [7, 7, 7] });
    expect(unjudged.suggestable.some((c) => c.suggest)).toBe(false);
    expect(compareModels(unjudged, standing({ scratch: [7, 7, 2] }))).toMatchObject({ switchIn: false, candidateScore: 0, currentScore: 0 });
  });
});
