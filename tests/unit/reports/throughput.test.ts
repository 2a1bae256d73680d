/**
 * Inspector throughput: units per day worked and median minutes per unit.
 * D3    d3-array's `median` (npm d3-array 3, the d3 project's general-purpose statistics; already
 *       installed through d3-scale) as a reference for the median of an even and an odd count (a
 *       reference library).
 * NP    NumPy 2.4.6 `numpy.median([3, 1, 4, 1, 5, 9, 2, 6])` = 3.5 (reference library, run here),
 *       the same as PostgreSQL's percentile_cont(0.5) by its definition (linear interpolation
 *       between the two middle values; PostgreSQL manual, aggregate functions, b here).
 * HAND  counts and days worked by hand; the rules are ours (c, lib/reports/throughput.ts).
 */
import { median as d3Median } from "d3-array";
import { describe, expect, it } from "vitest";
import { inspectorThroughput, median, type ThroughputRow } from "@/lib/reports/throughput";
import { mulberry32 } from "@/support/prng";

const row = (graderId: string, partTypeId: string, gradedAt: string, minutes: number | null, graderMinutes: number | null = minutes): ThroughputRow => ({
  graderId,
  partTypeId,
  gradedAt,
  minutes,
  graderMinutes,
});

describe("median", () => {
  it("takes the mean of the two middle values for an even count (NP, D3)", () => {
    expect(median(Float64Array.from([3, 1, 4, 1, 5, 9, 2, 6]))).toBe(3.5);
    expect(median(Float64Array.from([7, 1, 3]))).toBe(3);
    expect(median(new Float64Array(0))).toBeNaN();
  });

  it("agrees with d3-array's median on 200 seeded random lists (D3)", () => {
    const random = mulberry32(17);
    for (let list = 0; list < 200; list++) {
      const values = Array.from({ length: 1 + Math.floor(random() * 40) }, () => Math.round(random() * 6000) / 100);
      expect(median(Float64Array.from(values))).toBeCloseTo(d3Median(values)!, 10);
    }
  });
});

describe("inspectorThroughput", () => {
  const rows = [
    // ann: Monday 1 June, three camera units and a battery; Wednesday the 3rd, one camera unit.
    row("ann", "cam", "2026-06-01T07:00:00Z", 10),
    row("ann", "cam", "2026-06-01T08:00:00Z", 14),
    row("ann", "cam", "2026-06-01T09:00:00Z", null),
    row("ann", "bat", "2026-06-01T10:00:00Z", 4),
    row("ann", "cam", "2026-06-03T10:00:00Z", 20, 12),
    // bo: 22:30 UTC on 1 June is 00:30 on 2 June in Berlin.
    row("bo", "cam", "2026-06-01T22:30:00Z", 8),
    row("bo", "cam", "2026-06-02T09:00:00Z", 6),
    // Outside the period (Berlin): 23:30 on 31 May.
    row("bo", "cam", "2026-05-31T21:30:00Z", 99),
  ];
  const report = inspectorThroughput(rows, { from: "2026-06-01", to: "2026-06-07", timeZone: "Europe/Berlin" });

  it("counts units per day worked, in the workspace's time zone (HAND)", () => {
    const [ann, bo] = report.inspectors;
    expect(ann).toMatchObject({ graderId: "ann", units: 5, daysWorked: 2, unitsPerDay: 2.5 });
    expect(bo).toMatchObject({ graderId: "bo", units: 2, daysWorked: 1, unitsPerDay: 2 });
    // The desk worked on 1, 2 and 3 June.
    expect(report.desk).toEqual({ units: 7, daysWorked: 3, unitsPerDay: 7 / 3 });
  });

  it("takes median minutes per part type over timed units, counting the untimed apart (HAND)", () => {
    // cam, everyone's minutes: 10, 14, 20, 8, 6 (one untimed) → median 10.
    expect(report.partTypes).toEqual([
      { partTypeId: "bat", units: 1, timed: 1, untimed: 0, medianMinutes: 4 },
      { partTypeId: "cam", units: 6, timed: 5, untimed: 1, medianMinutes: 10 },
    ]);
    // ann's own minutes on cam: 10, 14, 12 → 12; over all her units 10, 14, 4, 12 → 11.
    const ann = report.inspectors[0];
    expect(ann.byPartType).toEqual([
      { partTypeId: "bat", units: 1, timed: 1, untimed: 0, medianMinutes: 4 },
      { partTypeId: "cam", units: 4, timed: 3, untimed: 1, medianMinutes: 12 },
    ]);
    expect(ann.medianMinutes).toBe(11);
  });

  it("gives NaN for a part type with no timed unit, and nothing for an empty period", () => {
    const untimed = inspectorThroughput([row("ann", "cam", "2026-06-01T07:00:00Z", null)], { from: "2026-06-01", to: "2026-06-01", timeZone: "UTC" });
    expect(untimed.partTypes[0]).toMatchObject({ timed: 0, untimed: 1 });
    expect(untimed.partTypes[0].medianMinutes).toBeNaN();
    const empty = inspectorThroughput([], { from: "2026-06-01", to: "2026-06-07", timeZone: "UTC" });
    expect(empty.inspectors).toEqual([]);
    expect(empty.desk.unitsPerDay).toBeNaN();
  });

  it("refuses negative minutes and a bad time", () => {
    expect(() => inspectorThroughput([row("ann", "cam", "2026-06-01T07:00:00Z", -1)], { from: "2026-06-01", to: "2026-06-01", timeZone: "UTC" })).toThrow(/number >= 0 or null/);
    expect(() => inspectorThroughput([row("ann", "cam", "yesterday", 3)], { from: "2026-06-01", to: "2026-06-01", timeZone: "UTC" })).toThrow(/Not a valid instant/);
  });
});
