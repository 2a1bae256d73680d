import { requireUser } from "@/lib/auth/require-user";
import { handler, parseJson } from "@/lib/http/route";
import { workspaceSettingsSchema } from "@/lib/workspace/schemas";
import { updateWorkspaceSettings, workspaceSettings } from "@/lib/workspace/settings";

/** The signed-in user's workspace: its name and the time zone every time is shown in. */
export const GET = handler(async () => {
  const user = await requireUser();
  return Response.json({ workspace: await workspaceSettings(user) });
});

/** A lead changes the workspace's settings (`{ timeZone }`, an IANA zone name). */
export const PATCH = handler(async (req) => {
  const user = await requireUser({ role: "lead" });
  const input = await parseJson(req, workspaceSettingsSchema);
  return Response.json({ workspace: await updateWorkspaceSettings(user, input) });
});
