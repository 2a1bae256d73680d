import { handler, parseQuery } from "@/lib/http/route";
import { listQueue } from "@/lib/queue/list";
import { queueListQuerySchema } from "@/lib/queue/schemas";

export const GET = handler({ permission: "queue.work" }, async (req, _ctx, user) => {
  const { cursor, before, limit, ...filters } = parseQuery(req, queueListQuerySchema);
  return Response.json(await listQueue({ workspaceId: user.workspaceId, filters, cursor, before, limit }));
});
