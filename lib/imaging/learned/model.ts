/**
 * The stored region model: plain JSON (no class instances, no buffers), so it goes into a jsonb
 * column as it is and comes back through `parseRegionModel`, which refuses a model of another
 * format version or feature list instead of scoring with mismatched numbers.
 */
import { z } from "zod";
import { FEATURE_NAMES } from "./features";
import type { FlatForest } from "./forest";
import type { ShapeKindForClass } from "./proposals";

export const REGION_MODEL_FORMAT = "partproof.region-model";
/** Bump when features, cells or the forest layout change meaning: older models are then refused. */
export const REGION_MODEL_VERSION = 1;

export const trainingSettingsSchema = z.strictObject({
  /** Long side of the working copy, px. */
  workingSide: z.number().int().min(256).max(4096).default(1024),
  /** Cell (classification unit) side in working px. */
  cellSize: z.number().int().min(4).max(32).default(8),
  seed: z
    .number()
    .int()
    .min(0)
    .max(2 ** 31 - 1)
    .default(20261201),
  /** Who grows the trees: our histogram trainer, or ml-random-forest (slower; kept as the reference). */
  trainer: z.enum(["histogram", "ml-random-forest"]).default("histogram"),
  trees: z.number().int().min(1).max(200).default(30),
  maxDepth: z.number().int().min(2).max(30).default(10),
  /** ml-random-forest only: share of the features each tree sees (it draws them once per tree). */
  featureShare: z.number().gt(0).max(1).default(0.6),
  minLeafSamples: z.number().int().min(1).max(100).default(3),
  /** Training cells per defect class, and "no defect" cells, over all photos (bounds training time). */
  maxCellsPerClass: z.number().int().min(10).max(20000).default(1500),
  maxNegativeCells: z.number().int().min(10).max(50000).default(4000),
  /** Photos decoded per training (the rest are left out, rare classes first in): bounds training time. */
  maxPhotos: z.number().int().min(1).max(100000).default(120),
  /** A class needs this many accepted regions to be learned at all. */
  minRegionsPerClass: z.number().int().min(1).default(3),
  /** Share of the photos (with regions) kept aside to set each class's threshold, and its cap. */
  calibrationShare: z.number().min(0).max(0.5).default(0.25),
  maxCalibrationPhotos: z.number().int().min(0).max(200).default(20),
  /** Retrain on every photo after calibrating (better model, twice the forest time). */
  refit: z.boolean().default(true),
});
export type TrainingSettings = z.output<typeof trainingSettingsSchema>;
export type TrainingOptions = z.input<typeof trainingSettingsSchema>;

export type ModelClass = {
  defect: string;
  /** How suggestions of this class are drawn (what inspectors drew for it in training). */
  kind: ShapeKindForClass;
  /** Vote share at which a cell starts a suggestion (set on the calibration photos). */
  threshold: number;
  /** Working px. */
  lineWidth: number;
  spotRadius: number;
  minCells: number;
  /** What the model saw: accepted regions on the photos it used, those photos, training cells drawn from them. */
  regions: number;
  photos: number;
  cells: number;
  /** Figures on the calibration photos at the chosen threshold (null: none had this class). */
  calibration: { regions: number; recall: number; precision: number } | null;
};

export type RegionModel = {
  format: typeof REGION_MODEL_FORMAT;
  version: typeof REGION_MODEL_VERSION;
  settings: TrainingSettings;
  features: string[];
  classes: ModelClass[];
  /** Photos handed in, photos trained on (at most `maxPhotos`), calibration photos among them, "no defect" cells drawn. */
  photosOffered: number;
  photos: number;
  calibrationPhotos: number;
  negativeCells: number;
  forest: FlatForest;
};

const modelHeader = z.object({
  format: z.literal(REGION_MODEL_FORMAT, { error: "is not a Partproof region model" }),
  version: z.literal(REGION_MODEL_VERSION, { error: `must be version ${REGION_MODEL_VERSION}; retrain the model` }),
  settings: trainingSettingsSchema,
  features: z
    .array(z.string())
    .refine((names) => names.length === FEATURE_NAMES.length && names.every((name, k) => name === FEATURE_NAMES[k]), "were computed by another version of the features; retrain the model"),
  classes: z.array(
    z
      .object({
        defect: z.string(),
        kind: z.enum(["line", "outline", "spot"]),
        threshold: z.number().gt(0).max(1),
        lineWidth: z.number().positive(),
        spotRadius: z.number().positive(),
        minCells: z.number().int().min(1),
      })
      .passthrough(),
  ),
  forest: z.object({
    classes: z.number().int().min(1),
    trees: z
      .array(
        z.object({
          feature: z.array(z.number().int()),
          threshold: z.array(z.number()),
          left: z.array(z.number().int()),
          right: z.array(z.number().int()),
          leaf: z.array(z.number().int()),
          leaves: z.array(z.array(z.number())),
        }),
      )
      .min(1),
  }),
});

/** The model checked well enough to score with (throws a readable message otherwise). */
export function parseRegionModel(value: unknown): RegionModel {
  const parsed = modelHeader.safeParse(value);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new Error(`Not a usable region model: ${issue.path.join(".") || "model"} ${issue.message}.`);
  }
  if (parsed.data.forest.classes !== parsed.data.classes.length + 1) throw new Error("Not a usable region model: its forest and its class list disagree.");
  return value as RegionModel;
}
