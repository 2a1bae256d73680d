import { handler, parseQuery } from "@/lib/http/route";
import { csvHeader, csvLines } from "@/lib/reports/csv-stream";
import { SCORECARD_CSV_COLUMNS, scorecardCsvRows } from "@/lib/recheck/scorecard-csv";
import { scorecardQuerySchema } from "@/lib/recheck/schemas";
import { readScorecards } from "@/lib/recheck/scorecards-read";

/** The scorecards of a period as CSV (same `?from=&to=` as GET /api/recheck/scorecards): per grader and week, per grader, the team. */
export const GET = handler({ permission: "reports.read" }, async (req, _ctx, user) => {
  const view = await readScorecards(user, parseQuery(req, scorecardQuerySchema));
  const text = csvHeader(SCORECARD_CSV_COLUMNS) + csvLines(SCORECARD_CSV_COLUMNS, scorecardCsvRows(view));
  return new Response(text, {
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="scorecards-${view.from}-to-${view.to}.csv"`, "cache-control": "no-store" },
  });
});
