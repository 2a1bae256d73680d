import { publishItem } from "@/lib/gallery/edits";
import { galleryConflictResponse } from "@/lib/gallery/http";
import { transitionSchema } from "@/lib/gallery/schemas";
import { handler, parseJson } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** Publish a draft (`{ revision }`): 409 with every reason when it is not ready to teach from. */
export const POST = handler({ permission: "gallery.edit" }, async (req, ctx: RouteContext<"/api/gallery/[id]/publish">, user) => {
  const itemId = parseId((await ctx.params).id, "That gallery item");
  const input = await parseJson(req, transitionSchema);
  return galleryConflictResponse(async () => Response.json({ item: await publishItem(user, itemId, input) }));
});
