import { handler, parseJson } from "@/lib/http/route";
import { adjudicate } from "@/lib/recheck/adjudicate";
import { adjudicationView } from "@/lib/recheck/adjudication-view";
import { adjudicateSchema } from "@/lib/recheck/schemas";
import { parseId } from "@/lib/validation";

/** Both sides of a disagreement, for a lead or an auditor who graded neither (403 for either grader). */
export const GET = handler({ permission: "recheck.adjudicate" }, async (_req, ctx: RouteContext<"/api/rechecks/[id]/adjudication">, user) => {
  return Response.json(await adjudicationView(user, parseId((await ctx.params).id, "That recheck")));
});

/** Settles it: `{ choice: "first" | "recheck", reason }` or `{ choice: "own", finalGrade, reason }` (201). */
export const POST = handler({ permission: "recheck.adjudicate" }, async (req, ctx: RouteContext<"/api/rechecks/[id]/adjudication">, user) => {
  const recheckId = parseId((await ctx.params).id, "That recheck");
  const input = await parseJson(req, adjudicateSchema);
  return Response.json({ adjudication: await adjudicate(user, recheckId, input) }, { status: 201 });
});
