import { requireUser } from "@/lib/auth/require-user";
import { handler, parseJson } from "@/lib/http/route";
import { suggestionSchema } from "@/lib/regions/schemas";
import { suggestForPhoto } from "@/lib/regions/suggestions";
import { parseId } from "@/lib/validation";

/** Suggested shapes for the Bench (`{ kind: "surface" | "pixel-candidates" }`), in original pixels; stores nothing. */
export const POST = handler(async (req, ctx: RouteContext<"/api/photos/[id]/suggestions">) => {
  const user = await requireUser({ role: "inspector" });
  const photoId = parseId((await ctx.params).id, "That photo");
  const { kind } = await parseJson(req, suggestionSchema);
  return Response.json(await suggestForPhoto(user, photoId, kind));
});
