/**
 * Aggregation of photo measurements into the values rules read. The aggregation rules are our
 * own spec (grading brief): share → max over photos, count → sum, max lengths/diameters → max,
 * total length and area → sum, pixel class → worst. Expected values are hand sums/maxima.
 */
import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors";
import { buildUnitMetrics, readMetric, totalDefectCount } from "@/lib/grading/unit-metrics";
import type { Rule } from "@/lib/grading/rubric-schema";
import { noFailures, photo } from "./fixtures";

const rule = (over: Record<string, unknown>) => ({ id: "r", metric: "count", defect: "scratch", comparison: ">", threshold: 0, grade: "B", ...over }) as Rule;

const twoBackOneFront = buildUnitMetrics({
  photos: [
    photo({ photoId: "b1", viewKey: "back", defects: { scratch: { share: 0.003, count: 2, maxLengthMm: 4, totalLengthMm: 6, areaMm2: 1.5 } } }),
    photo({ photoId: "b2", viewKey: "back", defects: { scratch: { share: 0.004, count: 1, maxLengthMm: 2.5, totalLengthMm: 2.5, areaMm2: 0.5 } } }),
    photo({ photoId: "f1", viewKey: "front", defects: { scratch: { share: 0.001, count: 3, maxLengthMm: 7, totalLengthMm: 9, areaMm2: 2 } } }),
  ],
  functionalFailures: { critical: 0, major: 2, minor: 1 },
});

describe("readMetric aggregation", () => {
  it("takes the worst photo's share, in percent, never the sum", () => {
    // 0.4 % = 0.004 × 100 (the largest of 0.3 %, 0.4 %, 0.1 %); summing would give 0.8 %.
    expect(readMetric(twoBackOneFront, rule({ metric: "share" })).value).toBeCloseTo(0.4, 12);
  });

  it("sums counts, total lengths and areas; takes the max of the longest lengths", () => {
    expect(readMetric(twoBackOneFront, rule({ metric: "count" })).value).toBe(6); // 2 + 1 + 3
    expect(readMetric(twoBackOneFront, rule({ metric: "totalLengthMm" })).value).toBe(17.5); // 6 + 2.5 + 9
    expect(readMetric(twoBackOneFront, rule({ metric: "areaMm2" })).value).toBe(4); // 1.5 + 0.5 + 2
    expect(readMetric(twoBackOneFront, rule({ metric: "maxLengthMm" })).value).toBe(7);
  });

  it("reads only photos of the rule's view, aggregating several photos of that view", () => {
    const back = (metric: string) => readMetric(twoBackOneFront, rule({ metric, view: "back" })).value;
    expect(back("count")).toBe(3); // 2 + 1
    expect(back("maxLengthMm")).toBe(4);
    expect(back("totalLengthMm")).toBe(8.5); // 6 + 2.5
    expect(back("share")).toBeCloseTo(0.4, 12);
    expect(readMetric(twoBackOneFront, rule({ view: "lens" }))).toEqual({ value: null, unknown: [], missing: "no-photo-of-view" });
  });

  it("reads functional failures by severity", () => {
    expect(readMetric(twoBackOneFront, rule({ metric: "functionalFailures", severity: "major" })).value).toBe(2);
    expect(readMetric(twoBackOneFront, rule({ metric: "functionalFailures", severity: "critical" })).value).toBe(0);
  });

  it("treats a photo without the defect class as 0 and counts all photos for critical checks", () => {
    const metrics = buildUnitMetrics({
      photos: [photo({ photoId: "a", viewKey: "front" }), photo({ photoId: "b", viewKey: "back", defects: { dust: { share: 0.01, maxDiameterMm: 0.3, count: 2 } } })],
      functionalFailures: noFailures,
    });
    expect(readMetric(metrics, rule({ defect: "dust", metric: "maxDiameterMm" })).value).toBe(0.3);
    expect(readMetric(metrics, rule({ defect: "dust", metric: "maxDiameterMm", view: "front" })).value).toBe(0);
    expect(totalDefectCount(metrics, "dust")).toBe(2);
    expect(totalDefectCount(metrics, "swelling")).toBe(0);
  });

  it("reads zone shares from photos that have the zone, skipping zones clipped away", () => {
    const metrics = buildUnitMetrics({
      photos: [
        photo({ photoId: "l1", viewKey: "lens", zones: { "lens-window": { byDefect: { scratch: { share: 0.008, areaMm2: 0.2 } } } } }),
        photo({ photoId: "l2", viewKey: "lens", zones: { "lens-window": { byDefect: { scratch: { share: 0.002, areaMm2: 0.1 } } } } }),
        // zonePx 0: the zone lies outside this photo's surface, so its 90 % must not count.
        photo({ photoId: "l3", viewKey: "lens", zones: { "lens-window": { zonePx: 0, byDefect: { scratch: { px: 0, share: 0.9 } } } } }),
        photo({ photoId: "b1", viewKey: "back" }),
      ],
      functionalFailures: noFailures,
    });
    expect(readMetric(metrics, rule({ metric: "share", zone: "lens-window" })).value).toBeCloseTo(0.8, 12);
    expect(readMetric(metrics, rule({ metric: "areaMm2", zone: "lens-window" })).value).toBeCloseTo(0.3, 12);
    expect(readMetric(metrics, rule({ metric: "share", zone: "body" }))).toEqual({ value: null, unknown: [], missing: "zone-not-on-photos" });
    const clippedOnly = buildUnitMetrics({
      photos: [photo({ photoId: "c", viewKey: "lens", zones: { "lens-window": { zonePx: 0, byDefect: { scratch: { px: 0, share: 0 } } } } })],
      functionalFailures: noFailures,
    });
    expect(readMetric(clippedOnly, rule({ metric: "share", zone: "lens-window" })).missing).toBe("zone-not-on-photos");
  });

  it("marks mm values unknown on uncalibrated photos that show the class, keeping the known part as a lower bound", () => {
    const metrics = buildUnitMetrics({
      photos: [
        photo({ photoId: "cal", viewKey: "back", defects: { scratch: { share: 0.001, maxLengthMm: 2 } } }),
        photo({ photoId: "raw", viewKey: "back", pxPerMm: null, defects: { scratch: { share: 0.002 } } }),
        photo({ photoId: "clean", viewKey: "back", pxPerMm: null }),
      ],
      functionalFailures: noFailures,
    });
    expect(readMetric(metrics, rule({ metric: "maxLengthMm" }))).toEqual({
      value: 2,
      unknown: [{ photoId: "raw", viewKey: "back", reason: "uncalibrated" }],
      missing: null,
    });
    // Share needs no calibration.
    expect(readMetric(metrics, rule({ metric: "share" })).unknown).toEqual([]);
    const onlyRaw = buildUnitMetrics({
      photos: [photo({ photoId: "raw", viewKey: "back", pxPerMm: null, defects: { scratch: { share: 0.002 } } })],
      functionalFailures: noFailures,
    });
    expect(readMetric(onlyRaw, rule({ metric: "totalLengthMm" })).value).toBeNull();
  });

  it('says "not-measured" when a calibrated photo has the class but no length (no Line regions)', () => {
    const metrics = buildUnitMetrics({
      photos: [photo({ photoId: "p", viewKey: "back", defects: { scratch: { share: 0.01 } } })],
      functionalFailures: noFailures,
    });
    expect(readMetric(metrics, rule({ metric: "maxLengthMm" })).unknown).toEqual([{ photoId: "p", viewKey: "back", reason: "not-measured" }]);
  });

  it("takes the worst pixel-fault class over photos that have one", () => {
    const metrics = buildUnitMetrics({
      photos: [photo({ photoId: "w", viewKey: "screen-white", pixelClass: "II" }), photo({ photoId: "k", viewKey: "screen-black", pixelClass: "IV" }), photo({ photoId: "f", viewKey: "front" })],
      functionalFailures: noFailures,
    });
    const pixel = (view?: string) => readMetric(metrics, { id: "p", metric: "pixelFaultClass", view, comparison: "worse-than", threshold: "I", grade: "B" });
    // ISO 13406-2 class order I (best) … IV (a, docs/references.md table); "beyond" is worse than IV.
    expect(pixel().value).toBe("IV");
    expect(pixel("screen-white").value).toBe("II");
    expect(pixel("front")).toEqual({ value: null, unknown: [], missing: "no-pixel-fault-count" });
  });

  it("reports no photos when there are none", () => {
    const metrics = buildUnitMetrics({ photos: [], functionalFailures: noFailures });
    expect(readMetric(metrics, rule({}))).toEqual({ value: null, unknown: [], missing: "no-photos" });
  });
});

describe("buildUnitMetrics validation", () => {
  it("rejects impossible measurements and failure counts with a clear error", () => {
    const bad = photo({ photoId: "p", viewKey: "back", defects: { scratch: { share: 1.5 } } });
    expect(() => buildUnitMetrics({ photos: [bad], functionalFailures: noFailures })).toThrowError(
      new AppError("bad_request", "Invalid photo measurement 1: byDefect.scratch.share: Too big: expected number to be <=1"),
    );
    const twice = photo({ photoId: "p", viewKey: "back" });
    expect(() => buildUnitMetrics({ photos: [twice, twice], functionalFailures: noFailures })).toThrowError('Photo "p" is measured twice; each photo counts once.');
    expect(() => buildUnitMetrics({ photos: [], functionalFailures: { critical: -1, major: 0, minor: 0 } })).toThrowError(/^Invalid functional failure counts: critical: /);
    expect(() => buildUnitMetrics({ photos: [], functionalFailures: { critical: 0.5, major: 0, minor: 0 } })).toThrowError(AppError);
  });
});
