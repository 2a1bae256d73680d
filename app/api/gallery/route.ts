import { promotePhoto } from "@/lib/gallery/edits";
import { listGallery } from "@/lib/gallery/items";
import { galleryListQuerySchema, promoteSchema } from "@/lib/gallery/schemas";
import { handler, parseJson, parseQuery } from "@/lib/http/route";

/** A page of gallery items, newest first: published for everyone; editors also see drafts (and retired on request). */
export const GET = handler({ permission: "gallery.read" }, async (req, _ctx, user) => {
  return Response.json(await listGallery(user, parseQuery(req, galleryListQuerySchema)));
});

/** Promote a graded unit's photo: its regions and the unit's grade become a draft (201). */
export const POST = handler({ permission: "gallery.edit" }, async (req, _ctx, user) => {
  const input = await parseJson(req, promoteSchema);
  return Response.json({ item: await promotePhoto(user, input) }, { status: 201 });
});
