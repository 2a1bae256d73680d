import { listPeople } from "@/db/queries/users";
import { inviteSchema } from "@/lib/auth/schemas";
import { handler, parseJson } from "@/lib/http/route";
import { invitationMessage, invitePerson } from "@/lib/people/people";

export const GET = handler({ permission: "people.manage" }, async (_req, _ctx, user) => {
  return Response.json({ people: await listPeople({ workspaceId: user.workspaceId }) });
});

/** Invites a person by e-mail; the account waits for them to set a password through the link. */
export const POST = handler({ permission: "people.manage" }, async (req, _ctx, user) => {
  const input = await parseJson(req, inviteSchema.strict());
  const { person, ...sent } = await invitePerson(user, input);
  return Response.json({ person, ...sent, message: invitationMessage(person, sent) }, { status: 201 });
});
