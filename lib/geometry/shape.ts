/**
 * Region shapes as stored and measured. Every coordinate is in the pixel space of the **upright**
 * original photo (after Exif orientation): x to the right, y down, (0, 0) the top-left corner of
 * the top-left pixel, so a pixel (i, j) covers [i, i+1) × [j, j+1).
 *
 * This is the shape union of the `measureCoverage` contract in docs/contracts.md. The types come
 * from the base zod schemas in shape-schemas.ts (type-only imports: no zod in what imports this).
 */
import type { z } from "zod";
import type { lineShapeSchema, pointSchema, polygonShapeSchema, rectShapeSchema, shapeSchema, spotShapeSchema } from "./shape-schemas";
export type Point = z.infer<typeof pointSchema>;

export type RectShape = z.infer<typeof rectShapeSchema>;
export type PolygonShape = z.infer<typeof polygonShapeSchema>;
/** A polyline of a given stroke width (scratches, cracks). */
export type LineShape = z.infer<typeof lineShapeSchema>;
/** A disc (dead pixels, dust). */
export type SpotShape = z.infer<typeof spotShapeSchema>;

export type Shape = z.infer<typeof shapeSchema>;
export type ShapeKind = Shape["kind"];
