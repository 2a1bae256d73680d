import { ParetoChart } from "@/components/reports/pareto-chart";
import { figure, percent, ReportTable } from "@/components/reports/report-table";
import { listPartTypes } from "@/db/queries/part-types";
import { loadSupplierScorecards } from "@/lib/reports/overview";
import { formatInstant } from "@/lib/reports/format";
import { loadOpenClaims, loadSupplierSwitching } from "@/lib/reports/supplier-follow-up";
import { monthLabel } from "@/lib/time/periods";

/**
 * The full scorecard of one supplier (all its lots): lots received, accepted and rejected per
 * month, defectives per 100 inspected units per severity, and the Pareto of defect classes with
 * the numbers in a table beside the chart, the switching state per part type with the switches
 * that led there, and the claims still open. Figures: lib/reports/supplier-scorecard.ts.
 */
export async function SupplierScorecardSection({ workspaceId, supplierId, timeZone }: { workspaceId: string; supplierId: string; timeZone: string }) {
  const partTypes = await listPartTypes({ workspaceId });
  const labels: Record<string, string> = {};
  for (const p of partTypes) for (const c of p.defectClasses) labels[c.key] ??= c.label;
  const [[card], switching, openClaims] = await Promise.all([
    loadSupplierScorecards({ workspaceId, filter: { supplierId }, timeZone }, labels),
    loadSupplierSwitching({ workspaceId, supplierId }),
    loadOpenClaims({ workspaceId, supplierId }),
  ]);
  return (
    <section className="card space-y-4 p-5" aria-labelledby="scorecard-title" data-testid="supplier-scorecard">
      <h2 id="scorecard-title" className="text-lg font-semibold">
        Scorecard
      </h2>
      {!card ? (
        <p className="text-sm text-gauge-700">No lots from this supplier yet.</p>
      ) : (
        <>
          <ReportTable
            caption="Lots and defectives per month"
            testId="scorecard-months"
            rows={card.months}
            rowKey={(m) => m.month}
            columns={[
              { header: "Month", rowHeader: true, cell: (m) => <span className="whitespace-nowrap">{monthLabel(m.month)}</span> },
              { header: "Lots", numeric: true, cell: (m) => m.lots },
              { header: "Accepted", numeric: true, cell: (m) => m.accepted },
              { header: "Rejected", numeric: true, cell: (m) => m.rejected },
              { header: "Open", numeric: true, cell: (m) => m.open },
              { header: "Units graded", numeric: true, cell: (m) => m.inspected },
              { header: "Critical /100", numeric: true, cell: (m) => figure(m.bySeverity.critical.per100) },
              { header: "Major /100", numeric: true, cell: (m) => figure(m.bySeverity.major.per100) },
              { header: "Minor /100", numeric: true, cell: (m) => figure(m.bySeverity.minor.per100) },
            ]}
          />
          <div className="grid gap-4 xl:grid-cols-2">
            {card.pareto.length === 0 ? (
              <p className="text-sm text-gauge-700">No cosmetic defects recorded on this supplier&apos;s units.</p>
            ) : (
              <ParetoChart rows={card.pareto} title="Pareto of defect classes: defects per class and cumulative share" />
            )}
            <ReportTable
              caption="Defect classes (Pareto)"
              testId="scorecard-pareto"
              rows={card.pareto}
              rowKey={(r) => r.key}
              columns={[
                { header: "Class", rowHeader: true, cell: (r) => r.label },
                { header: "Defects", numeric: true, cell: (r) => r.count },
                { header: "Per 100 units", numeric: true, cell: (r) => figure(card.total.classes[r.key]?.defectsPer100 ?? Number.NaN) },
                { header: "Share", numeric: true, cell: (r) => percent(r.share) },
                { header: "Cumulative", numeric: true, cell: (r) => percent(r.cumulativeShare) },
              ]}
            />
          </div>
          <h3 className="text-base font-semibold">Inspection per part type (switching rules)</h3>
          <ReportTable
            caption="Switching state per part type, with its history"
            testId="scorecard-switching"
            rows={switching}
            rowKey={(r) => r.partTypeId}
            columns={[
              { header: "Part type", rowHeader: true, cell: (r) => r.partType },
              { header: "Next lot", cell: (r) => (r.discontinued ? "discontinued" : r.severity) },
              { header: "Why", cell: (r) => `${r.reason} ${r.progress}` },
              {
                header: "Switches so far",
                cell: (r) =>
                  r.transitions.length === 0 ? (
                    `none (${r.decidedLots} decided lots)`
                  ) : (
                    <ol className="list-decimal pl-4">
                      {r.transitions.map((t, i) => (
                        <li key={i}>
                          {t.afterLotId ? `after ${t.afterLotId}: ` : ""}
                          {t.from} → {t.to} <span className="text-xs text-gauge-600">({t.reason})</span>
                        </li>
                      ))}
                    </ol>
                  ),
              },
            ]}
          />
        </>
      )}
      <h3 className="text-base font-semibold">Open claims</h3>
      {openClaims.length === 0 ? (
        <p className="text-sm text-gauge-700" data-testid="scorecard-open-claims">
          No open claims with this supplier.
        </p>
      ) : (
        <ReportTable
          caption="Claims still open with this supplier"
          testId="scorecard-open-claims"
          rows={openClaims}
          rowKey={(c) => c.id}
          columns={[
            { header: "Claim", rowHeader: true, cell: (c) => c.reference },
            { header: "Lot", cell: (c) => c.purchaseRef },
            { header: "Opened", cell: (c) => formatInstant(c.createdAt, timeZone) },
            { header: "Note", cell: (c) => c.note || "—" },
          ]}
        />
      )}
    </section>
  );
}
