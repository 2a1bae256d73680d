import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { asCameraJpeg, renderAnnotatedPartPhoto, renderPartPhoto } from "@/db/seed/photo-art";
import { shapeSpans } from "@/lib/imaging/raster/exact-spans";
import type { Shape } from "@/lib/geometry/shape";
import { normalizePhoto, readExifCaptureTime } from "@/lib/imaging/normalize";

type Rgb = [number, number, number];
const RED: Rgb = [220, 30, 30];
const GREEN: Rgb = [30, 200, 30];
const BLUE: Rgb = [30, 30, 220];
const YELLOW: Rgb = [230, 220, 30];

/** 200 × 100 upright picture with a different colour in each quadrant. */
async function quadrants(): Promise<Buffer> {
  const [w, h] = [200, 100];
  const raw = Buffer.alloc(w * h * 3);
  for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) raw.set(y < h / 2 ? (x < w / 2 ? RED : GREEN) : x < w / 2 ? BLUE : YELLOW, (y * w + x) * 3);
  return sharp(raw, { raw: { width: w, height: h, channels: 3 } })
    .jpeg({ quality: 100, chromaSubsampling: "4:4:4" })
    .toBuffer();
}

async function storedCorners(jpeg: Buffer) {
  const { data, info } = await sharp(jpeg).raw().toBuffer({ resolveWithObject: true });
  const at = (x: number, y: number) => {
    const i = (y * info.width + x) * info.channels;
    return [data[i], data[i + 1], data[i + 2]];
  };
  const nearest = (c: number[]) =>
    (
      [
        ["red", RED],
        ["green", GREEN],
        ["blue", BLUE],
        ["yellow", YELLOW],
      ] as const
    ).reduce(
      (best, [name, ref]) => {
        const d = ref.reduce((s, v, k) => s + (v - c[k]) ** 2, 0);
        return d < best.d ? { name, d } : best;
      },
      { name: "", d: Infinity },
    ).name;
  const m = 5;
  return { size: [info.width, info.height], topLeft: nearest(at(m, m)), topRight: nearest(at(info.width - m, m)), bottomLeft: nearest(at(m, info.height - m)) };
}

describe("demo photos shot with the phone held another way", () => {
  // CIPA DC-008 (Exif 2.3) Orientation: 3 = 0th row at the visual bottom, 0th column at the visual
  // right; 6 = 0th row is the visual right-hand side, 0th column the visual top; 8 = 0th row is
  // the visual left-hand side, 0th column the visual bottom. (a) So for 6 the stored raster's
  // top-left pixel is the upright top-right, its top-right the upright bottom-right and its
  // bottom-left the upright top-left; likewise for 3 and 8.
  it.each([
    [3, [200, 100], { topLeft: "yellow", topRight: "blue", bottomLeft: "green" }],
    [6, [100, 200], { topLeft: "green", topRight: "yellow", bottomLeft: "red" }],
    [8, [100, 200], { topLeft: "blue", topRight: "red", bottomLeft: "yellow" }],
  ] as const)("orientation %i stores the raster that Exif turns upright", async (orientation, size, corners) => {
    const stored = await asCameraJpeg(await quadrants(), { orientation, capturedAt: new Date("2026-11-20T08:00:00Z"), offset: "+01:00" });
    expect((await sharp(stored).metadata()).orientation).toBe(orientation);
    expect(await storedCorners(stored)).toEqual({ size, ...corners });
    const upright = await normalizePhoto(stored);
    expect([upright.width, upright.height]).toEqual([200, 100]);
  });

  it("carries the capture time as local wall-clock time with its offset", async () => {
    const stored = await asCameraJpeg(await quadrants(), { orientation: 1, capturedAt: new Date("2026-11-20T08:00:00Z"), offset: "+01:00" });
    expect(readExifCaptureTime((await sharp(stored).metadata()).exif)).toEqual({ time: new Date("2026-11-20T08:00:00Z"), offset: "+01:00" });
  });

  it("renders a part on a backdrop as a JPEG that intake accepts", async () => {
    const jpeg = await renderPartPhoto({ kind: "display", viewKey: "screen-black", defects: ["stuck-pixel"], seed: 5, width: 400, height: 300 });
    const n = await normalizePhoto(jpeg);
    expect([n.format, n.width, n.height]).toEqual(["jpeg", 400, 300]);
  });

  it("returns the planted defects' regions where the marks are drawn", async () => {
    const photo = await renderAnnotatedPartPhoto({ kind: "rear-camera", viewKey: "back", defects: ["scratch", "stain", "crack"], seed: 11, width: 1600, height: 1200 });
    expect(photo.regions.map((r) => r.defect)).toEqual(["scratch", "stain", "crack", "crack"]);
    expect(await renderPartPhoto({ kind: "rear-camera", viewKey: "back", defects: ["scratch", "stain", "crack"], seed: 11, width: 1600, height: 1200 })).toEqual(photo.jpeg);
    const { data, info } = await sharp(photo.jpeg).raw().toBuffer({ resolveWithObject: true });
    const meanRgb = (shape: Shape) => {
      const spans = shapeSpans(shape, info);
      const sum = [0, 0, 0];
      let n = 0;
      for (let k = 0; k < spans.rowCount; k++) {
        for (let i = spans.offsets[k]; i < spans.offsets[k + 1]; i += 2) {
          for (let x = spans.cols[i]; x < spans.cols[i + 1]; x++, n++) for (let c = 0; c < 3; c++) sum[c] += data[((spans.top + k) * info.width + x) * 3 + c];
        }
      }
      return sum.map((v) => v / n);
    };
    const scratch = photo.regions[0].shape;
    if (scratch.kind !== "line") throw new Error("a scratch is marked with a Line");
    // The light scratch on the dark camera body: its Line is brighter than the same path shifted off it.
    const beside: Shape = { ...scratch, points: scratch.points.map(([x, y]) => [x + 25, y + 25]) };
    expect(meanRgb(scratch)[1]).toBeGreaterThan(meanRgb(beside)[1] + 15);
    // The brown stain (#8a6a3a at 45 %): redder than blue inside its Outline.
    const [r, , b] = meanRgb(photo.regions[1].shape);
    expect(r - b).toBeGreaterThan(10);
  }, 60_000);
});
