import { hidesUnitsAwaitingRecheck } from "@/lib/gallery/access";
import { handler, parseQuery } from "@/lib/http/route";
import { checkReportFilter } from "@/lib/reports/filter-scope";
import { exportCsv, exportFileName } from "@/lib/reports/exports";
import { exportQuerySchema } from "@/lib/reports/filters";
import { localDate } from "@/lib/time/periods";

/**
 * A CSV export (`?kind=lots|units|grades|defects` plus the Reports screen's filters), streamed from
 * a database cursor (lib/reports/exports.ts): memory stays flat however many rows there are.
 */
export const GET = handler({ permission: "reports.read" }, async (req, _ctx, user) => {
  const { kind, ...filter } = parseQuery(req, exportQuerySchema);
  await checkReportFilter(user.workspaceId, filter);
  const body = exportCsv(kind, { workspaceId: user.workspaceId, filter, timeZone: user.timeZone, hideUnitsAwaitingRecheck: hidesUnitsAwaitingRecheck(user.roles) });
  return new Response(body, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8; header=present",
      "Content-Disposition": `attachment; filename="${exportFileName(kind, localDate(new Date(), user.timeZone))}"`,
      "Cache-Control": "no-store",
    },
  });
});
