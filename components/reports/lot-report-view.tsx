import { VerdictBadge } from "@/components/lots/badges";
import { DEFECT_SEVERITIES as SEVERITY_ORDER } from "@/lib/part-types/severity";
import { DISPOSITION_LABELS } from "@/lib/lots/schemas";
import { formatAql, formatShare, GRADE_CAUTION } from "@/lib/reports/format";
import { DEFECT_SEVERITY_LABELS as SEVERITY_LABELS } from "@/lib/part-types/severity";
import type { LotReportData, LotReportPlanRow } from "@/lib/reports/lot-report-data";
import { paretoRows } from "@/lib/reports/pareto";
import { formatInstant } from "@/lib/time/format";
import { ReportTable } from "./report-table";

const classResult = (p: LotReportPlanRow) => (p.found >= p.reject ? "reject" : p.inspected >= p.sampleSize ? "accept" : "pending");

/** The lot inspection report on screen: the same data and order as the PDF (lib/reports/lot-report-pdf.ts). */
export function LotReportView({ data, lotId, timeZone }: { data: LotReportData; lotId: string; timeZone: string }) {
  const { lot, decision } = data;
  const pareto = paretoRows(data.defectCounts);
  const facts: [string, string][] = [
    ["Supplier", lot.supplierName],
    ["Part type", lot.partTypeName],
    ["Device model family", lot.modelFamily || "—"],
    ["Lot size", `${lot.quantity} units, received ${lot.receivedOn}`],
    ["Inspection", `${lot.hundredPercent ? "100 % (every unit)" : `${lot.sampleSize} units sampled`} · level ${lot.inspectionLevel} · ${lot.inspectionSeverity} inspection`],
    ...(lot.switchingReason ? ([["Why this severity", lot.switchingReason]] as [string, string][]) : []),
  ];
  return (
    <article className="space-y-6" data-testid="lot-report">
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h1 className="page-title">Lot inspection report · {lot.purchaseRef}</h1>
          <p className="text-sm text-gauge-600">
            {data.workspaceName} · generated {formatInstant(data.generatedAt, timeZone)}
          </p>
        </div>
        <a className="btn-primary" href={`/api/lots/${lotId}/report`} download>
          Download PDF (with photos)
        </a>
      </header>

      <section className="card p-5" aria-label="The lot">
        <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-[auto_1fr]">
          {facts.map(([term, value]) => (
            <div key={term} className="contents">
              <dt className="font-medium text-gauge-700">{term}</dt>
              <dd>{value}</dd>
            </div>
          ))}
        </dl>
      </section>

      <section className="card space-y-3 p-5" aria-labelledby="report-plan">
        <h2 id="report-plan" className="text-lg font-semibold">
          Sampling plan per severity (ISO 2859-1 single sampling)
        </h2>
        <ReportTable
          caption="Sampling plan and defectives found per severity"
          rows={SEVERITY_ORDER.map((severity) => ({ severity, ...data.plan[severity] }))}
          rowKey={(r) => r.severity}
          columns={[
            { header: "Severity", rowHeader: true, cell: (r) => SEVERITY_LABELS[r.severity] },
            { header: "AQL", cell: (r) => formatAql(r.aql) },
            { header: "Code letter", cell: (r) => (r.planLetter === r.codeLetter ? r.codeLetter : `${r.codeLetter} → ${r.planLetter}`) },
            { header: "Sample", numeric: true, cell: (r) => r.sampleSize },
            { header: "Ac", numeric: true, cell: (r) => r.accept },
            { header: "Re", numeric: true, cell: (r) => r.reject },
            { header: "Inspected", numeric: true, cell: (r) => r.inspected },
            { header: "Defectives", numeric: true, cell: (r) => r.found },
            { header: "Result", cell: (r) => classResult(r) },
          ]}
        />
        <p className="text-xs text-gauge-600">A unit counts once per severity in which it has a nonconformity; a class rejects the lot when the defectives found reach Re.</p>
      </section>

      <section className="card space-y-2 p-5" aria-labelledby="report-verdict">
        <h2 id="report-verdict" className="flex items-center gap-2 text-lg font-semibold">
          Verdict and disposition <VerdictBadge verdict={decision?.verdict ?? data.runningVerdict ?? "pending"} testId="report-verdict" />
        </h2>
        {decision ? (
          <p className="text-sm">
            {decision.disposition ? `${DISPOSITION_LABELS[decision.disposition]}. ` : ""}
            {decision.reason ? `“${decision.reason}” ` : ""}— {decision.decidedBy || "a lead"}, {formatInstant(decision.decidedAt, timeZone)}
          </p>
        ) : (
          <p className="text-sm">Not decided yet: the verdict shown is the running one and may change.</p>
        )}
        <p className="text-xs text-gauge-600">{GRADE_CAUTION}</p>
      </section>

      <section className="card space-y-3 p-5" aria-labelledby="report-pareto">
        <h2 id="report-pareto" className="text-lg font-semibold">
          Defect classes (Pareto)
        </h2>
        {pareto.length === 0 ? (
          <p className="text-sm text-gauge-700">No cosmetic defect was marked on the graded units.</p>
        ) : (
          <ReportTable
            caption="Defects per class, most frequent first, with the cumulative share"
            rows={pareto}
            rowKey={(r) => r.key}
            columns={[
              { header: "Defect class", rowHeader: true, cell: (r) => r.label },
              { header: "Defects", numeric: true, cell: (r) => r.count },
              { header: "Share", numeric: true, cell: (r) => formatShare(r.share) },
              { header: "Cumulative", numeric: true, cell: (r) => formatShare(r.cumulativeShare) },
            ]}
          />
        )}
      </section>

      <section className="card space-y-3 p-5" aria-labelledby="report-units">
        <h2 id="report-units" className="text-lg font-semibold">
          Sampled units ({data.units.length})
        </h2>
        <ReportTable
          caption="Sampled units with grade, defect classes and functional failures"
          testId="report-units"
          rows={data.units}
          rowKey={(u) => String(u.sampleIndex)}
          columns={[
            { header: "#", numeric: true, cell: (u) => u.sampleIndex },
            { header: "Serial", rowHeader: true, cell: (u) => u.serial ?? "(not recorded)" },
            { header: "Grade", cell: (u) => u.grade ?? "not graded" },
            { header: "Defect classes", cell: (u) => u.defectClasses.join(", ") },
            { header: "Functional failures", cell: (u) => u.functionalFailures.join("; ") },
          ]}
        />
      </section>
    </article>
  );
}
