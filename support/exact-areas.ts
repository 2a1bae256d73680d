/**
 * Exact reference areas for rasteriser tests and benchmarks: polygon-clipping 0.15.7 (npm; union /
 * intersection of polygons, MultiPolygon output) with areas by the shoelace formula, outer ring
 * minus holes (docs/references.md, "Areas and images"). Circles and round caps are 256-gons
 * (shapeRings), about 1e-4 low.
 */
import * as polygonClippingModule from "polygon-clipping";
import type { MultiPolygon, Pair } from "polygon-clipping";
import type { Point, Shape } from "@/lib/geometry/shape";
import { shapeRings } from "@/lib/imaging/raster/shape-geometry";

// The package's runtime export is one default object; its typings declare named functions.
export const polygonClipping = (polygonClippingModule as unknown as { default?: typeof polygonClippingModule }).default ?? polygonClippingModule;

/** Shoelace area of a MultiPolygon: each polygon's outer ring minus its holes. */
export function multiPolygonArea(shape: MultiPolygon): number {
  const ringArea = (ring: Pair[]) => {
    let twice = 0;
    for (let k = 0; k < ring.length; k++) {
      const [x1, y1] = ring[k];
      const [x2, y2] = ring[(k + 1) % ring.length];
      twice += x1 * y2 - x2 * y1;
    }
    return Math.abs(twice) / 2;
  };
  return shape.reduce((sum, polygon) => sum + ringArea(polygon[0]) - polygon.slice(1).reduce((holes, ring) => holes + ringArea(ring), 0), 0);
}

/** Exact union of shapes as a MultiPolygon. */
export const exactUnion = (shapes: Shape[]): MultiPolygon => polygonClipping.union(shapes.flatMap((shape) => shapeRings(shape)).map((ring) => [ring]) as unknown as MultiPolygon);

/**
 * A simple polygon around (cx, cy): evenly spaced, jittered angles (so it surrounds its centre),
 * radii between minFraction and 1 of maxRadius.
 */
export function starPolygon(random: () => number, cx: number, cy: number, maxRadius: number, minFraction = 0.3): Shape {
  const sides = 4 + Math.floor(random() * 9);
  const step = (2 * Math.PI) / sides;
  const angles = Array.from({ length: sides }, (_, k) => (k + 0.8 * random()) * step);
  return {
    kind: "polygon",
    points: angles.map((angle) => {
      const radius = maxRadius * (minFraction + (1 - minFraction) * random());
      return [cx + radius * Math.cos(angle), cy + radius * Math.sin(angle)] as Point;
    }),
  };
}
