import { handler, parseJson } from "@/lib/http/route";
import { claimNextUnit } from "@/lib/queue/queue";
import { queueFiltersSchema } from "@/lib/queue/schemas";

/** Take next: 200 with the claimed unit and its lease, or 204 when nothing is waiting. */
export const POST = handler({ permission: "queue.work" }, async (req, _ctx, user) => {
  // The body (filters) is optional: no body means "the next unit of any kind".
  const filters = await parseJson(req, queueFiltersSchema, { allowEmpty: true });
  const unit = await claimNextUnit({ user, filters });
  if (!unit) return new Response(null, { status: 204 });
  return Response.json({ unit, leaseExpiresAt: unit.leaseExpiresAt });
});
