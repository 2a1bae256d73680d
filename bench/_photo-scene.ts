/**
 * The benchmark photo scene shared by bench/coverage.ts and bench/compare-regions.ts (files
 * starting with "_" are not run by `npm run bench`): a 12-megapixel photo (4000 × 3000) with 50
 * regions in 3 defect classes (lines, polygons, rects, spots of realistic defect sizes), a polygon
 * surface (a phone back's rounded outline) and 3 zones, generated from a seed; and a second
 * person's marking of it (buildComparedPair) for bench/compare-regions.ts and bench/scoring.ts.
 */
import type { Point, Shape } from "@/lib/geometry/shape";
import type { ComparedRegion, RegionSetComparisonInput } from "@/lib/imaging/compare-regions";
import type { CoverageInput } from "@/lib/measure/types";
import { mulberry32 as seededRandom } from "@/support/prng";

export const WIDTH = 4000;
export const HEIGHT = 3000;

export function buildPhotoScene(seed = 20261201): CoverageInput {
  const random = seededRandom(seed);
  const between = (low: number, high: number) => low + (high - low) * random();
  // The part: a rounded-rectangle outline (a phone back) as a 200-vertex polygon.
  const outline: Point[] = [];
  for (let k = 0; k < 200; k++) {
    const angle = (2 * Math.PI * k) / 200;
    const c = Math.cos(angle);
    const s = Math.sin(angle);
    // Superellipse |x/a|^4 + |y/b|^4 = 1.
    outline.push([2000 + 1800 * Math.sign(c) * Math.abs(c) ** 0.5, 1500 + 1350 * Math.sign(s) * Math.abs(s) ** 0.5]);
  }
  const lens: Point[] = Array.from({ length: 64 }, (_, k) => {
    const angle = (2 * Math.PI * k) / 64;
    return [900 + 420 * Math.cos(angle), 800 + 420 * Math.sin(angle)] as Point;
  });
  const regions: CoverageInput["regions"] = [];
  const inPart = (): Point => [between(300, 3700), between(250, 2750)];
  for (let k = 0; k < 20; k++) {
    const start = inPart();
    const points: Point[] = [start];
    const heading = between(0, 2 * Math.PI);
    for (let p = 0; p < 1 + Math.floor(between(0, 4)); p++) {
      const last = points[points.length - 1];
      const step = between(60, 250);
      const turn = heading + between(-0.4, 0.4);
      points.push([last[0] + step * Math.cos(turn), last[1] + step * Math.sin(turn)]);
    }
    regions.push({ id: `s${k}`, defect: "scratch", shape: { kind: "line", points, width: between(3, 12) } });
  }
  for (let k = 0; k < 15; k++) {
    const [cx, cy] = inPart();
    if (k % 3 === 0) {
      regions.push({ id: `d${k}`, defect: "dent", shape: { kind: "rect", x: cx, y: cy, width: between(20, 200), height: between(20, 160) } });
      continue;
    }
    const sides = 6 + Math.floor(between(0, 8));
    const points: Point[] = Array.from({ length: sides }, (_, p) => {
      const angle = (2 * Math.PI * p) / sides + between(-0.2, 0.2);
      const radius = between(20, 120);
      return [cx + radius * Math.cos(angle), cy + radius * Math.sin(angle)] as Point;
    });
    regions.push({ id: `d${k}`, defect: "dent", shape: { kind: "polygon", points } });
  }
  for (let k = 0; k < 15; k++) {
    const [x, y] = inPart();
    regions.push({ id: `p${k}`, defect: "dust", shape: { kind: "spot", x, y, radius: between(2, 25) } });
  }
  return {
    width: WIDTH,
    height: HEIGHT,
    regions,
    surface: [{ kind: "polygon", points: outline }],
    zones: [
      { id: "lens", shape: { kind: "polygon", points: lens } },
      { id: "body", shape: { kind: "rect", x: 0, y: 1300, width: WIDTH, height: 1700 } },
      { id: "edge-band", shape: { kind: "rect", x: 0, y: 0, width: 400, height: HEIGHT } },
    ],
  };
}

function moved(shape: Shape, random: () => number): Shape {
  const dx = (random() - 0.5) * 8;
  const dy = (random() - 0.5) * 8;
  const shift = (points: Point[]) => points.map(([x, y]) => [x + dx, y + dy] as Point);
  switch (shape.kind) {
    case "rect":
      return { ...shape, x: shape.x + dx, y: shape.y + dy };
    case "spot":
      return { ...shape, x: shape.x + dx, y: shape.y + dy, radius: shape.radius * (0.9 + 0.2 * random()) };
    case "polygon":
      return { kind: "polygon", points: shift(shape.points) };
    case "line":
      return { kind: "line", points: shift(shape.points), width: shape.width };
  }
}

/**
 * Item `index` of a 20-item attempt as Calibration and Recheck score it: side A is the scene (a
 * new seed per item); side B is A as a second person might mark it — every region moved by up to
 * ±4 px (spots also resized by ±10 %), about one in seven left out, and four extra regions.
 */
export function buildComparedPair(index: number): RegionSetComparisonInput {
  const scene = buildPhotoScene(20261202 + index);
  const random = seededRandom(7000 + index);
  const b: ComparedRegion[] = scene.regions.filter(() => random() > 1 / 7).map((region) => ({ ...region, id: `b-${region.id}`, shape: moved(region.shape, random) }));
  for (let k = 0; k < 4; k++) {
    const x = 400 + random() * 3200;
    const y = 300 + random() * 2400;
    b.push(
      k % 2 === 0
        ? { id: `extra${k}`, defect: "dust", shape: { kind: "spot", x, y, radius: 5 + random() * 15 } }
        : { id: `extra${k}`, defect: "dent", shape: { kind: "rect", x, y, width: 40 + random() * 80, height: 30 + random() * 60 } },
    );
  }
  return { width: scene.width, height: scene.height, a: scene.regions, b, surface: scene.surface };
}
