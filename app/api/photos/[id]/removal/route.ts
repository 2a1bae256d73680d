import { handler, parseJson } from "@/lib/http/route";
import { removePhoto } from "@/lib/photos/removal";
import { photoRemovalSchema } from "@/lib/photos/schemas";
import { parseId } from "@/lib/validation";

/**
 * Takes a wrong photo out of its unit, with a reason: deleted when nothing refers to it yet,
 * otherwise withdrawn and kept as a record (lib/photos/removal.ts says which and why).
 */
export const POST = handler({ permission: "photos.capture" }, async (req, ctx: RouteContext<"/api/photos/[id]/removal">, user) => {
  const photoId = parseId((await ctx.params).id, "That photo");
  const { reason } = await parseJson(req, photoRemovalSchema);
  return Response.json(await removePhoto(user, photoId, reason));
});
