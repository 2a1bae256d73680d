/**
 * Learned suggestions: a workspace's own accepted regions teach a model that proposes defect
 * regions and classes on new photos. Contract: docs/contracts.md, "lib/imaging/learned.ts". Pure
 * functions over buffers: no database, no globals, plain data in and out, so training can run in
 * a worker thread or the job worker and the model goes into a jsonb column as it is.
 *
 * Method (modules under learned/):
 * - working-image.ts: the upright photo at `workingSide` px long side (1 024 by default);
 * - cell-grid.ts + features.ts: 8 px cells; each cell described by 47 colour, gradient,
 *   direction, texture (LBP) and centre-versus-surround statistics of the cell, its 3 × 3-cell
 *   patch and 9 × 9-cell context;
 * - sampling.ts: example cells inside accepted regions per class and "no defect" cells from the
 *   rest of the Surface, capped so training time stays bounded;
 * - forest.ts: a seeded random forest (ml-random-forest), stored as flat arrays;
 * - calibrate.ts: per-class thresholds chosen on calibration photos;
 * - proposals.ts: every cell of the Surface scored (a sliding window with an 8 px step), cells
 *   over threshold merged into regions, drawn as Line, Outline or Spot like the training regions,
 *   mapped back to the caller's pixels.
 * The held-out evaluation and the rules that use it are in learned-eval.ts.
 */
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { clampShapeToImage } from "@/lib/geometry/clamp";
import { describeShapeProblem } from "@/lib/geometry/degenerate";
import type { Shape } from "@/lib/geometry/shape";
import { shapeStructureSchema } from "@/lib/geometry/validate";
import { scoreRows } from "./learned/forest";
import { parseRegionModel, trainingSettingsSchema, type RegionModel, type TrainingOptions } from "./learned/model";
import { preparePhoto, scoreActiveCells } from "./learned/photo-cells";
import { proposeRegions } from "./learned/proposals";
import { trainModel, type TrainingExample } from "./learned/train";
import { scaleShape } from "./learned/working-image";

export type { RegionModel, ModelClass, TrainingOptions } from "./learned/model";
export { REGION_MODEL_FORMAT, REGION_MODEL_VERSION, parseRegionModel } from "./learned/model";
export type { TrainingExample } from "./learned/train";

export type RegionSuggestion = { defect: string; shape: Shape; score: number };

const shape = shapeStructureSchema.superRefine((value, ctx) => {
  const problem = describeShapeProblem(value);
  if (problem) ctx.addIssue({ code: "custom", message: problem });
});
const examplesSchema = z
  .array(
    z.object({
      image: z.instanceof(Buffer, { error: "must be the photo's bytes" }).refine((b) => b.length > 0, "is empty"),
      regions: z.array(z.object({ defect: z.string().min(1).max(64), shape })),
      surface: z.array(shape).optional(),
    }),
  )
  .min(1, "needs at least one photo");

const suggestOptionsSchema = z.strictObject({
  /** The part's Surface in the image's pixels: only cells at least half inside are looked at. */
  surface: z.array(shape).optional(),
  /** Only these classes (e.g. those the held-out rule allows and the part type has). */
  defects: z.array(z.string()).optional(),
  maxSuggestions: z.number().int().min(1).max(500).default(50),
});
export type SuggestOptions = z.input<typeof suggestOptionsSchema>;

function firstIssue(error: z.ZodError): string {
  const issue = error.issues[0];
  return `${issue.path.length ? issue.path.join(".") + " " : ""}${issue.message}`;
}

/** Trains a region model on accepted regions (in each image's upright pixel coordinates). */
export async function trainRegionModel(examples: TrainingExample[], options: TrainingOptions = {}): Promise<RegionModel> {
  const parsedExamples = examplesSchema.safeParse(examples);
  if (!parsedExamples.success) throw new AppError("bad_request", `The training examples are not usable: ${firstIssue(parsedExamples.error)}.`);
  const settings = trainingSettingsSchema.safeParse(options);
  if (!settings.success) throw new AppError("bad_request", `Invalid training options: ${firstIssue(settings.error)}.`);
  try {
    return await trainModel(parsedExamples.data, settings.data);
  } catch (error) {
    if (error instanceof RangeError) throw new AppError("bad_request", error.message);
    throw error;
  }
}

const round = (value: number) => Math.round(value * 100) / 100;

function rounded(shape: Shape): Shape {
  switch (shape.kind) {
    case "rect":
      return { kind: "rect", x: round(shape.x), y: round(shape.y), width: round(shape.width), height: round(shape.height) };
    case "polygon":
      return { kind: "polygon", points: shape.points.map(([x, y]) => [round(x), round(y)]) };
    case "line":
      return { kind: "line", points: shape.points.map(([x, y]) => [round(x), round(y)]), width: round(shape.width) };
    case "spot":
      return { kind: "spot", x: round(shape.x), y: round(shape.y), radius: round(shape.radius) };
  }
}

/** Suggested regions on `image`, in its upright pixel coordinates, best score first. */
export async function suggestRegions(model: RegionModel, image: Buffer, options: SuggestOptions = {}): Promise<RegionSuggestion[]> {
  let checked: RegionModel;
  try {
    checked = parseRegionModel(model);
  } catch (error) {
    throw new AppError("conflict", error instanceof Error ? error.message : String(error));
  }
  const parsed = suggestOptionsSchema.safeParse(options);
  if (!parsed.success) throw new AppError("bad_request", `Invalid suggestion options: ${firstIssue(parsed.error)}.`);
  if (!Buffer.isBuffer(image) || image.length === 0) throw new AppError("bad_request", "No photo bytes were given.");
  const { surface, defects, maxSuggestions } = parsed.data;
  const { workingSide, cellSize } = checked.settings;

  const photo = await preparePhoto(image, surface, workingSide, cellSize);
  const scores = scoreActiveCells(photo, (rows) => scoreRows(checked.forest, rows));
  const wanted = defects ? new Set(defects) : null;
  const specs = checked.classes.map((c) => (wanted && !wanted.has(c.defect) ? { ...c, threshold: Infinity } : c));
  const [sx, sy] = photo.scale;
  const size = photo.image.original;
  const suggestions: RegionSuggestion[] = [];
  for (const proposal of proposeRegions(photo.grid, scores, photo.active, specs)) {
    const shape = rounded(clampShapeToImage(scaleShape(proposal.shape, 1 / sx, 1 / sy), size));
    if (describeShapeProblem(shape)) continue;
    suggestions.push({ defect: checked.classes[proposal.classIndex].defect, shape, score: Math.round(proposal.score * 1000) / 1000 });
    if (suggestions.length >= maxSuggestions) break;
  }
  return suggestions;
}
