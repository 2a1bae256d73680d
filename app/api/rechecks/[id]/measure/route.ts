import { handler } from "@/lib/http/route";
import { measureRecheck } from "@/lib/recheck/submit";
import { parseId } from "@/lib/validation";

/** Measures the auditor's own regions under the first grade's rubric version; returns the proposal (nothing stored). */
export const POST = handler({ permission: "recheck.perform" }, async (_req, ctx: RouteContext<"/api/rechecks/[id]/measure">, user) => {
  return Response.json(await measureRecheck(user, parseId((await ctx.params).id, "That recheck")));
});
