import { handler, parseJson } from "@/lib/http/route";
import { reassignUnit } from "@/lib/queue/queue";
import { reassignSchema } from "@/lib/queue/schemas";
import { parseId } from "@/lib/validation";

export const POST = handler({ permission: "leases.manage" }, async (req, ctx: RouteContext<"/api/units/[id]/lease/reassign">, user) => {
  const unitId = parseId((await ctx.params).id, "That unit");
  const { userId } = await parseJson(req, reassignSchema);
  await reassignUnit({ user, unitId, toUserId: userId });
  return Response.json({ reassigned: true });
});
