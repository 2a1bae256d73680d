import { handler } from "@/lib/http/route";

export const GET = handler({ permission: "workspace.read" }, async (_req, _ctx, user) => {
  return Response.json({ user });
});
