import { editItem } from "@/lib/gallery/edits";
import { galleryConflictResponse } from "@/lib/gallery/http";
import { readGalleryItem } from "@/lib/gallery/items";
import { editItemSchema } from "@/lib/gallery/schemas";
import { handler, parseJson } from "@/lib/http/route";
import { REGION_SAVE_MAX_BYTES } from "@/lib/regions/schemas";
import { parseId } from "@/lib/validation";

/** One item (drafts and retired items only for editors; 404 for anyone else). */
export const GET = handler({ permission: "gallery.read" }, async (_req, ctx: RouteContext<"/api/gallery/[id]">, user) => {
  return Response.json({ item: await readGalleryItem(user, parseId((await ctx.params).id, "That gallery item")) });
});

/** Edit caption, grade, kind and/or regions: `{ revision, … }`; 409 with `current` when someone saved since. */
export const PATCH = handler({ permission: "gallery.edit" }, async (req, ctx: RouteContext<"/api/gallery/[id]">, user) => {
  const itemId = parseId((await ctx.params).id, "That gallery item");
  const input = await parseJson(req, editItemSchema, { maxBytes: REGION_SAVE_MAX_BYTES });
  return galleryConflictResponse(async () => Response.json({ item: await editItem(user, itemId, input) }));
});
