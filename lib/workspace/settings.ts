import "server-only";
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { getWorkspace, setWorkspaceTimeZone } from "@/db/queries/workspaces";
import type { SessionUser } from "@/lib/auth/require-user";
import { notFound } from "@/lib/errors";
import type { WorkspaceSettingsInput } from "./schemas";

export async function workspaceSettings(actor: Pick<SessionUser, "workspaceId">) {
  const row = await getWorkspace({ workspaceId: actor.workspaceId });
  if (!row) throw notFound("That workspace");
  return { name: row.name, timeZone: row.timeZone };
}

/** The lead sets the time zone every time in the workspace is shown in; logged with the old value. */
export async function updateWorkspaceSettings(actor: SessionUser, input: WorkspaceSettingsInput) {
  return transaction(async (tx) => {
    const before = await getWorkspace({ workspaceId: actor.workspaceId }, tx);
    if (!before) throw notFound("That workspace");
    const row = await setWorkspaceTimeZone(tx, { workspaceId: actor.workspaceId, timeZone: input.timeZone });
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "workspace.settings_changed",
      subjectType: "workspace",
      subjectId: actor.workspaceId,
      detail: { timeZone: { from: before.timeZone, to: input.timeZone } },
    });
    return { name: row.name, timeZone: row.timeZone };
  });
}
