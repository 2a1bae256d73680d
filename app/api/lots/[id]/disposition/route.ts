import { handler, parseJson } from "@/lib/http/route";
import { decideLot } from "@/lib/lots/lots";
import { dispositionSchema } from "@/lib/lots/schemas";
import { parseId } from "@/lib/validation";

/** The lead decides the lot: the reached verdict is stored with the disposition and its reason. */
export const POST = handler({ permission: "lots.decide" }, async (req, ctx: RouteContext<"/api/lots/[id]/disposition">, user) => {
  const id = parseId((await ctx.params).id, "That lot");
  const input = await parseJson(req, dispositionSchema);
  return Response.json({ lot: await decideLot(user, id, input) });
});
