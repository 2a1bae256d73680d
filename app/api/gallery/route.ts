import { promotePhoto } from "@/lib/gallery/edits";
import { listGalleryJson } from "@/lib/gallery/items";
import { galleryListQuerySchema, promoteSchema } from "@/lib/gallery/schemas";
import { handler, parseJson, parseQuery } from "@/lib/http/route";

/** A page of gallery items, newest first: published for everyone; editors also see drafts (and retired on request). */
export const GET = handler({ permission: "gallery.read" }, async (req, _ctx, user) => {
  // Already JSON (the cards come as text from the database, lib/gallery/items.ts).
  return new Response(await listGalleryJson(user, parseQuery(req, galleryListQuerySchema)), { headers: { "Content-Type": "application/json" } });
});

/** Promote a graded unit's photo: its regions and the unit's grade become a draft (201). */
export const POST = handler({ permission: "gallery.edit" }, async (req, _ctx, user) => {
  const input = await parseJson(req, promoteSchema);
  return Response.json({ item: await promotePhoto(user, input) }, { status: 201 });
});
