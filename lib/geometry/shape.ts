/**
 * Region shapes as stored and measured. Every coordinate is in the pixel space of the **upright**
 * original photo (after Exif orientation): x to the right, y down, (0, 0) the top-left corner of
 * the top-left pixel, so a pixel (i, j) covers [i, i+1) × [j, j+1).
 *
 * This is the shape union of the `measureCoverage` contract in docs/contracts.md; keep them identical.
 */
export type Point = [x: number, y: number];

export type RectShape = { kind: "rect"; x: number; y: number; width: number; height: number };
export type PolygonShape = { kind: "polygon"; points: Point[] };
/** A polyline of a given stroke width (scratches, cracks). */
export type LineShape = { kind: "line"; points: Point[]; width: number };
/** A disc (dead pixels, dust). */
export type SpotShape = { kind: "spot"; x: number; y: number; radius: number };

export type Shape = RectShape | PolygonShape | LineShape | SpotShape;
export type ShapeKind = Shape["kind"];
