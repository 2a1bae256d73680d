/**
 * measureCoverage against closed-form geometry and the contract in docs/contracts.md. Every check runs
 * with both region rasterisers (sharp tiles, the default, and the exact scanline one).
 * Source marks as in docs/references.md: (a) read in a public source, (b) from memory,
 * (c) common practice; "contract" = docs/contracts.md / the task's stated semantics.
 */
import { describe, expect, it } from "vitest";
import type { Shape } from "@/lib/geometry/shape";
import type { CoverageInput } from "@/lib/measure/types";
import { AppError } from "@/lib/errors";
import { measureCoverage, type CoverageOptions } from "@/lib/imaging/coverage";
import { DeadlineExceeded } from "@/lib/imaging/deadline";

const rect = (x: number, y: number, width: number, height: number): Shape => ({ kind: "rect", x, y, width, height });
const region = (id: string, defect: string, shape: Shape) => ({ id, defect, shape });

describe.each<CoverageOptions["regionRaster"]>(["sharp", "exact"])("measureCoverage (regionRaster %s)", (regionRaster) => {
  const measure = (input: CoverageInput) => measureCoverage(input, { regionRaster });

  describe("closed forms", () => {
    it("counts an axis-aligned shape with corners on pixel corners as exactly its area", async () => {
      // Source: docs/references.md "Raster vs exact" (a polygon with vertices on pixel corners counts
      // exactly its area); area of a rectangle w·h and of an L by the shoelace formula (a, geometry).
      const lShape: Shape = {
        kind: "polygon",
        points: [
          [10, 10],
          [70, 10],
          [70, 30],
          [30, 30],
          [30, 90],
          [10, 90],
        ],
      };
      const result = await measure({ width: 200, height: 150, regions: [region("r", "dent", rect(100, 20, 37, 51)), region("l", "chip", lShape)] });
      expect(result.byDefect.dent.px).toBe(37 * 51);
      expect(result.byDefect.chip.px).toBe(60 * 20 + 20 * 60);
      expect(result.surfacePx).toBe(200 * 150);
      expect(result.byDefect.dent.share).toBeCloseTo((37 * 51) / (200 * 150), 12);
    });

    it("counts a disc as πr² within 0.2 %", async () => {
      // Source: disc area πr² (a, geometry). Gauss's lattice bound |N − πr²| <= 2√2·πr (a, Gauss via
      // MathWorld/CRC "Gauss's Circle Problem", stated for a lattice-point centre; (b) that its
      // square-packing proof holds for any centre) is 0.94 % here. 0.2 % is our tighter tolerance
      // (typical errors grow like r^θ with θ <= 0.63, Huxley, same page).
      // The photo is 3 100 px wide so the Spot cap (10 % of the long edge) allows this radius.
      const radius = 300.37;
      const result = await measure({ width: 3100, height: 700, regions: [region("s", "dust", { kind: "spot", x: 350.2, y: 349.8, radius })] });
      const area = Math.PI * radius ** 2;
      expect(Math.abs(result.byDefect.dust.px - area)).toBeLessThanOrEqual(2 * Math.SQRT2 * Math.PI * radius);
      expect(Math.abs(result.byDefect.dust.px - area) / area).toBeLessThan(0.002);
    });

    it("counts a round-capped line of length L and width w as L·w + π(w/2)² within 1 %", async () => {
      // Source: stadium area πr² + 2ra (a, "Stadium (geometry)", encyclopedic copies); tolerance 1 %
      // is the contract's accuracy target.
      const width = 9.5;
      const length = Math.hypot(610.3, 207.9);
      const result = await measure({
        width: 800,
        height: 400,
        regions: [
          region("l", "scratch", {
            kind: "line",
            points: [
              [40.7, 60.2],
              [651, 268.1],
            ],
            width,
          }),
        ],
      });
      const area = length * width + Math.PI * (width / 2) ** 2;
      expect(Math.abs(result.byDefect.scratch.px - area) / area).toBeLessThan(0.01);
    });
  });

  describe("unions and clipping", () => {
    it("never counts an overlap twice: two identical rects are one rect, overlapping ones their union", async () => {
      // Source: contract (px counts the union); union area of two overlapping rectangles
      // = 2·w·h − overlap (a, inclusion–exclusion).
      const result = await measure({
        width: 100,
        height: 100,
        regions: [region("a", "dent", rect(10, 10, 20, 20)), region("b", "dent", rect(10, 10, 20, 20)), region("c", "chip", rect(0, 0, 30, 30)), region("d", "chip", rect(20, 20, 30, 30))],
      });
      expect(result.byDefect.dent).toEqual({ px: 400, share: 0.04, count: 1 });
      expect(result.byDefect.chip.px).toBe(900 + 900 - 100);
    });

    it("clips to the surface (the union of its shapes) and measures shares against it", async () => {
      // Source: contract (surface = union of surface shapes; share = px / surfacePx); areas of
      // pixel-aligned rectangles (a, geometry).
      const result = await measure({
        width: 200,
        height: 200,
        surface: [rect(0, 0, 100, 100), rect(50, 0, 100, 100)],
        regions: [region("a", "dent", rect(140, 90, 20, 20)), region("b", "dent", rect(170, 170, 10, 10))],
      });
      expect(result.surfacePx).toBe(150 * 100);
      expect(result.byDefect.dent.px).toBe(10 * 10);
      expect(result.byDefect.dent.share).toBeCloseTo(100 / 15000, 12);
      // Region b lies entirely outside the surface: no pixels, not counted.
      expect(result.byDefect.dent.count).toBe(1);
    });

    it("uses the whole image when the surface is absent or empty", async () => {
      // Source: contract.
      const input = { width: 64, height: 48, regions: [region("a", "dent", rect(0, 0, 8, 8))] };
      expect((await measure(input)).surfacePx).toBe(64 * 48);
      expect((await measure({ ...input, surface: [] })).surfacePx).toBe(64 * 48);
    });

    it("clips regions partly outside the image", async () => {
      // Source: rect areas (a, geometry); a disc centred on the image corner keeps a quarter, πr²/4
      // (a, geometry), 1 % tolerance (contract's target).
      // 400 px wide, so the Spot cap (10 % of the long edge) allows the 40 px radius.
      const result = await measure({
        width: 400,
        height: 100,
        regions: [region("a", "dent", rect(-10, 90, 30, 30)), region("s", "dust", { kind: "spot", x: 0, y: 0, radius: 40 }), region("far", "chip", rect(500, 500, 10, 10))],
      });
      expect(result.byDefect.dent.px).toBe(20 * 10);
      expect(Math.abs(result.byDefect.dust.px - (Math.PI * 1600) / 4) / ((Math.PI * 1600) / 4)).toBeLessThan(0.01);
      expect(result.byDefect.chip).toEqual({ px: 0, share: 0, count: 0 });
    });
  });

  describe("zones", () => {
    it("clips zones to the surface and gives each class's share of the zone", async () => {
      // Source: contract (zonePx = zone ∩ surface; px = class ∩ zone ∩ surface; share = px / zonePx,
      // 0 when zonePx is 0); pixel-aligned rect areas (a, geometry).
      const result = await measure({
        width: 200,
        height: 100,
        surface: [rect(0, 0, 100, 100)],
        zones: [
          { id: "lens", shape: rect(50, 0, 100, 100) },
          { id: "outside", shape: rect(120, 0, 50, 50) },
        ],
        regions: [region("a", "dent", rect(40, 0, 20, 10)), region("b", "scratch", rect(0, 50, 10, 10))],
      });
      expect(result.byZone.lens.zonePx).toBe(50 * 100);
      expect(result.byZone.lens.byDefect.dent).toEqual({ px: 100, share: 100 / 5000 });
      expect(result.byZone.lens.byDefect.scratch).toEqual({ px: 0, share: 0 });
      expect(result.byZone.outside).toEqual({ zonePx: 0, byDefect: { dent: { px: 0, share: 0 }, scratch: { px: 0, share: 0 } } });
    });
  });

  describe("counts", () => {
    it("merges regions that share pixels: three regions, two overlapping, count 2", async () => {
      // Source: contract ("number of separate regions after merging overlapping ones").
      const result = await measure({
        width: 300,
        height: 200,
        regions: [
          region("a", "scratch", {
            kind: "line",
            points: [
              [10, 10],
              [120, 80],
            ],
            width: 4,
          }),
          region("b", "scratch", {
            kind: "line",
            points: [
              [10, 80],
              [120, 10],
            ],
            width: 4,
          }),
          region("c", "scratch", { kind: "spot", x: 250, y: 150, radius: 10 }),
        ],
      });
      expect(result.byDefect.scratch.count).toBe(2);
    });

    it("merges chains, keeps touching-but-not-overlapping regions apart, ignores regions outside the surface", async () => {
      // Source: our documented count definition (shared pixel after clipping to the surface).
      const result = await measure({
        width: 200,
        height: 100,
        surface: [rect(0, 0, 150, 100)],
        regions: [
          region("a", "dent", rect(0, 0, 20, 20)),
          region("b", "dent", rect(15, 0, 20, 20)), // overlaps a
          region("c", "dent", rect(30, 0, 20, 20)), // overlaps b only: same group
          region("d", "dent", rect(50, 0, 20, 20)), // only touches c
          region("e", "dent", rect(160, 0, 20, 20)), // outside the surface
          region("f", "dent", rect(140, 50, 20, 20)), // partly inside: counts
        ],
      });
      expect(result.byDefect.dent.count).toBe(3);
    });
  });

  it("returns zeros and no classes for an empty region list", async () => {
    // Source: contract.
    const result = await measure({ width: 10, height: 10, regions: [], zones: [{ id: "z", shape: rect(0, 0, 5, 5) }] });
    expect(result).toEqual({ surfacePx: 100, byDefect: {}, byZone: { z: { zonePx: 25, byDefect: {} } } });
  });
});

describe("measureCoverage input validation", () => {
  const valid: CoverageInput = { width: 10, height: 10, regions: [region("a", "dent", rect(0, 0, 1, 1))] };
  const rejection = async (input: unknown) => {
    try {
      await measureCoverage(input as CoverageInput);
    } catch (error) {
      return error;
    }
    throw new Error("expected a rejection");
  };

  it("rejects bad input with one bad_request error naming every bad field", async () => {
    const error = await rejection({
      ...valid,
      width: 0,
      regions: [
        region("a", "dent", { kind: "spot", x: Number.NaN, y: 1, radius: -1 }),
        region("b", "dent", {
          kind: "polygon",
          points: [
            [0, 0],
            [1, 1],
          ],
        }),
      ],
    });
    expect(error).toBeInstanceOf(AppError);
    expect((error as AppError).code).toBe("bad_request");
    expect(Object.keys((error as AppError).fieldErrors ?? {}).sort()).toEqual(["regions.0.shape.radius", "regions.0.shape.x", "regions.1.shape.points", "width"]);
    expect((error as AppError).message).toContain("a polygon needs at least 3 points");
  });

  it("rejects unknown shape kinds, zero-width lines and duplicate zone ids", async () => {
    const error = (await rejection({
      ...valid,
      regions: [region("a", "dent", { kind: "blob" } as never), region("b", "scratch", { kind: "line", points: [[0, 0]], width: 0 })],
      zones: [
        { id: "z", shape: rect(0, 0, 1, 1) },
        { id: "z", shape: rect(0, 0, 1, 1) },
      ],
    })) as AppError;
    expect(Object.keys(error.fieldErrors ?? {}).sort()).toEqual(["regions.0.shape.kind", "regions.1.shape.width", "zones.1.id"]);
  });

  it("rejects images above the pixel limit before allocating anything", async () => {
    const error = (await rejection({ ...valid, width: 20_000, height: 20_000 })) as AppError;
    expect(error.code).toBe("bad_request");
    expect(error.fieldErrors).toEqual({ width: "width × height must be at most 268402689 pixels" });
  });

  it("refuses, before any work, Lines and Spots beyond their caps and sets beyond the per-photo work budget", async () => {
    // The case: a 2-point Line 4 000 px wide on a 4000 × 3000 photo (16 s through sharp before).
    const started = performance.now();
    const wide = (await rejection({
      width: 4000,
      height: 3000,
      regions: [
        region("w", "scratch", {
          kind: "line",
          points: [
            [0, 1500],
            [4000, 1500],
          ],
          width: 4000,
        }),
      ],
    })) as AppError;
    expect(wide.fieldErrors).toEqual({ "regions.0.shape.width": "must be at most 200 px (5 % of the photo's long edge)" });
    const big = (await rejection({ width: 4000, height: 3000, regions: [region("s", "dust", { kind: "spot", x: 10, y: 10, radius: 401 })] })) as AppError;
    expect(big.fieldErrors).toEqual({ "regions.0.shape.radius": "must be at most 400 px (10 % of the photo's long edge)" });
    // 40 zigzags of 2 000 edges, each edge spanning all 3 000 rows: 240 million shape rows.
    const zigzag = Array.from({ length: 40 }, (_, k) =>
      region(`z${k}`, "dent", { kind: "polygon", points: Array.from({ length: 2000 }, (_, i) => [k + i * 0.01, i % 2 ? 3000 : 0] as [number, number]) }),
    );
    const costly = (await rejection({ width: 4000, height: 3000, regions: zigzag })) as AppError;
    expect(costly.message).toMatch(/too long to measure: their edges and lines cross 240\.1 million pixel rows in all, at most 1\.0 million are allowed per photo/);
    // Refused from arithmetic on the input, not by trying (generous bound for a loaded machine).
    expect(performance.now() - started).toBeLessThan(2000);
  });

  it("stops with DeadlineExceeded once its deadline has passed, also inside the rasterising loops", async () => {
    await expect(measureCoverage(valid, { deadline: Date.now() - 1 })).rejects.toBeInstanceOf(DeadlineExceeded);
    // Within the caps but plenty of rows: the check inside the loops fires long before the end.
    const lines = Array.from({ length: 300 }, (_, k) =>
      region(`l${k}`, "scratch", {
        kind: "line",
        points: [
          [k * 4, 0],
          [k * 4 + 3, 3000],
        ],
        width: 199,
      }),
    );
    const started = performance.now();
    await expect(measureCoverage({ width: 4000, height: 3000, regions: lines }, { deadline: Date.now() + 20 })).rejects.toBeInstanceOf(DeadlineExceeded);
    expect(performance.now() - started).toBeLessThan(2000);
  });

  it("accepts ids that are also object-prototype names as plain keys", async () => {
    const result = await measureCoverage({ ...valid, regions: [region("a", "__proto__", rect(0, 0, 2, 2))] });
    expect(Object.keys(result.byDefect)).toEqual(["__proto__"]);
    expect(result.byDefect["__proto__"].px).toBe(4);
  });
});
