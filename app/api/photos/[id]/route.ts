import { notFound } from "@/lib/errors";
import { handler, parseJson } from "@/lib/http/route";
import { toPhotoDto } from "@/lib/photos/dto";
import { dismissFailedPhoto } from "@/lib/photos/manage";
import { getPhotoWithContext } from "@/db/queries/photos";
import { reassignPhotoView } from "@/lib/photos/removal";
import { photoViewSchema } from "@/lib/photos/schemas";
import { parseId } from "@/lib/validation";

export const GET = handler({ permission: "inspection.read" }, async (_req, ctx: RouteContext<"/api/photos/[id]">, user) => {
  const photo = await getPhotoWithContext({ workspaceId: user.workspaceId, photoId: parseId((await ctx.params).id, "That photo") });
  if (!photo) throw notFound("That photo");
  return Response.json({ photo: toPhotoDto(photo) });
});

/** Dismisses a failed upload; a ready photo is evidence and answers 409. */
export const DELETE = handler({ permission: "photos.capture" }, async (_req, ctx: RouteContext<"/api/photos/[id]">, user) => {
  await dismissFailedPhoto(user, parseId((await ctx.params).id, "That photo"));
  return Response.json({ message: "The failed upload was dismissed." });
});

/** Files the photo under another view of its part type (the unit's measurement goes out of date). */
export const PATCH = handler({ permission: "photos.capture" }, async (req, ctx: RouteContext<"/api/photos/[id]">, user) => {
  const photoId = parseId((await ctx.params).id, "That photo");
  const { viewKey } = await parseJson(req, photoViewSchema);
  await reassignPhotoView(user, photoId, viewKey);
  const photo = await getPhotoWithContext({ workspaceId: user.workspaceId, photoId });
  if (!photo) throw notFound("That photo");
  return Response.json({ photo: toPhotoDto(photo) });
});
