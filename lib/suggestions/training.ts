import "server-only";
/**
 * One training run for one workspace (the job worker calls it: lib/jobs/suggestion-training.ts):
 * read the workspace's accepted regions and dismissed ghosts (training-set.ts says which), load
 * the previews, train and judge in a compute thread (train-and-judge.ts), and store the model as
 * the next version — switched in only when it is not worse than the one in use on the same
 * held-out photos. Every read names the workspace, so no other workspace's regions are seen.
 */
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { dismissedGhosts, galleryTrainingPhotos, insertModel, modelInUse, regionsOfPhotos, unitTrainingPhotos } from "@/db/queries/suggestions";
import { runInThread } from "@/lib/compute/pool";
import { AppError } from "@/lib/errors";
import type { Shape } from "@/lib/geometry/shape";
import { getObjectBuffer, objectStore } from "@/lib/storage/s3";
import { ACCEPTED_UNIT_STATUSES, mergeLabelled, planTraining, type DismissalPhoto, type LabelledPhoto, type PlannedPhoto } from "./training-set";

export type TrainingOutcome = { trained: true; modelId: string; version: number; inUse: boolean; decision: string } | { trained: false; reason: string };

async function labelledPhotos(workspaceId: string): Promise<{ labelled: LabelledPhoto[]; dismissals: DismissalPhoto[] }> {
  const unitRows = await unitTrainingPhotos(workspaceId, ACCEPTED_UNIT_STATUSES);
  const galleryRows = await galleryTrainingPhotos(workspaceId);
  const dismissedRows = await dismissedGhosts(workspaceId);
  const regionRows = await regionsOfPhotos(workspaceId, [...new Set([...unitRows.map((p) => p.photoId), ...dismissedRows.map((d) => d.photoId)])]);
  const defectsOf = new Map<string, { defect: string; shape: Shape }[]>();
  const surfacesOf = new Map<string, Shape[]>();
  for (const r of regionRows) {
    if (r.role === "defect" && r.defectClass) defectsOf.set(r.photoId, [...(defectsOf.get(r.photoId) ?? []), { defect: r.defectClass, shape: r.shape }]);
    if (r.role === "surface") surfacesOf.set(r.photoId, [...(surfacesOf.get(r.photoId) ?? []), r.shape]);
  }
  const unitPhotos: LabelledPhoto[] = unitRows.map((p) => ({ ...p, source: "unit", regions: defectsOf.get(p.photoId) ?? [], surfaces: surfacesOf.get(p.photoId) ?? [] }));
  const galleryPhotos: LabelledPhoto[] = galleryRows.map(({ regions, ...p }) => ({
    ...p,
    source: "gallery",
    regions: regions.regions.map((r) => ({ defect: r.defect, shape: r.shape })),
    surfaces: regions.surfaces.map((s) => s.shape),
  }));
  const dismissals = new Map<string, DismissalPhoto>();
  for (const { shape, ...p } of dismissedRows) {
    const entry = dismissals.get(p.photoId) ?? { ...p, dismissed: [], regions: defectsOf.get(p.photoId) ?? [] };
    entry.dismissed.push(shape);
    dismissals.set(p.photoId, entry);
  }
  return { labelled: mergeLabelled(unitPhotos, galleryPhotos), dismissals: [...dismissals.values()] };
}

async function withBytes(photos: PlannedPhoto[]) {
  const store = objectStore();
  const loaded = [];
  for (const photo of photos) {
    const image = await getObjectBuffer(store, photo.previewKey);
    // A preview missing from the store (being removed) is left out rather than failing the run.
    if (image) loaded.push({ image, width: photo.width, height: photo.height, regions: photo.regions, surface: photo.surface });
  }
  return loaded;
}

/** Trains, judges and stores one model for the workspace. `requestedBy` is the trainer who asked, or null. */
export async function trainWorkspaceModel(workspaceId: string, requestedBy: string | null): Promise<TrainingOutcome> {
  const { labelled, dismissals } = await labelledPhotos(workspaceId);
  const plan = planTraining(labelled, dismissals);
  if (plan.train.length === 0) return { trained: false, reason: "No accepted regions to learn from yet: grade units or publish gallery items first." };
  const current = await modelInUse(workspaceId);
  const [train, test] = [await withBytes(plan.train), await withBytes(plan.test)];
  let result;
  try {
    result = await runInThread("train-suggestion-model", { train, test, current: current?.model ?? null });
  } catch (err) {
    // Too few regions of any class, and the like: the same data would fail the same way.
    if (err instanceof AppError && err.code === "bad_request") return { trained: false, reason: err.message };
    throw err;
  }
  const sources = {
    unitPhotos: plan.train.filter((p) => p.source === "unit").length,
    galleryPhotos: plan.train.filter((p) => p.source === "gallery").length,
    dismissalPhotos: plan.train.filter((p) => p.source === "dismissals").length,
    testPhotos: test.length,
    acceptedRegions: plan.acceptedRegions,
  };
  const row = await transaction(async (tx) => {
    const stored = await insertModel(
      tx,
      workspaceId,
      {
        model: result.model,
        classCounts: Object.fromEntries(result.model.classes.map((c) => [c.defect, { regions: c.regions, photos: c.photos }])),
        sources,
        evaluation: result.candidate.evaluation,
        suggestable: [...result.candidate.suggestable],
        decision: result.decision,
        trainingMs: result.trainingMs,
        requestedBy,
      },
      result.switchIn,
    );
    await logActivity(tx, {
      workspaceId,
      actorId: requestedBy,
      action: stored.inUse ? "suggestions.model_switched_in" : "suggestions.model_kept_aside",
      subjectType: "suggestion_model",
      subjectId: stored.id,
      detail: { version: stored.version, decision: result.decision },
    });
    return stored;
  });
  return { trained: true, modelId: row.id, version: row.version, inUse: row.inUse, decision: result.decision };
}
