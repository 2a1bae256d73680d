import Link from "next/link";
import { VerdictBadge } from "@/components/lots/badges";
import { listReportLots } from "@/db/queries/reports";
import { DISPOSITION_LABELS, type Disposition } from "@/lib/lots/schemas";
import { REPORT_LOTS_PAGE_SIZE, type ReportFilter } from "@/lib/reports/filters";
import { ReportTable } from "./report-table";

/** The filtered lots, each with its inspection report (web view and PDF), a page at a time. */
export async function ReportLots({ workspaceId, filter, page, pageHref }: { workspaceId: string; filter: ReportFilter; page: number; pageHref: (page: number) => string }) {
  const { lots, total } = await listReportLots({ workspaceId, filter, page, pageSize: REPORT_LOTS_PAGE_SIZE });
  const pages = Math.max(1, Math.ceil(total / REPORT_LOTS_PAGE_SIZE));
  if (total === 0) return <p className="text-sm text-gauge-700">No lots were received in this filter. Widen the dates or choose another supplier.</p>;
  return (
    <div className="space-y-3">
      <ReportTable
        caption="Lot inspection reports"
        testId="report-lots"
        rows={lots}
        rowKey={(l) => l.id}
        columns={[
          { header: "Lot", rowHeader: true, cell: (l) => l.purchaseRef },
          { header: "Supplier", cell: (l) => l.supplierName },
          { header: "Part type", cell: (l) => l.partTypeName },
          { header: "Received", cell: (l) => <span className="whitespace-nowrap tabular-nums">{l.receivedOn}</span> },
          { header: "Graded", numeric: true, cell: (l) => `${l.unitsGraded} / ${l.sampleSize}` },
          {
            header: "Verdict",
            cell: (l) =>
              l.status === "decided" && l.verdict ? (
                <span className="flex flex-wrap items-center gap-1">
                  <VerdictBadge verdict={l.verdict} />
                  {l.disposition && <span className="text-xs text-gauge-600">{DISPOSITION_LABELS[l.disposition as Disposition]}</span>}
                </span>
              ) : (
                <span className="text-xs text-gauge-500">open</span>
              ),
          },
          {
            header: "Report",
            cell: (l) => (
              <span className="flex flex-wrap gap-x-3 gap-y-1 whitespace-nowrap">
                <Link href={`/reports/lots/${l.id}`} className="font-medium text-gauge-700 underline" aria-label={`Report of lot ${l.purchaseRef}`}>
                  View
                </Link>
                <a href={`/api/lots/${l.id}/report`} className="font-medium text-gauge-700 underline" aria-label={`PDF report of lot ${l.purchaseRef}`} download>
                  PDF
                </a>
              </span>
            ),
          },
        ]}
      />
      {pages > 1 && (
        <nav className="flex items-center justify-between text-sm" aria-label="Lot report pages">
          <span className="text-gauge-700">
            Page {page} of {pages} · {total} lots
          </span>
          <span className="flex gap-2">
            {page > 1 && (
              <Link className="btn-secondary" href={pageHref(page - 1)} scroll={false}>
                Previous
              </Link>
            )}
            {page < pages && (
              <Link className="btn-secondary" href={pageHref(page + 1)} scroll={false}>
                Next
              </Link>
            )}
          </span>
        </nav>
      )}
    </div>
  );
}
