import { handler } from "@/lib/http/route";
import { toPhotoDto } from "@/lib/photos/dto";
import { retryPhotoProcessing } from "@/lib/photos/manage";
import { parseId } from "@/lib/validation";

/** Queues a photo whose processing failed again (202); anything else answers 409. */
export const POST = handler({ permission: "photos.capture" }, async (_req, ctx: RouteContext<"/api/photos/[id]/retry">, user) => {
  const photo = await retryPhotoProcessing(user, parseId((await ctx.params).id, "That photo"));
  return Response.json({ photo: toPhotoDto(photo) }, { status: 202 });
});
