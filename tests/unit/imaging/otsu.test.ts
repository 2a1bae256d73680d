import { describe, expect, it } from "vitest";
import sharp from "sharp";
import { Image } from "image-js";
import { greyscaleHistogram, histogramOfBytes, otsuSplit, otsuThreshold } from "@/lib/imaging/otsu";
import { mulberry32 as prng } from "@/support/prng";

function gaussian(random: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
}

/** Pixels whose histogram is exactly `histogram` (levels in order; the layout does not matter to Otsu). */
function pixelsOf(histogram: number[]): Uint8Array {
  const pixels: number[] = [];
  histogram.forEach((count, level) => {
    for (let i = 0; i < count; i++) pixels.push(level);
  });
  return Uint8Array.from(pixels);
}

/** Compares our mask (level >= first foreground level) with image-js's Otsu mask on the same pixels. */
function expectSameMaskAsImageJs(pixels: Uint8Array, width: number, height: number) {
  const ours = otsuThreshold(histogramOfBytes(pixels));
  expect(ours).not.toBeNull();
  const image = new Image(width, height, { colorModel: "GREY", data: pixels });
  const theirs = image.threshold({ algorithm: "otsu" });
  let foreground = 0;
  for (let i = 0; i < pixels.length; i++) {
    expect(pixels[i] >= ours! ? 1 : 0).toBe(theirs.getBitByIndex(i));
    foreground += pixels[i] >= ours! ? 1 : 0;
  }
  // Not a trivial mask: both classes are present.
  expect(foreground).toBeGreaterThan(0);
  expect(foreground).toBeLessThan(pixels.length);
}

describe("otsuSplit — published worked example", () => {
  // Worked example, docs/references.md "Areas and images": 6 × 6 image, levels 0–5, histogram
  // [8, 7, 2, 6, 9, 4] → foreground levels 3–5, within-class variance 0.4909, between-class 2.6287
  // (b for the publication, a for the computation).
  const histogram = [8, 7, 2, 6, 9, 4];

  it("puts levels 3–5 in the foreground (first foreground level 3)", () => {
    expect(otsuThreshold(histogram)).toBe(3); // (a) computation in docs/references.md
  });

  it("reproduces the published within- and between-class variances", () => {
    const split = otsuSplit(histogram)!;
    expect(split.withinClassVariance).toBeCloseTo(0.4909, 4); // (a) docs/references.md
    expect(split.betweenClassVariance).toBeCloseTo(2.6287, 4); // (a) docs/references.md
    // σ_W² + σ_B² = σ_T² (variance decomposition, Otsu 1979; (b) from memory, checked by arithmetic here).
    expect(split.withinClassVariance + split.betweenClassVariance).toBeCloseTo(split.totalVariance, 10);
    expect(split.background.weight).toBeCloseTo(17 / 36, 12);
    expect(split.foreground.weight).toBeCloseTo(19 / 36, 12);
  });

  it("agrees with image-js on the worked-example image (image-js reports 2, its last background level)", () => {
    const pixels = pixelsOf(histogram);
    const image = new Image(6, 6, { colorModel: "GREY", data: pixels });
    expect(image.threshold({ algorithm: "otsu" }).getBitByIndex(0)).toBe(0);
    expectSameMaskAsImageJs(pixels, 6, 6); // image-js 1.7.0 (general-purpose library)
  });
});

describe("otsuSplit — against image-js 1.7.0 on generated multi-level images", () => {
  it("bimodal noisy images of different balance and contrast", () => {
    const cases = [
      { seed: 1, dark: 60, light: 180, sd: 15, lightShare: 0.5 },
      { seed: 2, dark: 30, light: 90, sd: 12, lightShare: 0.2 },
      { seed: 3, dark: 100, light: 220, sd: 25, lightShare: 0.75 },
      { seed: 4, dark: 120, light: 140, sd: 6, lightShare: 0.4 },
    ];
    for (const { seed, dark, light, sd, lightShare } of cases) {
      const random = prng(seed);
      const pixels = new Uint8Array(80 * 60);
      for (let i = 0; i < pixels.length; i++) {
        const mean = random() < lightShare ? light : dark;
        pixels[i] = Math.max(0, Math.min(255, Math.round(mean + sd * gaussian(random))));
      }
      expectSameMaskAsImageJs(pixels, 80, 60); // image-js 1.7.0
    }
  });

  it("three-level images and images with empty levels between modes", () => {
    const histograms: number[][] = [];
    const h1 = new Array(256).fill(0);
    h1[50] = 700;
    h1[120] = 500;
    h1[200] = 1200;
    histograms.push(h1);
    const h2 = new Array(256).fill(0);
    h2[10] = 900;
    h2[100] = 30;
    h2[240] = 1470; // two big modes with a small third, wide gaps
    histograms.push(h2);
    const h3 = new Array(256).fill(0);
    for (let level = 0; level < 256; level += 17) h3[level] = 1 + ((level * 7) % 23) * 10; // sparse comb
    histograms.push(h3);
    for (const histogram of histograms) {
      const pixels = pixelsOf(histogram);
      expectSameMaskAsImageJs(pixels, pixels.length, 1); // image-js 1.7.0
    }
  });

  it("random histograms over all 256 levels", () => {
    const random = prng(42);
    for (let round = 0; round < 6; round++) {
      const pixels = new Uint8Array(64 * 64);
      const skew = 0.5 + round / 3;
      for (let i = 0; i < pixels.length; i++) pixels[i] = Math.floor(255.999 * random() ** skew);
      expectSameMaskAsImageJs(pixels, 64, 64); // image-js 1.7.0
    }
  });
});

describe("otsuSplit — rules of this implementation", () => {
  it("breaks ties towards the lowest threshold across empty levels (our rule)", () => {
    // Every cut in 1..4 splits [5, 0, 0, 0, 5] the same way; the first one is returned.
    expect(otsuThreshold([5, 0, 0, 0, 5])).toBe(1);
    expect(otsuSplit([5, 0, 0, 0, 5])!.separability).toBeCloseTo(1, 12);
  });

  it("returns null when only one level is occupied and throws on empty or bad histograms", () => {
    expect(otsuThreshold([0, 0, 9, 0])).toBeNull();
    expect(() => otsuThreshold([0, 0, 0])).toThrow(/empty/);
    expect(() => otsuThreshold([1, -1, 3])).toThrow(/level 1/);
    expect(() => otsuThreshold([4])).toThrow(/two levels/);
  });
});

describe("greyscaleHistogram (sharp raw bytes)", () => {
  it("counts every level of a greyscale PNG exactly", async () => {
    const histogram = new Array(256).fill(0);
    histogram[0] = 100;
    histogram[77] = 250;
    histogram[128] = 50;
    histogram[255] = 200;
    const png = await sharp(Buffer.from(pixelsOf(histogram)), { raw: { width: 20, height: 30, channels: 1 } })
      .png()
      .toBuffer();
    const result = await greyscaleHistogram(png);
    expect(result.width).toBe(20);
    expect(result.height).toBe(30);
    expect(result.histogram).toEqual(histogram);
  });

  it("rejects bytes that are not an image with a clear error", async () => {
    await expect(greyscaleHistogram(Buffer.from("not an image"))).rejects.toThrow(/could not be decoded/);
  });
});
