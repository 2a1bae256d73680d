import { handler } from "@/lib/http/route";
import { queueStats } from "@/lib/queue/list";

export const GET = handler({ permission: "queue.work" }, async (_req, _ctx, user) => {
  return Response.json(await queueStats({ workspaceId: user.workspaceId }));
});
