import { requireUser } from "@/lib/auth/require-user";
import { handler, parseQuery } from "@/lib/http/route";
import { listQueue } from "@/lib/queue/list";
import { queueListQuerySchema } from "@/lib/queue/schemas";

export const GET = handler(async (req) => {
  const user = await requireUser({ role: "inspector" });
  const { cursor, before, limit, ...filters } = parseQuery(req, queueListQuerySchema);
  return Response.json(await listQueue({ workspaceId: user.workspaceId, filters, cursor, before, limit }));
});
