/**
 * Zones drawn on a sample photo with the annotation canvas, to and from the part type's stored
 * form. Pure, browser-safe.
 *
 * A view's zones are stored as polygons in 0..1 of the **Surface's bounding box** (docs/contracts.md;
 * the box of all the photo's surfaces, as grading and the Bench map them: components/annotate/
 * zones.ts). On the canvas each zone is a "class" named by the zone's id and drawn with Box or
 * Outline; the Surface is drawn (or kept) with the Surface tool. Converting back:
 * - the Surface is required (without it there is no box to store the zone in);
 * - each zone takes exactly one shape: a Box becomes its four corners, an Outline its points; a
 *   Line or Spot has no area to speak of and is refused with the reason;
 * - points are made relative to the box, clamped to 0..1 (a zone may not reach past the part) and
 *   rounded to 4 decimals (0.1 px on a 1 000 px part);
 * - a zone with no shape is left as it was, and says so.
 * A photo without a Surface shows no stored zone (there is no box to place them in); once a Surface
 * is drawn or suggested, `zonesToPlace` puts the stored zones not drawn yet into its box.
 */
import { boundsOfShape, type Bounds } from "@/lib/geometry/bounds";
import type { Point, PolygonShape, Shape } from "@/lib/geometry/shape";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { ZoneDefinition } from "@/lib/part-types/schemas";

export type DrawnZones = { zones: ZoneDefinition[]; problems: string[]; unchanged: string[] };

const round4 = (v: number) => Math.round(v * 10_000) / 10_000;

/** The box zones are stored in: the union box of the surfaces, or null without one. */
export function surfaceBox(surfaces: readonly PolygonShape[]): Bounds | null {
  const boxes = surfaces.filter((s) => s.points.length >= 3).map((s) => boundsOfShape(s));
  if (boxes.length === 0) return null;
  const box = { minX: Math.min(...boxes.map((b) => b.minX)), minY: Math.min(...boxes.map((b) => b.minY)), maxX: Math.max(...boxes.map((b) => b.maxX)), maxY: Math.max(...boxes.map((b) => b.maxY)) };
  return box.maxX > box.minX && box.maxY > box.minY ? box : null;
}

function pointsOf(shape: Shape): Point[] | null {
  if (shape.kind === "rect")
    return [
      [shape.x, shape.y],
      [shape.x + shape.width, shape.y],
      [shape.x + shape.width, shape.y + shape.height],
      [shape.x, shape.y + shape.height],
    ];
  if (shape.kind === "polygon") return shape.points;
  return null;
}

/** A stored zone's polygon in the photo's pixels, through the Surface box. */
function zoneInBox(zone: ZoneDefinition, box: Bounds): PolygonShape {
  return { kind: "polygon", points: zone.polygon.map(([u, v]): Point => [box.minX + u * (box.maxX - box.minX), box.minY + v * (box.maxY - box.minY)]) };
}

/** The canvas's region set for a view: the photo's surfaces, and each zone as a region of its own class. */
export function drawingFromZones(zones: readonly ZoneDefinition[], surfaces: RegionSetPayload["surfaces"]): RegionSetPayload {
  const box = surfaceBox(surfaces.map((s) => s.shape));
  const regions = box ? zones.map((zone) => ({ id: `zone-${zone.id}`, defect: zone.id, shape: zoneInBox(zone, box) })) : [];
  return { surfaces: [...surfaces], regions, ruler: null };
}

/** Stored zones the drawing does not show yet, as shapes in its Surface box ([] without a Surface). */
export function zonesToPlace(drawing: RegionSetPayload, zones: readonly ZoneDefinition[]): { defect: string; shape: PolygonShape }[] {
  const box = surfaceBox(drawing.surfaces.map((s) => s.shape));
  if (!box) return [];
  const drawn = new Set(drawing.regions.map((r) => r.defect));
  return zones.filter((z) => z.polygon.length >= 3 && !drawn.has(z.id)).map((zone) => ({ defect: zone.id, shape: zoneInBox(zone, box) }));
}

/** The zones as drawn, in the stored form; `problems` (nothing is taken then) and `unchanged` in words. */
export function zonesFromDrawing(drawing: RegionSetPayload, current: readonly ZoneDefinition[]): DrawnZones {
  const box = surfaceBox(drawing.surfaces.map((s) => s.shape));
  if (!box) return { zones: [...current], problems: ["Draw the part's Surface first: zones are stored relative to its outline's box."], unchanged: [] };
  const problems: string[] = [];
  const unchanged: string[] = [];
  const zones = current.map((zone) => {
    const shapes = drawing.regions.filter((r) => r.defect === zone.id);
    if (shapes.length === 0) {
      unchanged.push(zone.label);
      return zone;
    }
    if (shapes.length > 1) {
      problems.push(`${zone.label} has ${shapes.length} shapes; a zone is one shape: delete the extra ones.`);
      return zone;
    }
    const points = pointsOf(shapes[0].shape);
    if (!points) {
      problems.push(`${zone.label} is drawn as a ${shapes[0].shape.kind === "line" ? "Line" : "Spot"}; draw a zone with Box or Outline.`);
      return zone;
    }
    const w = box.maxX - box.minX;
    const h = box.maxY - box.minY;
    const clamp = (v: number) => Math.min(1, Math.max(0, v));
    return { ...zone, polygon: points.map(([x, y]): [number, number] => [round4(clamp((x - box.minX) / w)), round4(clamp((y - box.minY) / h))]) };
  });
  return { zones, problems, unchanged };
}
