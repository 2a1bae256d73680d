import Link from "next/link";
import type { SupplierScorecard } from "@/lib/reports/supplier-scorecard";
import { figure, percent, ReportTable } from "./report-table";

/**
 * Supplier scorecards in brief: per supplier, the lots of the filter and their outcome, defectives
 * per 100 inspected units per severity, and the defect classes that make up most defects (the
 * Pareto's "vital few"), and its claims still open (all of them, whatever the filter). The
 * supplier page carries the full scorecard: charts, switching state per part type, the claims.
 */
export function ReportScorecards({ scorecards, supplierNames, openClaims }: { scorecards: SupplierScorecard[]; supplierNames: ReadonlyMap<string, string>; openClaims: ReadonlyMap<string, number> }) {
  if (scorecards.length === 0) return <p className="text-sm text-gauge-700">No lots in this filter, so no supplier to score.</p>;
  return (
    <ReportTable
      caption="Supplier scorecards"
      testId="report-scorecards"
      rows={scorecards}
      rowKey={(s) => s.supplierId}
      columns={[
        {
          header: "Supplier",
          rowHeader: true,
          cell: (s) => (
            <Link className="underline" href={`/suppliers/${s.supplierId}`}>
              {supplierNames.get(s.supplierId) ?? "Unknown supplier"}
            </Link>
          ),
        },
        { header: "Lots", numeric: true, cell: (s) => s.total.lots },
        { header: "Accepted", numeric: true, cell: (s) => s.total.accepted },
        { header: "Rejected", numeric: true, cell: (s) => s.total.rejected },
        { header: "Open", numeric: true, cell: (s) => s.total.open },
        { header: "Units graded", numeric: true, cell: (s) => s.total.inspected },
        { header: "Critical /100", numeric: true, cell: (s) => figure(s.total.bySeverity.critical.per100) },
        { header: "Major /100", numeric: true, cell: (s) => figure(s.total.bySeverity.major.per100) },
        { header: "Minor /100", numeric: true, cell: (s) => figure(s.total.bySeverity.minor.per100) },
        {
          header: "Most defects",
          cell: (s) => {
            const vital = s.pareto.filter((p) => p.vitalFew);
            return vital.length === 0 ? <span className="text-gauge-500">none marked</span> : vital.map((p) => `${p.label} ${percent(p.share)}`).join(", ");
          },
        },
        { header: "Open claims", numeric: true, cell: (s) => openClaims.get(s.supplierId) ?? 0 },
      ]}
    />
  );
}
