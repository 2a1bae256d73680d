import { requireUser } from "@/lib/auth/require-user";
import { INSPECTION_READERS } from "@/lib/auth/roles";
import { notFound } from "@/lib/errors";
import { handler, parseJson } from "@/lib/http/route";
import { toPhotoDto } from "@/lib/photos/dto";
import { dismissFailedPhoto } from "@/lib/photos/manage";
import { getPhotoWithContext } from "@/lib/photos/queries";
import { reassignPhotoView } from "@/lib/photos/removal";
import { photoViewSchema } from "@/lib/photos/schemas";
import { parseId } from "@/lib/validation";

export const GET = handler(async (_req, ctx: RouteContext<"/api/photos/[id]">) => {
  const user = await requireUser({ role: INSPECTION_READERS });
  const photo = await getPhotoWithContext({ workspaceId: user.workspaceId, photoId: parseId((await ctx.params).id, "That photo") });
  if (!photo) throw notFound("That photo");
  return Response.json({ photo: toPhotoDto(photo) });
});

/** Dismisses a failed upload; a ready photo is evidence and answers 409. */
export const DELETE = handler(async (_req, ctx: RouteContext<"/api/photos/[id]">) => {
  const user = await requireUser({ role: "inspector" });
  await dismissFailedPhoto(user, parseId((await ctx.params).id, "That photo"));
  return Response.json({ message: "The failed upload was dismissed." });
});

/** Files the photo under another view of its part type (the unit's measurement goes out of date). */
export const PATCH = handler(async (req, ctx: RouteContext<"/api/photos/[id]">) => {
  const user = await requireUser({ role: "inspector" });
  const photoId = parseId((await ctx.params).id, "That photo");
  const { viewKey } = await parseJson(req, photoViewSchema);
  await reassignPhotoView(user, photoId, viewKey);
  const photo = await getPhotoWithContext({ workspaceId: user.workspaceId, photoId });
  if (!photo) throw notFound("That photo");
  return Response.json({ photo: toPhotoDto(photo) });
});
