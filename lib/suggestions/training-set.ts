/**
 * Which photos a training run learns from and which it is judged on. Pure; the rows come from
 * db/queries/suggestions.ts. Decisions:
 * - Accepted regions are those of photos of units whose grade is recorded (ACCEPTED_UNIT_STATUSES:
 *   the inspector stood behind them) and of published gallery items. When a photo is both, the
 *   gallery item's own copy wins (a trainer curated it).
 * - Photos are split by photo id (splitByPhoto in lib/imaging/learned-eval.ts, stable across
 *   runs): a photo is never on both sides, and the model in use is judged on the same test photos.
 * - Dismissed ghosts become "no defect" examples: a photo that is not already a labelled training
 *   photo is added to training with its dismissed shapes as the only area to draw "no defect"
 *   cells from (its own defect regions are passed too, so a cell an inspector later marked is
 *   never taught as clean). A labelled photo already teaches every clean cell of its Surface.
 *   Dismissal photos never go to the test side: they have no accepted regions to judge against.
 * - Work is bounded: at most MAX_TRAIN_PHOTOS training and MAX_TEST_PHOTOS test photos are
 *   loaded (in photo id order, so a rerun reads the same ones); the trainer decodes at most its
 *   own `maxPhotos` of them.
 * - A training starts on its own (the worker's scheduled check) when trainingDue says so: the first
 *   needs FIRST_TRAINING_REGIONS accepted regions (fewer could not give a class the 30 the
 *   suggestion rule asks for), later ones RETRAIN_AFTER_NEW_REGIONS new ones, so a busy workspace
 *   retrains about daily and a quiet one does not spend CPU on the same data.
 * Shapes are stored in original pixels and training reads the preview, so each is scaled per axis.
 */
import type { Shape } from "@/lib/geometry/shape";
import { splitByPhoto } from "@/lib/imaging/learned-eval";
import { scaleShape } from "@/lib/imaging/learned/working-image";

export const ACCEPTED_UNIT_STATUSES = ["graded", "in_recheck", "final"] as const;
export const MAX_TRAIN_PHOTOS = 400;
export const MAX_TEST_PHOTOS = 60;
export const TEST_SHARE = 0.2;
/** Automatic trainings: the first once a workspace has this many accepted regions… */
export const FIRST_TRAINING_REGIONS = 60;
/** …then again whenever this many more have been accepted since the latest model was trained. */
export const RETRAIN_AFTER_NEW_REGIONS = 50;

/** Whether the scheduled check queues a training (a trainer may always ask for one). */
export function trainingDue(accepted: number, lastTrainedOn: number | null): boolean {
  return lastTrainedOn === null ? accepted >= FIRST_TRAINING_REGIONS : accepted - lastTrainedOn >= RETRAIN_AFTER_NEW_REGIONS;
}

export type PhotoGeometry = { photoId: string; previewKey: string; width: number; height: number; previewWidth: number; previewHeight: number };
export type LabelledPhoto = PhotoGeometry & { source: "unit" | "gallery"; regions: { defect: string; shape: Shape }[]; surfaces: Shape[] };
export type DismissalPhoto = PhotoGeometry & { dismissed: Shape[]; regions: { defect: string; shape: Shape }[] };

/** One photo as training or evaluation reads it: shapes in the preview's pixels. */
export type PlannedPhoto = {
  photoId: string;
  previewKey: string;
  width: number;
  height: number;
  regions: { defect: string; shape: Shape }[];
  surface?: Shape[];
  source: "unit" | "gallery" | "dismissals";
};

export type TrainingPlan = { train: PlannedPhoto[]; test: PlannedPhoto[]; acceptedRegions: number };

function toPreview(photo: PhotoGeometry, shape: Shape): Shape {
  return scaleShape(shape, photo.previewWidth / photo.width, photo.previewHeight / photo.height);
}

function planned(photo: PhotoGeometry, regions: { defect: string; shape: Shape }[], surface: Shape[], source: PlannedPhoto["source"]): PlannedPhoto {
  return {
    photoId: photo.photoId,
    previewKey: photo.previewKey,
    width: photo.previewWidth,
    height: photo.previewHeight,
    regions: regions.map((r) => ({ defect: r.defect, shape: toPreview(photo, r.shape) })),
    surface: surface.length ? surface.map((s) => toPreview(photo, s)) : undefined,
    source,
  };
}

/** Unit photos and gallery photos merged by photo id (the gallery's copy wins). */
export function mergeLabelled(unitPhotos: readonly LabelledPhoto[], galleryPhotos: readonly LabelledPhoto[]): LabelledPhoto[] {
  const byId = new Map<string, LabelledPhoto>();
  for (const p of unitPhotos) byId.set(p.photoId, p);
  for (const p of galleryPhotos) byId.set(p.photoId, p);
  return [...byId.values()].sort((a, b) => (a.photoId < b.photoId ? -1 : a.photoId > b.photoId ? 1 : 0));
}

export function planTraining(labelled: readonly LabelledPhoto[], dismissals: readonly DismissalPhoto[]): TrainingPlan {
  const { train, test } = splitByPhoto(labelled, (p) => p.photoId, { testShare: TEST_SHARE });
  const trainPhotos = train.slice(0, MAX_TRAIN_PHOTOS);
  const labelledIds = new Set(labelled.map((p) => p.photoId));
  const extra = dismissals.filter((d) => !labelledIds.has(d.photoId) && d.dismissed.length > 0);
  return {
    train: [
      ...trainPhotos.map((p) => planned(p, p.regions, p.surfaces, p.source)),
      ...extra.slice(0, Math.max(0, MAX_TRAIN_PHOTOS - trainPhotos.length)).map((d) => planned(d, d.regions, d.dismissed, "dismissals")),
    ],
    test: test.slice(0, MAX_TEST_PHOTOS).map((p) => planned(p, p.regions, p.surfaces, p.source)),
    acceptedRegions: labelled.reduce((n, p) => n + p.regions.length, 0),
  };
}
