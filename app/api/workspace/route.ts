import { handler, parseJson } from "@/lib/http/route";
import { workspaceSettingsSchema } from "@/lib/workspace/schemas";
import { updateWorkspaceSettings, workspaceSettings } from "@/lib/workspace/settings";

/** The signed-in user's workspace: its name and the time zone every time is shown in. */
export const GET = handler({ permission: "workspace.read" }, async (_req, _ctx, user) => {
  return Response.json({ workspace: await workspaceSettings(user) });
});

/** A lead changes the workspace's settings (`{ timeZone }`, an IANA zone name). */
export const PATCH = handler({ permission: "workspace.manage" }, async (req, _ctx, user) => {
  const input = await parseJson(req, workspaceSettingsSchema);
  return Response.json({ workspace: await updateWorkspaceSettings(user, input) });
});
