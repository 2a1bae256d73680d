import { requireUser } from "@/lib/auth/require-user";
import { handler } from "@/lib/http/route";
import { queueStats } from "@/lib/queue/list";

export const GET = handler(async () => {
  const user = await requireUser({ role: "inspector" });
  return Response.json(await queueStats({ workspaceId: user.workspaceId }));
});
