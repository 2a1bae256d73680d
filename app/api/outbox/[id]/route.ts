import { getOutgoingEmail } from "@/db/queries/emails";
import { localInboxDir } from "@/lib/env";
import { notFound } from "@/lib/errors";
import { handler } from "@/lib/http/route";
import { readDeliveredMessage } from "@/lib/mail/inbox";
import { parseId } from "@/lib/validation";

export const GET = handler({ permission: "outbox.read" }, async (_req, ctx: RouteContext<"/api/outbox/[id]">, user) => {
  const inbox = localInboxDir();
  if (!inbox) throw notFound("The Outbox (it exists only while mail goes to the local inbox)");
  const id = parseId((await ctx.params).id, "That e-mail");
  const email = await getOutgoingEmail({ workspaceId: user.workspaceId, emailId: id });
  if (!email) throw notFound("That e-mail");
  const delivered = email.messageId ? await readDeliveredMessage(inbox, email.messageId) : null;
  return Response.json({ email, delivered });
});
