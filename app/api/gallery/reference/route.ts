import { requireUser } from "@/lib/auth/require-user";
import { listReference } from "@/lib/gallery/items";
import { referenceQuerySchema } from "@/lib/gallery/schemas";
import { handler, parseQuery } from "@/lib/http/route";

/** The Bench's reference panel: published items of a part type and view (`?partType=&view=&defect=`), normal first, then A → Reject. */
export const GET = handler(async (req) => {
  const user = await requireUser();
  return Response.json({ items: await listReference(user, parseQuery(req, referenceQuerySchema)) });
});
