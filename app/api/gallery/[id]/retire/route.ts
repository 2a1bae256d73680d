import { retireItem } from "@/lib/gallery/edits";
import { galleryConflictResponse } from "@/lib/gallery/http";
import { transitionSchema } from "@/lib/gallery/schemas";
import { handler, parseJson } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** Retire a draft or published item (`{ revision }`): kept, read-only, no longer shown to inspectors. */
export const POST = handler({ permission: "gallery.edit" }, async (req, ctx: RouteContext<"/api/gallery/[id]/retire">, user) => {
  const itemId = parseId((await ctx.params).id, "That gallery item");
  const input = await parseJson(req, transitionSchema);
  return galleryConflictResponse(async () => Response.json({ item: await retireItem(user, itemId, input) }));
});
