import { listPeople } from "@/db/queries/users";
import { requireUser } from "@/lib/auth/require-user";
import { inviteSchema } from "@/lib/auth/schemas";
import { handler, parseJson } from "@/lib/http/route";
import { invitationMessage, invitePerson } from "@/lib/people/people";

export const GET = handler(async () => {
  const user = await requireUser({ role: "lead" });
  return Response.json({ people: await listPeople({ workspaceId: user.workspaceId }) });
});

/** Invites a person by e-mail; the account waits for them to set a password through the link. */
export const POST = handler(async (req) => {
  const user = await requireUser({ role: "lead" });
  const input = await parseJson(req, inviteSchema.strict());
  const { person, ...sent } = await invitePerson(user, input);
  return Response.json({ person, ...sent, message: invitationMessage(person, sent) }, { status: 201 });
});
