import { handler } from "@/lib/http/route";
import { takeNextRecheck } from "@/lib/recheck/queue";

/** Take next for rechecks: 200 with the recheck and its lease, or 204 when nothing is waiting for the caller. */
export const POST = handler({ permission: "recheck.perform" }, async (_req, _ctx, user) => {
  const claimed = await takeNextRecheck(user);
  if (!claimed) return new Response(null, { status: 204 });
  return Response.json({ recheck: { id: claimed.id }, leaseExpiresAt: claimed.leaseExpiresAt });
});
