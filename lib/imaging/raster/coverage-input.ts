/**
 * Validation of measureCoverage's input (and, from the same pieces, of the region-set comparison
 * in lib/imaging/compare-regions.ts): bad input is refused with one clear AppError
 * ("bad_request") that names every offending field, before any work is done — for coverage
 * also input that is valid but would cost too much (checkMeasuringCost).
 */
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { maxLineWidthFor, maxSpotRadiusFor } from "@/lib/geometry/clamp";
import { MAX_RASTER_ROWS_PER_PHOTO } from "@/lib/geometry/limits";
import { lineShapeSchema, polygonShapeSchema, rectShapeSchema, spotShapeSchema } from "@/lib/geometry/shape-schemas";
import { describeRasterBudget } from "@/lib/geometry/validate";
import type { CoverageInput } from "@/lib/measure/types";
import { rasterRows } from "./cost";

/** Coordinates beyond this are surely a bug (photos are a few thousand pixels wide). */
const COORDINATE_LIMIT = 1_000_000;
/** Cairo surfaces stop at 32767 px a side; sharp's default pixel limit is 16383². */
const MAX_SIDE = 32_767;
const MAX_PIXELS = 268_402_689;
const MAX_REGIONS = 10_000;
const MAX_POINTS = 100_000;

const coordinate = z.number({ error: "must be a finite number" }).min(-COORDINATE_LIMIT, `must be >= ${-COORDINATE_LIMIT}`).max(COORDINATE_LIMIT, `must be <= ${COORDINATE_LIMIT}`);
const size = coordinate.min(0, "must not be negative");
const point = z.tuple([coordinate, coordinate]);

/** The measuring variant of the base shapes (lib/geometry/shape-schemas.ts): bounded numbers, shapes with an area. */
const shapeSchema = z.discriminatedUnion(
  "kind",
  [
    rectShapeSchema.extend({ x: coordinate, y: coordinate, width: size, height: size }),
    polygonShapeSchema.extend({ points: z.array(point).min(3, "a polygon needs at least 3 points").max(MAX_POINTS) }),
    lineShapeSchema.extend({
      points: z.array(point).min(1, "a line needs at least 1 point").max(MAX_POINTS),
      width: size.positive("a line's width must be greater than 0"),
    }),
    spotShapeSchema.extend({ x: coordinate, y: coordinate, radius: size }),
  ],
  { error: 'kind must be one of "rect", "polygon", "line", "spot"' },
);

export const photoSide = z.number({ error: "must be a number" }).int("must be a whole number of pixels").min(1, "must be at least 1 pixel").max(MAX_SIDE, `must be at most ${MAX_SIDE} pixels`);

/** A photo's region list (also one side of a region-set comparison, lib/imaging/compare-regions.ts). */
export const regionListSchema = z
  .array(z.object({ id: z.string().min(1, "must not be empty"), defect: z.string().min(1, "must not be empty"), shape: shapeSchema }))
  .max(MAX_REGIONS, `at most ${MAX_REGIONS} regions per photo`);
export const surfaceSchema = z.array(shapeSchema).max(MAX_REGIONS);

/** Refuses a photo larger than the rasterisers handle (add to an object schema with width/height). */
export function checkPhotoSize(input: { width: number; height: number }, context: z.RefinementCtx): void {
  if (input.width * input.height > MAX_PIXELS) {
    context.addIssue({ code: "custom", path: ["width"], message: `width × height must be at most ${MAX_PIXELS} pixels` });
  }
}

const coverageInputSchema = z
  .object({
    width: photoSide,
    height: photoSide,
    regions: regionListSchema,
    surface: surfaceSchema.optional(),
    zones: z
      .array(z.object({ id: z.string().min(1, "must not be empty"), shape: shapeSchema }))
      .max(MAX_REGIONS)
      .superRefine((zones, context) => {
        // Zone ids are result keys, so they must be unique.
        const seen = new Set<string>();
        zones.forEach((zone, index) => {
          if (seen.has(zone.id)) context.addIssue({ code: "custom", path: [index, "id"], message: `duplicate zone id "${zone.id}"` });
          seen.add(zone.id);
        });
      })
      .optional(),
  })
  .superRefine((input, context) => {
    checkPhotoSize(input, context);
    checkMeasuringCost(input, context);
  });

/**
 * Input that is valid but would cost too much: Line widths and Spot radii beyond their caps for
 * the photo (lib/geometry/limits.ts), more shape rows than the per-photo budget (raster/cost.ts).
 */
export function checkMeasuringCost(input: CoverageInput, context: z.RefinementCtx): void {
  const lineCap = maxLineWidthFor(input);
  const spotCap = maxSpotRadiusFor(input);
  input.regions.forEach(({ shape }, index) => {
    if (shape.kind === "line" && shape.width > lineCap)
      context.addIssue({ code: "custom", path: ["regions", index, "shape", "width"], message: `must be at most ${lineCap} px (5 % of the photo's long edge)` });
    if (shape.kind === "spot" && shape.radius > spotCap)
      context.addIssue({ code: "custom", path: ["regions", index, "shape", "radius"], message: `must be at most ${spotCap} px (10 % of the photo's long edge)` });
  });
  const shapes = [...input.regions.map((r) => r.shape), ...(input.surface ?? []), ...(input.zones ?? []).map((z) => z.shape)];
  const rows = rasterRows(shapes, input);
  if (rows > MAX_RASTER_ROWS_PER_PHOTO) context.addIssue({ code: "custom", path: ["regions"], message: describeRasterBudget(rows) });
}

export function parseCoverageInput(input: unknown): CoverageInput {
  return parseOrRefuse(coverageInputSchema, input, "coverage input");
}

/** Parses with `schema` or throws one AppError ("bad_request") naming every offending field. */
export function parseOrRefuse<T>(schema: z.ZodType<T>, input: unknown, what: string): T {
  const parsed = schema.safeParse(input);
  if (parsed.success) return parsed.data;
  const fieldErrors: Record<string, string> = {};
  for (const issue of parsed.error.issues) {
    const path = issue.path.map(String).join(".") || "(input)";
    fieldErrors[path] ??= issue.message;
  }
  const summary = Object.entries(fieldErrors)
    .map(([path, message]) => `${path}: ${message}`)
    .join("; ");
  throw new AppError("bad_request", `Invalid ${what} — ${summary}`, { fieldErrors });
}
