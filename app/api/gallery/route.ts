import { requireUser } from "@/lib/auth/require-user";
import { GALLERY_EDITORS } from "@/lib/gallery/access";
import { promotePhoto } from "@/lib/gallery/edits";
import { listGallery } from "@/lib/gallery/items";
import { galleryListQuerySchema, promoteSchema } from "@/lib/gallery/schemas";
import { handler, parseJson, parseQuery } from "@/lib/http/route";

/** A page of gallery items, newest first: published for everyone; editors also see drafts (and retired on request). */
export const GET = handler(async (req) => {
  const user = await requireUser();
  return Response.json(await listGallery(user, parseQuery(req, galleryListQuerySchema)));
});

/** Promote a graded unit's photo: its regions and the unit's grade become a draft (201). */
export const POST = handler(async (req) => {
  const user = await requireUser({ role: GALLERY_EDITORS });
  const input = await parseJson(req, promoteSchema);
  return Response.json({ item: await promotePhoto(user, input) }, { status: 201 });
});
