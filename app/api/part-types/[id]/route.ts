import { getPartType } from "@/db/queries/part-types";
import { notFound } from "@/lib/errors";
import { handler, parseJson } from "@/lib/http/route";
import { updatePartType } from "@/lib/part-types/part-types";
import { partTypeUpdateSchema } from "@/lib/part-types/schemas";
import { parseId } from "@/lib/validation";

export const GET = handler({ permission: "part-types.read" }, async (_req, ctx: RouteContext<"/api/part-types/[id]">, user) => {
  const id = parseId((await ctx.params).id, "That part type");
  const partType = await getPartType({ workspaceId: user.workspaceId, partTypeId: id });
  if (!partType) throw notFound("That part type");
  return Response.json({ partType });
});

export const PATCH = handler({ permission: "part-types.edit" }, async (req, ctx: RouteContext<"/api/part-types/[id]">, user) => {
  const id = parseId((await ctx.params).id, "That part type");
  const input = await parseJson(req, partTypeUpdateSchema);
  return Response.json({ partType: await updatePartType(user, id, input) });
});
