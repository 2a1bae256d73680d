import { can } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { handler, parseQuery } from "@/lib/http/route";
import { checkReportFilter } from "@/lib/reports/filter-scope";
import { exportCsv, exportFileName } from "@/lib/reports/exports";
import { exportQuerySchema } from "@/lib/reports/filters";
import { localDate } from "@/lib/time/periods";

/**
 * A CSV export (`?kind=lots|units|grades|defects` plus the Reports screen's filters), streamed from
 * a database cursor (lib/reports/exports.ts): memory stays flat however many rows there are.
 * Lots for anyone who reads reports; units, grades and defects for leads only (reports.units).
 */
export const GET = handler({ permission: "reports.read" }, async (req, _ctx, user) => {
  const { kind, ...filter } = parseQuery(req, exportQuerySchema);
  if (kind !== "lots" && !can(user, "reports.units")) throw new AppError("forbidden", "Unit by unit grades need the lead role: an auditor rechecks graded units blind. The lots export and the aggregate reports are yours.");
  await checkReportFilter(user.workspaceId, filter);
  const body = exportCsv(kind, { workspaceId: user.workspaceId, filter, timeZone: user.timeZone });
  return new Response(body, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8; header=present",
      "Content-Disposition": `attachment; filename="${exportFileName(kind, localDate(new Date(), user.timeZone))}"`,
      "Cache-Control": "no-store",
    },
  });
});
