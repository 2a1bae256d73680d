import { handler, parseJson, parseQuery } from "@/lib/http/route";
import { toPhotoDto } from "@/lib/photos/dto";
import { finaliseUpload } from "@/lib/photos/finalise";
import { answeringRejections } from "@/lib/photos/http";
import { loadUnit } from "@/lib/photos/intents";
import { listUnitPhotos } from "@/db/queries/photos";
import { finaliseQuerySchema, finaliseSchema } from "@/lib/photos/schemas";
import { parseId } from "@/lib/validation";

/** The unit's photos with their status and uploader, and apart from them those taken out of it (inspection work: not for auditors). */
export const GET = handler({ permission: "inspection.read" }, async (_req, ctx: RouteContext<"/api/units/[id]/photos">, user) => {
  const unit = await loadUnit(user, parseId((await ctx.params).id, "That unit"));
  const key = { workspaceId: user.workspaceId, unitId: unit.id };
  const [photos, removed] = await Promise.all([listUnitPhotos(key), listUnitPhotos({ ...key, removed: true })]);
  return Response.json({ unit: { id: unit.id, status: unit.status, views: unit.partType.views }, photos: photos.map(toPhotoDto), removed: removed.map(toPhotoDto) });
});

/**
 * Finalise an upload the browser has PUT to the store. 201 ready, 202 still processing, 200 the
 * same photo (a repeated request, or the same bytes already on this unit), 4xx for refused files
 * (nothing is kept), 503 when the store is unreachable (retry later with the same ticket).
 */
export const POST = handler({ permission: "photos.capture" }, async (req, ctx: RouteContext<"/api/units/[id]/photos">, user) => {
  const unitId = parseId((await ctx.params).id, "That unit");
  await loadUnit(user, unitId);
  const query = parseQuery(req, finaliseQuerySchema);
  const input = await parseJson(req, finaliseSchema);
  return answeringRejections(async () => {
    const outcome = await finaliseUpload(user, unitId, input, query.wait === "0" ? { waitMs: 0 } : {});
    const photo = toPhotoDto(outcome.photo);
    const status = outcome.kind !== "accepted" ? 200 : photo.status === "ready" ? 201 : 202;
    return Response.json({ photo, outcome: outcome.kind }, { status });
  });
});
