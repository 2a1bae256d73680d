import { handler, parseQuery } from "@/lib/http/route";
import { scorecardQuerySchema } from "@/lib/recheck/schemas";
import { readScorecards } from "@/lib/recheck/scorecards-read";

/** Grader scorecards for a period (`?from=YYYY-MM-DD&to=YYYY-MM-DD`, local dates; default the last 12 weeks). */
export const GET = handler({ permission: "reports.read" }, async (req, _ctx, user) => {
  return Response.json(await readScorecards(user, parseQuery(req, scorecardQuerySchema)));
});
