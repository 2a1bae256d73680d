import { galleryUploadIntentSchema } from "@/lib/gallery/schemas";
import { createGalleryUploadIntent } from "@/lib/gallery/uploads";
import { handler, parseJson } from "@/lib/http/route";
import { answeringRejections } from "@/lib/photos/http";

/** Step 1 of a gallery upload: a presigned PUT URL and the ticket that finalises it (nothing is stored yet). */
export const POST = handler({ permission: "gallery.edit" }, async (req, _ctx, user) => {
  const input = await parseJson(req, galleryUploadIntentSchema);
  return answeringRejections(async () => Response.json(await createGalleryUploadIntent(user, input), { status: 201 }));
});
