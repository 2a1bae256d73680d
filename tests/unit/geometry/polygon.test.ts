import polygonClipping, { type MultiPolygon, type Polygon } from "polygon-clipping";
import { describe, expect, it } from "vitest";
import { pointInPolygon, polygonArea, signedPolygonArea, windingNumber } from "@/lib/geometry/polygon";
import type { Point } from "@/lib/geometry/shape";

/** Area of polygon-clipping's output: outer rings minus holes, each ring by our shoelace. */
function multiPolygonArea(mp: MultiPolygon): number {
  return mp.reduce((sum, poly) => sum + polygonArea(poly[0] as Point[]) - poly.slice(1).reduce((h, ring) => h + polygonArea(ring as Point[]), 0), 0);
}

const concave: Point[] = [
  [0, 0],
  [10, 0],
  [10, 10],
  [6, 10],
  [6, 4],
  [4, 4],
  [4, 10],
  [0, 10],
];

describe("shoelace area", () => {
  it("matches the worked example of the shoelace formula", () => {
    // Worked example (b, from memory of the encyclopedic "Shoelace formula" article): the pentagon
    // (1,6), (3,1), (7,2), (4,4), (8,5) has area 16.5. Hand check: ½|Σ x_i y_{i+1} − x_{i+1} y_i|
    // = ½|(1−18) + (6−7) + (28−8) + (20−32) + (48−5)| = ½ · 33 = 16.5.
    const pentagon: Point[] = [
      [1, 6],
      [3, 1],
      [7, 2],
      [4, 4],
      [8, 5],
    ];
    expect(polygonArea(pentagon)).toBeCloseTo(16.5, 12);
  });

  it("gives closed-form areas and a sign that follows the winding", () => {
    // Rectangle w·h and triangle ½·b·h (elementary formulas).
    expect(
      polygonArea([
        [2, 3],
        [12, 3],
        [12, 8],
        [2, 8],
      ]),
    ).toBe(50);
    expect(
      polygonArea([
        [0, 0],
        [8, 0],
        [3, 6],
      ]),
    ).toBe(24);
    // Clockwise on screen (y down) is positive, the reverse order negative.
    expect(
      signedPolygonArea([
        [0, 0],
        [4, 0],
        [4, 4],
        [0, 4],
      ]),
    ).toBe(16);
    expect(
      signedPolygonArea([
        [0, 4],
        [4, 4],
        [4, 0],
        [0, 0],
      ]),
    ).toBe(-16);
    expect(polygonArea(concave)).toBe(100 - 2 * 6);
  });

  it("stays exact far from the origin (coordinates taken relative to the first vertex)", () => {
    const far: Point[] = [
      [1e7 + 0.1, 1e7 + 0.2],
      [1e7 + 3.1, 1e7 + 0.2],
      [1e7 + 3.1, 1e7 + 2.2],
    ];
    expect(polygonArea(far)).toBeCloseTo(3, 6);
  });

  it("agrees with inclusion–exclusion over polygon-clipping's union and intersection", () => {
    // |A| + |B| = |A ∪ B| + |A ∩ B|; the booleans come from polygon-clipping (npm, a general
    // polygon library), the areas from our shoelace. Squares [0,4]² and [2,6]² (docs/references.md, a):
    // intersection 4, union 28.
    const a: Polygon = [
      [
        [0, 0],
        [4, 0],
        [4, 4],
        [0, 4],
        [0, 0],
      ],
    ];
    const b: Polygon = [
      [
        [2, 2],
        [6, 2],
        [6, 6],
        [2, 6],
        [2, 2],
      ],
    ];
    expect(multiPolygonArea(polygonClipping.intersection(a, b))).toBe(4);
    expect(multiPolygonArea(polygonClipping.union(a, b))).toBe(28);
    const c: Polygon = [concave.map((p) => [p[0], p[1]] as [number, number])];
    const d: Polygon = [
      [
        [3, -2],
        [13, 5],
        [2, 12],
      ],
    ];
    const sum = polygonArea(concave) + polygonArea(d[0] as Point[]);
    const both = multiPolygonArea(polygonClipping.union(c, d)) + multiPolygonArea(polygonClipping.intersection(c, d));
    expect(both).toBeCloseTo(sum, 9);
  });

  it("agrees with Pick's theorem on lattice polygons", () => {
    // Pick (1899): A = I + B/2 − 1 for a simple polygon with integer vertices, where B counts
    // lattice points on the boundary (gcd(|dx|, |dy|) per edge) and I those inside.
    const gcd = (x: number, y: number): number => (y === 0 ? x : gcd(y, x % y));
    for (const ring of [
      concave,
      [
        [0, 0],
        [7, 2],
        [5, 9],
        [1, 6],
      ] as Point[],
    ]) {
      let boundary = 0;
      for (let i = 0; i < ring.length; i++) {
        const [p, q] = [ring[i], ring[(i + 1) % ring.length]];
        boundary += gcd(Math.abs(q[0] - p[0]), Math.abs(q[1] - p[1]));
      }
      let interior = 0;
      for (let x = -1; x <= 11; x++) {
        for (let y = -1; y <= 11; y++) {
          const onEdge = ring.some((p, i) => {
            const q = ring[(i + 1) % ring.length];
            const crossZ = (q[0] - p[0]) * (y - p[1]) - (q[1] - p[1]) * (x - p[0]);
            return crossZ === 0 && x >= Math.min(p[0], q[0]) && x <= Math.max(p[0], q[0]) && y >= Math.min(p[1], q[1]) && y <= Math.max(p[1], q[1]);
          });
          if (!onEdge && pointInPolygon([x, y], ring)) interior++;
        }
      }
      expect(polygonArea(ring)).toBe(interior + boundary / 2 - 1);
    }
  });
});

describe("point in polygon", () => {
  it("agrees with polygon-clipping on a concave polygon away from its edges", () => {
    // Reference: a tiny square around the point intersects the polygon (polygon-clipping) iff the
    // point is inside. Points on a 0.37-step grid never fall within 0.01 of the integer edges.
    const subject: Polygon = [concave.map((p) => [p[0], p[1]] as [number, number])];
    let checked = 0;
    for (let x = -1.05; x < 11; x += 0.37) {
      for (let y = -1.05; y < 11; y += 0.37) {
        const eps = 1e-3;
        const probe: Polygon = [
          [
            [x - eps, y - eps],
            [x + eps, y - eps],
            [x + eps, y + eps],
            [x - eps, y + eps],
            [x - eps, y - eps],
          ],
        ];
        const expected = polygonClipping.intersection(subject, probe).length > 0;
        expect(pointInPolygon([x, y], concave), `(${x}, ${y})`).toBe(expected);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(1000);
  });

  it("fills a pentagram's centre under nonzero but not under even-odd", () => {
    // The {5/2} star winds twice round its centre: nonzero fills it, even-odd leaves a hole (the
    // SVG fill-rule illustration; b, from memory of the SVG specification's figure).
    const star: Point[] = [0, 2, 4, 1, 3].map((k) => {
      const angle = -Math.PI / 2 + (k * 2 * Math.PI) / 5;
      return [Math.cos(angle) * 10, Math.sin(angle) * 10];
    });
    expect(Math.abs(windingNumber([0, 0], star))).toBe(2);
    expect(pointInPolygon([0, 0], star, "nonzero")).toBe(true);
    expect(pointInPolygon([0, 0], star, "evenodd")).toBe(false);
    expect(pointInPolygon([0, -8.5], star, "evenodd")).toBe(true); // inside one tip
    expect(pointInPolygon([20, 0], star)).toBe(false);
  });

  it("treats fewer than 3 points as empty", () => {
    expect(
      pointInPolygon(
        [0, 0],
        [
          [0, 0],
          [1, 1],
        ],
      ),
    ).toBe(false);
  });
});
