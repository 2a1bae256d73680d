import { handler, parseJson } from "@/lib/http/route";
import { submitRecheckSchema } from "@/lib/recheck/schemas";
import { submitRecheck } from "@/lib/recheck/submit";
import { parseId } from "@/lib/validation";

/** The auditor's grade (accept, or override with a reason); the comparison is stored and the outcome returned. */
export const POST = handler({ permission: "recheck.perform" }, async (req, ctx: RouteContext<"/api/rechecks/[id]/submission">, user) => {
  const recheckId = parseId((await ctx.params).id, "That recheck");
  const input = await parseJson(req, submitRecheckSchema);
  return Response.json({ recheck: await submitRecheck(user, recheckId, input) }, { status: 201 });
});
