import { describe, expect, it } from "vitest";
import sharp from "sharp";
import type { Point } from "@/lib/geometry/shape";
import { suggestSurface, traceOuterBoundary } from "@/lib/imaging/suggest-surface";
import { mulberry32 as prng } from "@/support/prng";

/** Shoelace formula (a: the standard surveyor's area formula for a simple polygon). */
function shoelace(points: Point[]): number {
  let twice = 0;
  for (let i = 0; i < points.length; i++) {
    const [ax, ay] = points[i];
    const [bx, by] = points[(i + 1) % points.length];
    twice += ax * by - bx * ay;
  }
  return Math.abs(twice) / 2;
}

/** Area of a w × h rectangle with corner radius r: w·h − (4 − π)·r² (a: elementary geometry). */
const roundedRectArea = (w: number, h: number, r: number) => w * h - (4 - Math.PI) * r * r;

type Part = { x: number; y: number; w: number; h: number; r: number; rotate?: number; grey: number };

/** A part (rounded rectangle, optionally rotated, optional extra SVG) on a plain backdrop plus noise. */
async function photo(width: number, height: number, backdrop: number, part: Part, options: { noise?: number; extra?: string; jpeg?: boolean } = {}) {
  const cx = part.x + part.w / 2;
  const cy = part.y + part.h / 2;
  const svg =
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}">` +
    `<rect width="100%" height="100%" fill="rgb(${backdrop},${backdrop},${backdrop})"/>` +
    `<g transform="rotate(${part.rotate ?? 0} ${cx} ${cy})"><rect x="${part.x}" y="${part.y}" width="${part.w}" height="${part.h}" rx="${part.r}" fill="rgb(${part.grey},${part.grey},${part.grey})"/>${options.extra ?? ""}</g></svg>`;
  const { data, info } = await sharp(Buffer.from(svg)).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  const random = prng(3);
  const noise = options.noise ?? 0;
  for (let i = 0; i < data.length; i += 3) {
    const n = noise * Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
    for (let c = 0; c < 3; c++) data[i + c] = Math.max(0, Math.min(255, Math.round(data[i + c] + n)));
  }
  const image = sharp(data, { raw: info });
  return options.jpeg ? image.jpeg({ quality: 85 }).toBuffer() : image.png().toBuffer();
}

function expectInside(points: Point[], width: number, height: number) {
  for (const [x, y] of points) {
    expect(x).toBeGreaterThanOrEqual(0);
    expect(y).toBeGreaterThanOrEqual(0);
    expect(x).toBeLessThanOrEqual(width);
    expect(y).toBeLessThanOrEqual(height);
  }
}

describe("suggestSurface on generated parts", () => {
  it("dark rounded part on a light backdrop (noise σ 10): area within 1 %, few vertices", async () => {
    const part: Part = { x: 300, y: 200, w: 600, h: 450, r: 60, grey: 60 };
    const result = await suggestSurface(await photo(1200, 900, 200, part, { noise: 10 }));
    expect(result.shape).not.toBeNull();
    if (!result.shape) return;
    expect(result.part).toBe("darker");
    expect(result.confidence).toBe("high");
    expect(result.threshold).toBeGreaterThan(60); // between the two drawn levels
    expect(result.threshold).toBeLessThan(200);
    const truth = roundedRectArea(600, 450, 60);
    expect(Math.abs(shoelace(result.shape.points) / truth - 1)).toBeLessThan(0.01);
    expect(result.shape.points.length).toBeLessThanOrEqual(32);
    expectInside(result.shape.points, 1200, 900);
    // The drawn box: every vertex within 2 working-copy pixels (1200/640 px each) of it.
    const xs = result.shape.points.map((p) => p[0]);
    const ys = result.shape.points.map((p) => p[1]);
    const workPx = 1200 / 640;
    expect(Math.abs(Math.min(...xs) - 300)).toBeLessThan(2 * workPx);
    expect(Math.abs(Math.max(...xs) - 900)).toBeLessThan(2 * workPx);
    expect(Math.abs(Math.min(...ys) - 200)).toBeLessThan(2 * workPx);
    expect(Math.abs(Math.max(...ys) - 650)).toBeLessThan(2 * workPx);
  });

  it("light part on a dark backdrop, JPEG q85, 1600 × 1200 (downscaled 2.5 ×): area within 1 %", async () => {
    const part: Part = { x: 250, y: 300, w: 1000, h: 560, r: 90, grey: 180 };
    const result = await suggestSurface(await photo(1600, 1200, 35, part, { noise: 8, jpeg: true }));
    expect(result.shape && result.part).toBe("lighter");
    if (!result.shape) return;
    expect(Math.abs(shoelace(result.shape.points) / roundedRectArea(1000, 560, 90) - 1)).toBeLessThan(0.01);
    expect(result.shape.points.length).toBeLessThanOrEqual(32);
  });

  it("part rotated by 23°: area within 2 %, few vertices", async () => {
    const part: Part = { x: 350, y: 250, w: 500, h: 380, r: 40, rotate: 23, grey: 90 };
    const result = await suggestSurface(await photo(1200, 900, 215, part, { noise: 10, jpeg: true }));
    if (!result.shape) throw new Error(result.note);
    expect(Math.abs(shoelace(result.shape.points) / roundedRectArea(500, 380, 40) - 1)).toBeLessThan(0.02);
    expect(result.shape.points.length).toBeLessThanOrEqual(40);
  });

  it("fills holes (a lens window of backdrop colour) and ignores a separate speck", async () => {
    const part: Part = { x: 200, y: 150, w: 700, h: 500, r: 50, grey: 70 };
    const extra = `<circle cx="350" cy="300" r="80" fill="rgb(210,210,210)"/>`;
    const speck = `<rect x="1000" y="780" width="30" height="30" fill="rgb(70,70,70)"/>`;
    const result = await suggestSurface(await photo(1200, 900, 210, part, { noise: 6, extra: extra + speck }));
    if (!result.shape) throw new Error(result.note);
    expect(Math.abs(shoelace(result.shape.points) / roundedRectArea(700, 500, 50) - 1)).toBeLessThan(0.01);
    expect(Math.max(...result.shape.points.map((p) => p[0]))).toBeLessThan(920); // the speck at x ≥ 1000 is not in it
  });

  it("works in upright coordinates for a photo with Exif orientation 6", async () => {
    // Orientation 6: stored (x, y) of a W × H raster → upright (H − 1 − y, x), size H × W
    // (docs/references.md, a). A part stored at x 100–500, y 50–250 of 800 × 600 is upright at
    // x 350–550, y 100–500 (pixel edges, so H − y for the far edge).
    const stored = await photo(800, 600, 220, { x: 100, y: 50, w: 400, h: 200, r: 0, grey: 40 });
    const rotated = await sharp(stored).jpeg({ quality: 95 }).withMetadata({ orientation: 6 }).toBuffer();
    const result = await suggestSurface(rotated);
    if (!result.shape) throw new Error(result.note);
    const xs = result.shape.points.map((p) => p[0]);
    const ys = result.shape.points.map((p) => p[1]);
    // 800 × 600 fits the 640 working side at 1.25 px per working pixel: allow 2 of them.
    expect(Math.abs(Math.min(...xs) - (600 - 250))).toBeLessThan(2.5);
    expect(Math.abs(Math.max(...xs) - (600 - 50))).toBeLessThan(2.5);
    expect(Math.abs(Math.min(...ys) - 100)).toBeLessThan(2.5);
    expect(Math.abs(Math.max(...ys) - 500)).toBeLessThan(2.5);
    expectInside(result.shape.points, 600, 800);
  });

  it("says so when the photo is one flat level, and rejects what is not an image", async () => {
    const flat = await sharp({ create: { width: 300, height: 200, channels: 3, background: "#777777" } })
      .png()
      .toBuffer();
    const result = await suggestSurface(flat);
    expect(result).toMatchObject({ shape: null, confidence: "none" });
    await expect(suggestSurface(Buffer.from("nope"))).rejects.toThrow(/could not be decoded/);
    await expect(suggestSurface(flat, { maxWorkingSide: 10 })).rejects.toThrow(/Invalid surface options/);
  });
});

describe("boundary tracing and simplification", () => {
  const mask = (rows: string[]) => ({
    width: rows[0].length,
    height: rows.length,
    data: Uint8Array.from(
      rows
        .join("")
        .split("")
        .map((c) => (c === "#" ? 1 : 0)),
    ),
  });

  it("traces pixel edges so the shoelace area equals the pixel count (L shape, notch)", () => {
    const shapes = [
      ["......", ".###..", ".#....", ".#....", "......"], // L shape
      ["#####", "#####", "#####"], // solid, touching every border
      ["##..", ".#..", ".##.", "..##"], // staircase
      ["###", "#.#", "##."], // open ring: the boundary passes the vertex (2, 2) twice
    ];
    for (const rows of shapes) {
      const m = mask(rows);
      const count = m.data.reduce((a, b) => a + b, 0);
      const corners = traceOuterBoundary(m);
      expect(shoelace(corners)).toBe(count);
      for (const [x, y] of corners) expect(Number.isInteger(x) && Number.isInteger(y)).toBe(true);
    }
  });
});
