/**
 * Inspection zones on the canvas. A part type stores each view's zones as polygons in 0..1 of the
 * **Surface's bounding box** (x right, y down); the grading step maps them to photo pixels as
 * x = minX + u·(maxX − minX), y = minY + v·(maxY − minY), over the box of all of the photo's
 * surfaces, or over the whole photo when there is no Surface yet. The canvas must draw them
 * where the measurement will put them, so it uses the same rule (see lib/grading/measure-photo.ts).
 */
import type { Bounds } from "@/lib/geometry/bounds";
import { boundsOfShape } from "@/lib/geometry/bounds";
import type { ImageSize } from "@/lib/geometry/clamp";
import type { Point, PolygonShape } from "@/lib/geometry/shape";

export type ZoneInput = Readonly<{ id: string; label: string; polygon: readonly (readonly [number, number])[] }>;
export type ImageZone = Readonly<{ id: string; label: string; points: Point[] }>;
export type ZoneBox = Bounds & { source: "surface" | "image" };

/** The box zones are drawn in: the union box of the surfaces, else the whole photo. */
export function zoneBox(surfaces: readonly PolygonShape[], image: ImageSize): ZoneBox {
  let box: Bounds | null = null;
  for (const surface of surfaces) {
    if (surface.points.length === 0) continue;
    const b = boundsOfShape(surface);
    box = box ? { minX: Math.min(box.minX, b.minX), minY: Math.min(box.minY, b.minY), maxX: Math.max(box.maxX, b.maxX), maxY: Math.max(box.maxY, b.maxY) } : b;
  }
  if (box && box.maxX - box.minX > 0 && box.maxY - box.minY > 0) return { ...box, source: "surface" };
  return { minX: 0, minY: 0, maxX: image.width, maxY: image.height, source: "image" };
}

export function zonesToImage(zones: readonly ZoneInput[], box: Bounds): ImageZone[] {
  const width = box.maxX - box.minX;
  const height = box.maxY - box.minY;
  return zones.map((zone) => ({
    id: zone.id,
    label: zone.label,
    points: zone.polygon.map(([u, v]): Point => [box.minX + u * width, box.minY + v * height]),
  }));
}
