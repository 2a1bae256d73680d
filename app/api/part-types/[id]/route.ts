import { getPartType } from "@/db/queries/part-types";
import { requireUser } from "@/lib/auth/require-user";
import { notFound } from "@/lib/errors";
import { handler, parseJson } from "@/lib/http/route";
import { updatePartType } from "@/lib/part-types/part-types";
import { partTypeUpdateSchema } from "@/lib/part-types/schemas";
import { parseId } from "@/lib/validation";

export const GET = handler(async (_req, ctx: RouteContext<"/api/part-types/[id]">) => {
  const user = await requireUser();
  const id = parseId((await ctx.params).id, "That part type");
  const partType = await getPartType({ workspaceId: user.workspaceId, partTypeId: id });
  if (!partType) throw notFound("That part type");
  return Response.json({ partType });
});

export const PATCH = handler(async (req, ctx: RouteContext<"/api/part-types/[id]">) => {
  const user = await requireUser({ role: "lead" });
  const id = parseId((await ctx.params).id, "That part type");
  const input = await parseJson(req, partTypeUpdateSchema);
  return Response.json({ partType: await updatePartType(user, id, input) });
});
