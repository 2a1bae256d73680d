import { describe, expect, it } from "vitest";
import { distanceToPolyline } from "@/lib/geometry/distance";
import type { Point } from "@/lib/geometry/shape";
import { simplifyPolyline, simplifyRing, simplifyToLimit } from "@/lib/geometry/simplify";
import { mulberry32 as random } from "@/support/prng";

function noisyStroke(n: number, seed = 7): Point[] {
  const rnd = random(seed);
  return Array.from({ length: n }, (_, i) => [i * 0.05, Math.sin(i / 500) * 40 + (rnd() - 0.5) * 0.6]);
}

describe("Douglas–Peucker simplification", () => {
  it("matches a hand-worked example", () => {
    // Chord (0,0)–(4,0): (3,3) is 3 away → kept. Chord (0,0)–(3,3): (2,0) is 6/√18 ≈ 1.41 away →
    // kept; (1,0.4) is 1.8/√18 ≈ 0.42 away. Chord (0,0)–(2,0): (1,0.4) is 0.4 away.
    const pts: Point[] = [
      [0, 0],
      [1, 0.4],
      [2, 0],
      [3, 3],
      [4, 0],
    ];
    expect(simplifyPolyline(pts, 0.5)).toEqual([
      [0, 0],
      [2, 0],
      [3, 3],
      [4, 0],
    ]);
    expect(simplifyPolyline(pts, 0.3)).toEqual(pts);
  });

  it("reduces a straight run to its end points", () => {
    const straight: Point[] = Array.from({ length: 50 }, (_, i) => [i, 2 * i]);
    expect(simplifyPolyline(straight, 0.01)).toEqual([
      [0, 0],
      [49, 98],
    ]);
  });

  it("keeps every dropped point within the tolerance of the result (the algorithm's guarantee)", () => {
    const stroke = noisyStroke(4_000);
    for (const tolerance of [0.25, 1, 4]) {
      const simplified = simplifyPolyline(stroke, tolerance);
      expect(simplified[0]).toEqual(stroke[0]);
      expect(simplified[simplified.length - 1]).toEqual(stroke[stroke.length - 1]);
      expect(simplified.length).toBeLessThan(stroke.length);
      const worst = Math.max(...stroke.map((p) => distanceToPolyline(p, simplified)));
      expect(worst).toBeLessThanOrEqual(tolerance + 1e-9);
    }
  });

  it("handles a 200 000-point stroke without deep recursion", () => {
    const simplified = simplifyPolyline(noisyStroke(200_000), 1);
    expect(simplified.length).toBeGreaterThan(2);
    expect(simplified.length).toBeLessThan(2_000);
  });

  it("leaves short inputs and a zero tolerance alone", () => {
    expect(
      simplifyPolyline(
        [
          [0, 0],
          [1, 1],
        ],
        5,
      ),
    ).toEqual([
      [0, 0],
      [1, 1],
    ]);
    expect(
      simplifyPolyline(
        [
          [0, 0],
          [1, 0.1],
          [2, 0],
        ],
        0,
      ),
    ).toHaveLength(3);
  });
});

describe("ring simplification", () => {
  const circle: Point[] = Array.from({ length: 720 }, (_, i) => [100 + 50 * Math.cos((i * Math.PI) / 360), 100 + 50 * Math.sin((i * Math.PI) / 360)]);

  it("keeps the ring within tolerance, closing segment included", () => {
    const ring = simplifyRing(circle, 0.5);
    expect(ring.length).toBeLessThan(100);
    const worst = Math.max(...circle.map((p) => distanceToPolyline(p, ring, true)));
    expect(worst).toBeLessThanOrEqual(0.5 + 1e-9);
  });

  it("keeps a rectangle's corners and drops the points on its sides (moved from the Surface suggestion's own copy)", () => {
    const ring: Point[] = [
      [0, 0],
      [5, 0],
      [10, 0],
      [10, 3],
      [10, 6],
      [5, 6],
      [0, 6],
      [0, 3],
    ];
    expect(simplifyRing(ring, 0.5)).toEqual([
      [0, 0],
      [10, 0],
      [10, 6],
      [0, 6],
    ]);
  });

  it("never collapses below a triangle", () => {
    const ring = simplifyRing(circle, 1_000);
    expect(ring).toHaveLength(3);
    expect(new Set(ring.map((p) => p.join())).size).toBe(3);
  });
});

describe("simplifyToLimit", () => {
  it("thins only as far as needed to fit the limit", () => {
    const stroke = noisyStroke(20_000, 3);
    const fitted = simplifyToLimit(stroke, 5_000, { closed: false });
    expect(fitted.length).toBeLessThanOrEqual(5_000);
    // The bisection keeps close to the limit instead of jumping to the first tolerance that fits
    // (0.25 px leaves about 3 200 of these points, 0.125 px about 7 800).
    expect(fitted.length).toBeGreaterThan(4_500);
    expect(simplifyToLimit(stroke.slice(0, 100), 5_000, { closed: false })).toHaveLength(100);
  });

  it("fits a ring too", () => {
    const ring = noisyStroke(9_000, 11).map(([x, y], i) => [x + Math.cos(i / 1432) * 300, y + Math.sin(i / 1432) * 300] as Point);
    expect(simplifyToLimit(ring, 50, { closed: true }).length).toBeLessThanOrEqual(50);
  });
});
