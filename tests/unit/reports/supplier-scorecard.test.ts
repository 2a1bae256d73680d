/**
 * Supplier scorecard figures.
 * Z14   Percent nonconforming = nonconforming units × 100 / units inspected, and nonconformities
 *       per hundred units = nonconformities × 100 / units inspected (MIL-STD-105E and ANSI/ASQ
 *       Z1.4, section 3 "Extent of nonconformance"; b, from memory).
 * HAND  pooled sums by hand; the month and pooling rules are ours (c, lib/reports/supplier-scorecard.ts).
 */
import { describe, expect, it } from "vitest";
import { supplierScorecards, type SupplierLotRow } from "@/lib/reports/supplier-scorecard";

type Counts = [inspected: number, defectives: number];
function lot(
  supplierId: string,
  receivedOn: string,
  verdict: "accept" | "reject" | null,
  severity: { critical: Counts; major: Counts; minor: Counts },
  inspected: number,
  classes: SupplierLotRow["classes"] = {},
): SupplierLotRow {
  const counts = ([i, d]: Counts) => ({ inspected: i, defectives: d });
  return {
    supplierId,
    receivedOn,
    status: verdict ? "decided" : "open",
    verdict,
    bySeverity: { critical: counts(severity.critical), major: counts(severity.major), minor: counts(severity.minor) },
    inspected,
    classes,
  };
}

const LOTS = [
  lot("north", "2026-01-10", "accept", { critical: [32, 0], major: [32, 1], minor: [32, 2] }, 32, { scratch: { units: 2, defects: 3 } }),
  lot("north", "2026-01-25", "reject", { critical: [50, 1], major: [50, 4], minor: [20, 3] }, 50, { scratch: { units: 3, defects: 3 }, crack: { units: 1, defects: 1 } }),
  lot("south", "2026-02-14", "reject", { critical: [13, 0], major: [13, 2], minor: [13, 2] }, 13, { dent: { units: 2, defects: 2 } }),
  lot("north", "2026-03-02", null, { critical: [8, 0], major: [8, 0], minor: [8, 0] }, 8),
];

describe("supplierScorecards", () => {
  const [north, south] = supplierScorecards(LOTS, { scratch: "Scratch", crack: "Crack" });

  it("counts lots received, accepted, rejected and open per month of receipt, gaps included (HAND)", () => {
    expect(north.months.map((m) => [m.month, m.lots, m.accepted, m.rejected, m.open])).toEqual([
      ["2026-01-01", 2, 1, 1, 0],
      ["2026-02-01", 0, 0, 0, 0],
      ["2026-03-01", 1, 0, 0, 1],
    ]);
    expect(north.total).toMatchObject({ lots: 3, accepted: 1, rejected: 1, open: 1, inspected: 90 });
    expect(south.months.map((m) => m.month)).toEqual(["2026-02-01"]);
  });

  it("gives defectives per 100 inspected per severity, pooled over the month's lots (Z14 b, HAND)", () => {
    const january = north.months[0];
    // Major: (1 + 4) of (32 + 50) inspected; minor: (2 + 3) of (32 + 20) — each severity on its own inspected units.
    expect(january.bySeverity.major).toEqual({ inspected: 82, defectives: 5, per100: 500 / 82 });
    expect(january.bySeverity.minor).toEqual({ inspected: 52, defectives: 5, per100: 500 / 52 });
    expect(january.bySeverity.critical.per100).toBeCloseTo(100 / 82, 12);
    expect(north.months[1].bySeverity.major.per100).toBeNaN();
  });

  it("gives units affected and defects per 100 inspected units per defect class (Z14 b, HAND)", () => {
    expect(north.months[0].classes.scratch).toEqual({ units: 5, defects: 6, unitsPer100: 500 / 82, defectsPer100: 600 / 82 });
    // Over the whole span the March lot adds 8 inspected units and no defects.
    expect(north.total.classes.crack).toEqual({ units: 1, defects: 1, unitsPer100: 100 / 90, defectsPer100: 100 / 90 });
  });

  it("draws the Pareto from the defect counts, with the labels given", () => {
    expect(north.pareto.map((r) => [r.key, r.label, r.count, r.cumulative])).toEqual([
      ["scratch", "Scratch", 6, 6],
      ["crack", "Crack", 1, 7],
    ]);
    expect(north.pareto[1].cumulativeShare).toBe(1);
    expect(south.pareto[0]).toMatchObject({ key: "dent", label: "dent", count: 2 });
  });

  it("refuses counts that cannot be: a decided lot without verdict, more defectives than inspected, more units than defects", () => {
    expect(() => supplierScorecards([{ ...LOTS[0], verdict: null }])).toThrow(/decided lot has a verdict/);
    expect(() => supplierScorecards([lot("x", "2026-01-01", "accept", { critical: [5, 0], major: [5, 6], minor: [5, 0] }, 5)])).toThrow(/More major defectives \(6\) than units inspected \(5\)/);
    expect(() => supplierScorecards([lot("x", "2026-01-01", "accept", { critical: [5, 0], major: [5, 0], minor: [5, 0] }, 5, { dust: { units: 3, defects: 2 } })])).toThrow(/"dust"/);
    expect(() => supplierScorecards([lot("x", "2026-02-30", "accept", { critical: [5, 0], major: [5, 0], minor: [5, 0] }, 5)])).toThrow(/Not a calendar date/);
    expect(() => supplierScorecards([lot("x", "2026-02-01", "accept", { critical: [5, 0], major: [5, 0.5], minor: [5, 0] }, 5)])).toThrow(/whole number/);
  });

  it("gives nothing for no lots", () => {
    expect(supplierScorecards([])).toEqual([]);
  });
});
