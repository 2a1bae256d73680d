import { handler } from "@/lib/http/route";
import { releaseRecheck, renewRecheck } from "@/lib/recheck/queue";
import { parseId } from "@/lib/validation";

/** The recheck screen's heartbeat: extends the caller's lease (409 when they no longer hold it). */
export const PUT = handler({ permission: "recheck.perform" }, async (_req, ctx: RouteContext<"/api/rechecks/[id]/lease">, user) => {
  const { leaseExpiresAt } = await renewRecheck(user, parseId((await ctx.params).id, "That recheck"));
  return Response.json({ leaseExpiresAt });
});

/** Puts the recheck back in the queue; the caller's marks on it go. */
export const DELETE = handler({ permission: "recheck.perform" }, async (_req, ctx: RouteContext<"/api/rechecks/[id]/lease">, user) => {
  await releaseRecheck(user, parseId((await ctx.params).id, "That recheck"));
  return new Response(null, { status: 204 });
});
