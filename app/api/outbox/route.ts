import { listOutgoingEmails } from "@/db/queries/emails";
import { localInboxDir } from "@/lib/env";
import { notFound } from "@/lib/errors";
import { handler } from "@/lib/http/route";

/** Lead only, and only while mail goes to the local inbox (development and demo). */
export const GET = handler({ permission: "outbox.read" }, async (_req, _ctx, user) => {
  if (!localInboxDir()) throw notFound("The Outbox (it exists only while mail goes to the local inbox)");
  return Response.json({ emails: await listOutgoingEmails({ workspaceId: user.workspaceId }) });
});
