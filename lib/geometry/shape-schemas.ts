/**
 * The base zod schemas of the region shapes (shape.ts takes its types from them): the kind and
 * finite numbers, nothing more. Each use builds a stricter variant from these pieces instead of a
 * union of its own:
 * - a saved region set (lib/geometry/validate.ts): unknown fields refused, point budgets, the
 *   geometry rules of degenerate.ts, messages that name the region;
 * - measuring input (lib/imaging/raster/coverage-input.ts): coordinate and size limits, a polygon
 *   of 3 points or more, a Line wider than 0;
 * - pixel faults (lib/measure/pixel-faults.ts): reads Spots, other kinds only by their tag.
 * Zod 4 numbers refuse NaN and ±Infinity, so `z.number()` is already "finite".
 */
import { z } from "zod";

export const SHAPE_KINDS = ["rect", "polygon", "line", "spot"] as const;

export const coordinateSchema = z.number({ error: "must be a finite number" });
export const pointSchema = z.tuple([coordinateSchema, coordinateSchema], { error: "must be a pair [x, y]" });

export const rectShapeSchema = z.object({ kind: z.literal("rect"), x: coordinateSchema, y: coordinateSchema, width: coordinateSchema, height: coordinateSchema });
export const polygonShapeSchema = z.object({ kind: z.literal("polygon"), points: z.array(pointSchema) });
/** A polyline of a given stroke width (scratches, cracks). */
export const lineShapeSchema = z.object({ kind: z.literal("line"), points: z.array(pointSchema), width: coordinateSchema });
/** A disc (dead pixels, dust). */
export const spotShapeSchema = z.object({ kind: z.literal("spot"), x: coordinateSchema, y: coordinateSchema, radius: coordinateSchema });

export const shapeSchema = z.discriminatedUnion("kind", [rectShapeSchema, polygonShapeSchema, lineShapeSchema, spotShapeSchema]);
