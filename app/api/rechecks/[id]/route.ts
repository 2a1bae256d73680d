import { handler } from "@/lib/http/route";
import { blindRecheckView } from "@/lib/recheck/blind-view";
import { parseId } from "@/lib/validation";

/** The recheck as its holder sees it before submitting: photos, checklist readings, their own regions; nothing of the first grade. */
export const GET = handler({ permission: "recheck.perform" }, async (_req, ctx: RouteContext<"/api/rechecks/[id]">, user) => {
  return Response.json(await blindRecheckView(user, parseId((await ctx.params).id, "That recheck")));
});
