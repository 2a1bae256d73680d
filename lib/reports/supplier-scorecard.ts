/**
 * The supplier scorecard's figures (issue 17): per supplier and month, lots received, accepted,
 * rejected and still open; defective units per 100 inspected per severity; and per defect class
 * both the units affected and the defects found per 100 inspected units, with a Pareto of the
 * classes (pareto.ts). Pure: plain rows in, plain rows out.
 *
 * What it expects: one row per lot (the SQL aggregates units and regions per lot first, so a
 * workspace with 100 000 inspected units hands over a few thousand rows).
 *
 * Decisions:
 * - A lot counts in the month it was received (its `receivedOn`, a calendar date, so no time
 *   zone is involved), also for its decision, which may come later: the scorecard reads "of the
 *   lots received in March, so many were rejected".
 * - Per severity ("percent nonconforming", MIL-STD-105E / ANSI/ASQ Z1.4 section 3; b, from
 *   memory): defective units ÷ units inspected for that severity × 100, counted as the lot
 *   verdict counts them (lib/lots/verdict.ts: a unit counts once per severity; each severity is
 *   judged on its own inspected units, which is why `bySeverity` carries its own `inspected`).
 * - Per defect class: units with at least one defect of the class ÷ units inspected × 100
 *   (percent of units affected), and separate defects ÷ units inspected × 100 ("nonconformities
 *   per hundred units", same section, b). The Pareto counts defects (nonconformities).
 * - Rates of a month or a total are pooled: sums of counts divided by sums of inspected units,
 *   not a mean of per-lot rates (a 5-unit lot does not weigh as much as a 200-unit one).
 *   NaN where nothing was inspected (show "n/a").
 * - Months run from the first to the last month with a lot, gaps included (zero lots), so a
 *   trend chart's x axis has no holes.
 */
import { DEFECT_SEVERITIES, type DefectSeverity } from "@/lib/part-types/severity";
import { periodOfDate, periodsBetween } from "@/lib/time/periods";
import { paretoRows, type ParetoRow } from "./pareto";

export type SupplierLotRow = {
  supplierId: string;
  receivedOn: string;
  status: "open" | "decided";
  verdict: "accept" | "reject" | null;
  bySeverity: Record<DefectSeverity, { inspected: number; defectives: number }>;
  /** Units inspected for cosmetic defects (graded units of the lot's sample). */
  inspected: number;
  classes: Record<string, { units: number; defects: number }>;
};

export type ClassRate = { units: number; defects: number; unitsPer100: number; defectsPer100: number };
export type SupplierFigures = {
  lots: number;
  accepted: number;
  rejected: number;
  open: number;
  inspected: number;
  bySeverity: Record<DefectSeverity, { inspected: number; defectives: number; per100: number }>;
  classes: Record<string, ClassRate>;
};
export type SupplierScorecard = {
  supplierId: string;
  months: ({ month: string } & SupplierFigures)[];
  total: SupplierFigures;
  pareto: ParetoRow[];
};

const per100 = (count: number, inspected: number) => (inspected === 0 ? Number.NaN : (100 * count) / inspected);

function checkCount(value: number, what: string) {
  if (!Number.isInteger(value) || value < 0) throw new RangeError(`${what} must be a whole number >= 0, got ${value}.`);
}

class FiguresSum {
  lots = 0;
  accepted = 0;
  rejected = 0;
  open = 0;
  inspected = 0;
  severity = Object.fromEntries(DEFECT_SEVERITIES.map((s) => [s, { inspected: 0, defectives: 0 }])) as Record<DefectSeverity, { inspected: number; defectives: number }>;
  classes = new Map<string, { units: number; defects: number }>();

  add(lot: SupplierLotRow) {
    this.lots++;
    if (lot.status === "open") this.open++;
    else if (lot.verdict === "accept") this.accepted++;
    else if (lot.verdict === "reject") this.rejected++;
    else throw new RangeError(`A decided lot has a verdict (accept or reject); a lot of ${lot.supplierId} received ${lot.receivedOn} has none.`);
    this.inspected += lot.inspected;
    for (const severity of DEFECT_SEVERITIES) {
      const counts = lot.bySeverity[severity];
      if (counts.defectives > counts.inspected) throw new RangeError(`More ${severity} defectives (${counts.defectives}) than units inspected (${counts.inspected}).`);
      this.severity[severity].inspected += counts.inspected;
      this.severity[severity].defectives += counts.defectives;
    }
    for (const [defect, counts] of Object.entries(lot.classes)) {
      if (counts.units > lot.inspected || counts.units > counts.defects)
        throw new RangeError(`Class "${defect}": ${counts.units} units affected must be at most the ${lot.inspected} inspected and the ${counts.defects} defects.`);
      const entry = this.classes.get(defect) ?? { units: 0, defects: 0 };
      entry.units += counts.units;
      entry.defects += counts.defects;
      this.classes.set(defect, entry);
    }
  }

  figures(): SupplierFigures {
    return {
      lots: this.lots,
      accepted: this.accepted,
      rejected: this.rejected,
      open: this.open,
      inspected: this.inspected,
      bySeverity: Object.fromEntries(
        DEFECT_SEVERITIES.map((s) => [s, { ...this.severity[s], per100: per100(this.severity[s].defectives, this.severity[s].inspected) }]),
      ) as SupplierFigures["bySeverity"],
      classes: Object.fromEntries([...this.classes].map(([defect, c]) => [defect, { ...c, unitsPer100: per100(c.units, this.inspected), defectsPer100: per100(c.defects, this.inspected) }])),
    };
  }
}

function checkLot(lot: SupplierLotRow) {
  periodOfDate(lot.receivedOn, "month");
  checkCount(lot.inspected, "Units inspected");
  for (const severity of DEFECT_SEVERITIES) {
    const counts = lot.bySeverity?.[severity];
    if (!counts) throw new RangeError(`Counts for ${severity} defects are missing.`);
    checkCount(counts.inspected, `Units inspected for ${severity} defects`);
    checkCount(counts.defectives, `${severity} defectives`);
  }
  for (const [defect, counts] of Object.entries(lot.classes)) {
    checkCount(counts.units, `Units with "${defect}"`);
    checkCount(counts.defects, `"${defect}" defects`);
  }
}

/**
 * One scorecard per supplier in `lots`, suppliers in order of first appearance. `labels` names
 * the defect classes for the Pareto (the key where no label is given).
 */
export function supplierScorecards(lots: readonly SupplierLotRow[], labels: Readonly<Record<string, string>> = {}): SupplierScorecard[] {
  const bySupplier = new Map<string, { months: Map<string, FiguresSum>; total: FiguresSum }>();
  for (const lot of lots) {
    checkLot(lot);
    let supplier = bySupplier.get(lot.supplierId);
    if (!supplier) bySupplier.set(lot.supplierId, (supplier = { months: new Map(), total: new FiguresSum() }));
    const month = periodOfDate(lot.receivedOn, "month");
    let sum = supplier.months.get(month);
    if (!sum) supplier.months.set(month, (sum = new FiguresSum()));
    sum.add(lot);
    supplier.total.add(lot);
  }
  return [...bySupplier].map(([supplierId, { months, total }]) => {
    const keys = [...months.keys()].sort();
    const figures = total.figures();
    return {
      supplierId,
      months: periodsBetween(keys[0], keys[keys.length - 1], "month").map((month) => ({ month, ...(months.get(month) ?? new FiguresSum()).figures() })),
      total: figures,
      pareto: paretoRows(Object.entries(figures.classes).map(([key, c]) => ({ key, label: labels[key] ?? key, count: c.defects }))),
    };
  });
}
