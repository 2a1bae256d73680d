import { getPerson } from "@/db/queries/users";
import { updatePersonSchema } from "@/lib/auth/schemas";
import { notFound } from "@/lib/errors";
import { handler, parseJson } from "@/lib/http/route";
import { updatePerson } from "@/lib/people/people";
import { parseId } from "@/lib/validation";

export const GET = handler({ permission: "people.manage" }, async (_req, ctx: RouteContext<"/api/people/[id]">, user) => {
  const id = parseId((await ctx.params).id, "That person");
  const person = await getPerson({ workspaceId: user.workspaceId, userId: id });
  if (!person) throw notFound("That person");
  return Response.json({ person });
});

export const PATCH = handler({ permission: "people.manage" }, async (req, ctx: RouteContext<"/api/people/[id]">, user) => {
  const id = parseId((await ctx.params).id, "That person");
  const input = await parseJson(req, updatePersonSchema);
  return Response.json({ person: await updatePerson(user, id, input) });
});
