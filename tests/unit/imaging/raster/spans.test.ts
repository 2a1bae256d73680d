/**
 * The rasterisers and the span algebra behind measureCoverage, checked against brute force.
 * These are internal-consistency checks of our own documented pixel rule (no outside source is
 * needed to say whether code follows its own definition); the outside-world checks are in
 * ../coverage.test.ts (closed-form geometry) and ../coverage-reference.test.ts (polygon-clipping).
 */
import { describe, expect, it } from "vitest";
import type { Point, Shape } from "@/lib/geometry/shape";
import { capsuleSection, shapeSpans } from "@/lib/imaging/raster/exact-spans";
import { sharpShapeSpans } from "@/lib/imaging/raster/sharp-spans";
import { countIntersection, countSpans, intersectSpanSets, LooseSpans, spanRow, spanSetsOverlap, unionSpanSets, type SpanSet } from "@/lib/imaging/raster/spans";
import { mulberry32 as seededRandom } from "@/support/prng";

/** Nonzero winding number test at one point (the textbook crossing rule). */
function insidePolygon(points: Point[], x: number, y: number): boolean {
  let winding = 0;
  for (let k = 0; k < points.length; k++) {
    const [x1, y1] = points[k];
    const [x2, y2] = points[(k + 1) % points.length];
    const side = (x2 - x1) * (y - y1) - (x - x1) * (y2 - y1);
    if (y1 <= y && y2 > y && side > 0) winding++;
    else if (y2 <= y && y1 > y && side < 0) winding--;
  }
  return winding !== 0;
}

function distanceToSegment([ax, ay]: Point, [bx, by]: Point, x: number, y: number): number {
  const dx = bx - ax;
  const dy = by - ay;
  const lengthSquared = dx * dx + dy * dy;
  const t = lengthSquared === 0 ? 0 : Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / lengthSquared));
  return Math.hypot(x - ax - t * dx, y - ay - t * dy);
}

/** Our documented pixel rule, pixel by pixel: is the centre (i + ½, j + ½) inside? */
function bruteForceMask(shape: Shape, width: number, height: number): Uint8Array {
  const mask = new Uint8Array(width * height);
  for (let j = 0; j < height; j++) {
    for (let i = 0; i < width; i++) {
      const x = i + 0.5;
      const y = j + 0.5;
      let inside = false;
      if (shape.kind === "polygon") inside = insidePolygon(shape.points, x, y);
      else if (shape.kind === "spot") inside = Math.hypot(x - shape.x, y - shape.y) < shape.radius;
      else if (shape.kind === "rect") inside = x >= shape.x && x < shape.x + shape.width && y >= shape.y && y < shape.y + shape.height;
      else {
        const points = shape.points.length === 1 ? [shape.points[0], shape.points[0]] : shape.points;
        for (let k = 1; k < points.length && !inside; k++) inside = distanceToSegment(points[k - 1], points[k], x, y) <= shape.width / 2;
      }
      mask[j * width + i] = inside ? 1 : 0;
    }
  }
  return mask;
}

function spansToMask(set: SpanSet, width: number, height: number): Uint8Array {
  const mask = new Uint8Array(width * height);
  for (let row = set.top; row < set.top + set.rowCount; row++) {
    const ranges = spanRow(set, row);
    for (let k = 0; k < ranges.length; k += 2) mask.fill(1, row * width + ranges[k], row * width + ranges[k + 1]);
  }
  return mask;
}

const differingPixels = (a: Uint8Array, b: Uint8Array) => a.reduce((sum, value, index) => sum + (value !== b[index] ? 1 : 0), 0);
const coveredPixels = (mask: Uint8Array) => mask.reduce((sum, value) => sum + value, 0);

/** A simple (non-self-intersecting) polygon: vertices at sorted angles around a centre. */
function randomStarPolygon(random: () => number, cx: number, cy: number, maxRadius: number): Shape {
  const sides = 3 + Math.floor(random() * 10);
  const angles = Array.from({ length: sides }, () => random() * 2 * Math.PI).sort((a, b) => a - b);
  return {
    kind: "polygon",
    points: angles.map((angle) => {
      const radius = maxRadius * (0.2 + 0.8 * random());
      return [cx + radius * Math.cos(angle), cy + radius * Math.sin(angle)] as Point;
    }),
  };
}

function randomShape(random: () => number, width: number, height: number): Shape {
  const kind = Math.floor(random() * 4);
  const x = random() * (width + 40) - 20;
  const y = random() * (height + 40) - 20;
  if (kind === 0) return { kind: "rect", x, y, width: random() * 60, height: random() * 60 };
  if (kind === 1) return { kind: "spot", x, y, radius: random() * 30 };
  if (kind === 2) return randomStarPolygon(random, x, y, 60);
  const points: Point[] = [[x, y]];
  for (let k = 0; k < Math.floor(random() * 4); k++) points.push([points[k][0] + random() * 80 - 40, points[k][1] + random() * 80 - 40]);
  return { kind: "line", points, width: 0.5 + random() * 12 };
}

describe("exact rasteriser follows the documented pixel-centre rule", () => {
  it("matches a per-pixel centre test on random shapes of every kind, also across the image border", () => {
    const random = seededRandom(11);
    const width = 120;
    const height = 90;
    for (let trial = 0; trial < 120; trial++) {
      const shape = randomShape(random, width, height);
      const expected = bruteForceMask(shape, width, height);
      const actual = spansToMask(shapeSpans(shape, { width, height }), width, height);
      // Random real coordinates never put a centre exactly on an edge, so no tie can differ.
      expect(differingPixels(actual, expected), JSON.stringify(shape)).toBe(0);
    }
  });

  it("follows the rule on zigzag outlines crossed 150 times per row, in either order (the sorted path for busy rows)", () => {
    const width = 120;
    const height = 90;
    // Teeth from right to left, so each row's crossings arrive in reverse order.
    const reverse: [number, number][] = Array.from({ length: 300 }, (_, i) => [119.3 - i * 0.39, i % 2 ? 89.6 : 0.45]);
    for (const points of [reverse, [...reverse].reverse(), reverse.map(([x, y]) => [x, 90 - y] as [number, number])]) {
      const shape: Shape = { kind: "polygon", points };
      expect(differingPixels(spansToMask(shapeSpans(shape, { width, height }), width, height), bruteForceMask(shape, width, height))).toBe(0);
    }
  });

  it("gives shapes sharing an edge disjoint pixels (half-open ties)", () => {
    const frame = { width: 40, height: 40 };
    const left = shapeSpans(
      {
        kind: "polygon",
        points: [
          [0, 0],
          [20.5, 0],
          [10.5, 40],
          [0, 40],
        ],
      },
      frame,
    );
    const right = shapeSpans(
      {
        kind: "polygon",
        points: [
          [20.5, 0],
          [40, 0],
          [40, 40],
          [10.5, 40],
        ],
      },
      frame,
    );
    expect(spanSetsOverlap(left, right)).toBe(false);
    expect(countSpans(left) + countSpans(right)).toBe(1600);
  });

  it("cuts a capsule at a given height where the distance to the segment equals half the width", () => {
    const out = new Float64Array(2);
    // Horizontal segment (0,0)–(10,0), half width 2, cut at y = 1: x from −√3 to 10 + √3.
    expect(capsuleSection([0, 0], [10, 0], 2, 1, out)).toBe(true);
    expect(out[0]).toBeCloseTo(-Math.sqrt(3), 12);
    expect(out[1]).toBeCloseTo(10 + Math.sqrt(3), 12);
    expect(capsuleSection([0, 0], [10, 0], 2, 2.5, out)).toBe(false);
  });
});

describe("span algebra", () => {
  it("unions, intersects and counts like bitmaps", () => {
    const random = seededRandom(5);
    const width = 64;
    const height = 48;
    for (let trial = 0; trial < 40; trial++) {
      const a = shapeSpans(randomShape(random, width, height), { width, height });
      const b = shapeSpans(randomShape(random, width, height), { width, height });
      const maskA = spansToMask(a, width, height);
      const maskB = spansToMask(b, width, height);
      const union = maskA.map((value, index) => value | maskB[index]);
      const both = maskA.map((value, index) => value & maskB[index]);
      expect(spansToMask(unionSpanSets([a, b]), width, height)).toEqual(union);
      expect(spansToMask(intersectSpanSets(a, b), width, height)).toEqual(both);
      expect(countIntersection(a, b)).toBe(coveredPixels(both));
      expect(spanSetsOverlap(a, b)).toBe(coveredPixels(both) > 0);
    }
    // Deep-comparing 80 bitmaps takes ~5 s on a loaded 2-CPU machine: more than the default limit.
  }, 20_000);

  it("merges touching and overlapping ranges given in any order, up to the largest allowed columns", () => {
    const loose = new LooseSpans();
    loose.add(32_766, 32_760, 32_767);
    loose.add(32_766, 10, 20);
    loose.add(32_766, 20, 25);
    loose.add(32_766, 5, 12);
    loose.add(3, 1, 2);
    const set = loose.finish();
    expect(set.top).toBe(3);
    expect(spanRow(set, 32_766)).toEqual([5, 25, 32_760, 32_767]);
    expect(spanRow(set, 100)).toEqual([]);
    expect(countSpans(set)).toBe(1 + 20 + 7);
  });
});

describe("sharp (crispEdges) masks against the exact pixel-centre rule", () => {
  it("differ in under 0.1 % of covered pixels on random simple polygons", async () => {
    const random = seededRandom(23);
    const frame = { width: 300, height: 220 };
    const shapes = Array.from({ length: 40 }, () => randomStarPolygon(random, 20 + random() * 260, 20 + random() * 180, 90));
    const viaSharp = await sharpShapeSpans(shapes, frame);
    let differing = 0;
    let covered = 0;
    shapes.forEach((shape, index) => {
      const exact = spansToMask(shapeSpans(shape, frame), frame.width, frame.height);
      differing += differingPixels(spansToMask(viaSharp[index], frame.width, frame.height), exact);
      covered += coveredPixels(exact);
    });
    expect(covered).toBeGreaterThan(100_000);
    expect(differing / covered).toBeLessThan(0.001);
  });

  it("agree closely on lines cut into tiles, spots, and shapes cut by the image border", async () => {
    const frame = { width: 500, height: 400 };
    const shapes: Shape[] = [
      {
        kind: "line",
        points: [
          [-30.2, -20.7],
          [480.6, 390.1],
        ],
        width: 7.5,
      },
      {
        kind: "line",
        points: [
          [40, 300],
          [200, 310],
          [260, 120],
          [255, 121],
        ],
        width: 4,
      },
      { kind: "line", points: [[100.3, 50.6]], width: 9 },
      { kind: "spot", x: 498.2, y: 10.4, radius: 25.3 },
      { kind: "rect", x: -15, y: 380, width: 60, height: 40 },
    ];
    const viaSharp = await sharpShapeSpans(shapes, frame);
    shapes.forEach((shape, index) => {
      const exact = spansToMask(shapeSpans(shape, frame), frame.width, frame.height);
      const diff = differingPixels(spansToMask(viaSharp[index], frame.width, frame.height), exact);
      // Curves are flattened to 0.1 px by cairo: allow 1 % plus 2 px for a tiny dot.
      expect(diff, JSON.stringify(shape)).toBeLessThanOrEqual(2 + 0.01 * coveredPixels(exact));
    });
    // The rect has its corners on pixel corners: exact even where the border cuts it.
    expect(countSpans(viaSharp[4])).toBe(45 * 20);
  });

  it("splits work over several atlases when the tiles are large", async () => {
    const frame = { width: 3000, height: 3000 };
    const shapes: Shape[] = Array.from({ length: 3 }, (_, k) => ({ kind: "rect", x: k, y: 0, width: 3000 - 2 * k, height: 3000 }));
    const viaSharp = await sharpShapeSpans(shapes, frame);
    expect(viaSharp.map(countSpans)).toEqual([3000 * 3000, 2998 * 3000, 2996 * 3000]);
  });
});
