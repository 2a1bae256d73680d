import { handler, parseJson } from "@/lib/http/route";
import { recheckSettings, updateRecheckSettings } from "@/lib/recheck/recording";
import { recheckSettingsSchema } from "@/lib/recheck/settings";

/** The workspace's recheck rate, adjudication threshold and drift flag settings (the defaults until a lead sets them). */
export const GET = handler({ permission: "workspace.read" }, async (_req, _ctx, user) => {
  const { settings, isDefault } = await recheckSettings(user);
  return Response.json({ settings, isDefault });
});

/** A lead replaces the recheck settings (every field; shares as fractions 0–1). */
export const PUT = handler({ permission: "workspace.manage" }, async (req, _ctx, user) => {
  const settings = await parseJson(req, recheckSettingsSchema);
  return Response.json({ settings: await updateRecheckSettings(user, settings), isDefault: false });
});
