import "server-only";
/**
 * Learned suggestions on the Bench: the workspace's model in use run on a photo's preview (in a
 * compute thread), limited to the classes its held-out figures allow (SUGGESTION_RULE) that the
 * part type has, inside the photo's Surface (or, with none marked yet, the one "Suggest Surface" would
 * find), mapped back to original pixels. Nothing is stored
 * here: an accepted ghost becomes a region through the normal region save (its author is the
 * inspector), and each accept or dismiss is recorded by recordDecisions.
 * Only for photos the caller may mark now (the Bench's rule, assertUnitAnnotatable): never on a
 * decided lot or a graded unit, never on another inspector's leased unit, never on a photo
 * without a unit (gallery uploads, which calibration sets are made of), and never for auditors
 * (they lack regions.edit, so a blind recheck cannot see them).
 */
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { insertDecisions, modelInUse, modelOfWorkspace } from "@/db/queries/suggestions";
import { lockUnit } from "@/db/queries/units";
import type { SessionUser } from "@/lib/auth/require-user";
import { runInThread } from "@/lib/compute/pool";
import { AppError, notFound } from "@/lib/errors";
import { clampShapeToImage } from "@/lib/geometry/clamp";
import { describeShapeProblem } from "@/lib/geometry/degenerate";
import { scaleShape } from "@/lib/imaging/learned/working-image";
import { assertUnitAnnotatable, loadPhotoForRegions, readRegionSet } from "@/lib/regions/regions";
import { getObjectBuffer, objectStore } from "@/lib/storage/s3";
import type { LearnedGhost, LearnedSuggestionResponse } from "./dto";
import type { DecisionsInput } from "./schemas";

export const MAX_LEARNED_GHOSTS = 30;

async function annotatablePhoto(actor: SessionUser, photoId: string) {
  const context = await loadPhotoForRegions(actor, photoId);
  if (context.photo.removedAt) throw new AppError("conflict", "This photo was taken out of the unit; nothing is suggested on it.");
  if (context.photo.status !== "ready" || !context.photo.width || !context.photo.height || !context.photo.previewKey) {
    throw new AppError("conflict", "This photo is still being processed; suggestions need the finished photo.");
  }
  // Read under the unit's lock for the lease's running state by the database's clock; released at once.
  await transaction(async (tx) => {
    const unit = await lockUnit(tx, { workspaceId: actor.workspaceId, unitId: context.unit.id });
    if (!unit) throw notFound("That photo");
    assertUnitAnnotatable(context.lotStatus, unit, actor);
  });
  return { ...context, size: { width: context.photo.width, height: context.photo.height }, previewKey: context.photo.previewKey };
}

export async function learnedSuggestionsForPhoto(actor: SessionUser, photoId: string): Promise<LearnedSuggestionResponse> {
  const context = await annotatablePhoto(actor, photoId);
  const model = await modelInUse(actor.workspaceId);
  if (!model) return { modelId: null, modelVersion: null, ghosts: [], note: "No learned model is in use yet: it is trained from graded units' regions and published gallery items." };
  const labels = new Map(context.partType.defectClasses.map((d) => [d.key, d.label]));
  const allowed = model.suggestable.filter((c) => c.suggest && labels.has(c.defect)).map((c) => c.defect);
  const base = { modelId: model.id, modelVersion: model.version };
  if (allowed.length === 0) return { ...base, ghosts: [], note: `Model ${model.version} may not suggest any class of this part type yet (too few examples or held-out figures below the rule).` };

  const preview = await getObjectBuffer(objectStore(), context.previewKey);
  if (!preview) throw new AppError("conflict", "This photo's preview is missing from the photo store, so nothing can be suggested.");
  const previewSize = { width: context.photo.previewWidth ?? context.size.width, height: context.photo.previewHeight ?? context.size.height };
  const [toPreviewX, toPreviewY] = [previewSize.width / context.size.width, previewSize.height / context.size.height];
  const { regions } = await readRegionSet(actor, photoId);
  let surface = regions.surfaces.map((s) => scaleShape(s.shape, toPreviewX, toPreviewY));
  let where = "inside the Surface";
  if (surface.length === 0) {
    // The model learned inside Surfaces, and off the part it mistakes backdrop shading for marks:
    // with none marked yet, it looks inside the Surface Partproof finds (as "Suggest Surface" does).
    const found = await runInThread("suggest-surface", { image: preview, options: { limitInputPixels: previewSize.width * previewSize.height } });
    surface = found.shape ? [found.shape] : [];
    where = found.shape ? "inside the part's outline as Partproof found it (mark the Surface to set it yourself)" : "over the whole photo (mark the Surface to narrow it)";
  }
  const found = await runInThread("suggest-learned", {
    model: model.model,
    image: preview,
    options: { surface: surface.length ? surface : undefined, defects: allowed, maxSuggestions: MAX_LEARNED_GHOSTS },
  });
  const ghosts: LearnedGhost[] = [];
  for (const [k, s] of found.entries()) {
    const shape = clampShapeToImage(scaleShape(s.shape, 1 / toPreviewX, 1 / toPreviewY), context.size);
    if (describeShapeProblem(shape)) continue;
    ghosts.push({ id: `learned-${model.version}-${k}`, role: "defect", defect: s.defect, shape, score: s.score, label: `${labels.get(s.defect)} ${Math.round(s.score * 100)} %` });
  }
  return { ...base, ghosts, note: `${ghosts.length} learned suggestion${ghosts.length === 1 ? "" : "s"} ${where}, from model ${model.version}.` };
}

/** Records what the inspector did with learned ghosts on this photo (accepted ones were saved as regions by the Bench). */
export async function recordDecisions(actor: SessionUser, photoId: string, input: DecisionsInput): Promise<{ recorded: number }> {
  const context = await annotatablePhoto(actor, photoId);
  const classes = new Set(context.partType.defectClasses.map((d) => d.key));
  const unknown = input.decisions.find((d) => !classes.has(d.defect));
  if (unknown) throw new AppError("bad_request", `"${unknown.defect}" is not a defect class of this part type; nothing was recorded.`);
  for (const [i, d] of input.decisions.entries()) {
    const clamped = clampShapeToImage(d.shape, context.size);
    if (JSON.stringify(clamped) !== JSON.stringify(d.shape)) throw new AppError("bad_request", `Decision ${i + 1}'s shape lies outside the photo; nothing was recorded.`);
  }
  return transaction(async (tx) => {
    const model = await modelOfWorkspace(actor.workspaceId, input.modelId, tx);
    if (!model) throw notFound("That suggestion model");
    const rows = await insertDecisions(
      tx,
      input.decisions.map((d) => ({ workspaceId: actor.workspaceId, photoId, modelId: model.id, defectClass: d.defect, shape: d.shape, score: d.score, decision: d.decision, decidedBy: actor.id })),
    );
    const accepted = rows.filter((r) => r.decision === "accepted").length;
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "suggestions.decided",
      subjectType: "photo",
      subjectId: photoId,
      detail: { modelVersion: model.version, accepted, dismissed: rows.length - accepted },
    });
    return { recorded: rows.length };
  });
}
