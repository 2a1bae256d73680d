import { listReference } from "@/lib/gallery/items";
import { referenceQuerySchema } from "@/lib/gallery/schemas";
import { handler, parseQuery } from "@/lib/http/route";

/** The Bench's reference panel: published items of a part type and view (`?partType=&view=&defect=`), normal first, then A → Reject. */
export const GET = handler({ permission: "gallery.read" }, async (req, _ctx, user) => {
  return Response.json({ items: await listReference(user, parseQuery(req, referenceQuerySchema)) });
});
