import { handler } from "@/lib/http/route";
import { releaseUnit, renewLease } from "@/lib/queue/queue";
import { parseId } from "@/lib/validation";

/** Heartbeat from the Bench: extends the caller's lease. */
export const PUT = handler({ permission: "queue.work" }, async (_req, ctx: RouteContext<"/api/units/[id]/lease">, user) => {
  const unitId = parseId((await ctx.params).id, "That unit");
  return Response.json(await renewLease({ user, unitId }));
});

/** Release: the unit goes back to the queue (own units; leads any). */
export const DELETE = handler({ permission: "queue.work" }, async (_req, ctx: RouteContext<"/api/units/[id]/lease">, user) => {
  const unitId = parseId((await ctx.params).id, "That unit");
  await releaseUnit({ user, unitId });
  return Response.json({ released: true });
});
