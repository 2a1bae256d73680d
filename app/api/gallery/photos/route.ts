import { finaliseGalleryUpload } from "@/lib/gallery/uploads";
import { handler, parseJson, parseQuery } from "@/lib/http/route";
import { answeringRejections } from "@/lib/photos/http";
import { finaliseQuerySchema, finaliseSchema } from "@/lib/photos/schemas";

/**
 * Finalise a gallery upload the browser has PUT: 201 with the new draft item, 200 with the same
 * item for a repeated request, 202 while the photo is still processing (send the same ticket
 * again), 4xx for a refused file (nothing is kept).
 */
export const POST = handler({ permission: "gallery.edit" }, async (req, _ctx, user) => {
  const query = parseQuery(req, finaliseQuerySchema);
  const input = await parseJson(req, finaliseSchema);
  return answeringRejections(async () => {
    const outcome = await finaliseGalleryUpload(user, input, query.wait === "0" ? { waitMs: 0 } : {});
    if (outcome.kind === "processing") return Response.json({ photoId: outcome.photoId, status: "processing" }, { status: 202 });
    return Response.json({ item: outcome.item }, { status: outcome.created ? 201 : 200 });
  });
});
