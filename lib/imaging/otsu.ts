/**
 * Otsu's threshold (Otsu 1979): split a grey-level histogram into two classes so that the
 * between-class variance σ_B² = w0·w1·(μ0 − μ1)² is largest (equivalently the within-class
 * variance σ_W² = w0·σ0² + w1·σ1² is smallest, since σ_W² + σ_B² = σ_T²).
 *
 * Meaning of the returned threshold: it is the **first foreground level**. Levels `< threshold`
 * are the background class (class 0, the darker one), levels `>= threshold` the foreground class
 * (class 1, the lighter one). Some libraries return the last background level instead
 * (threshold − 1 here); compare masks, not numbers.
 *
 * Ties: when several thresholds give the same σ_B² (within a relative 1e-12, e.g. across empty
 * levels between two modes) the **lowest** threshold wins, i.e. the cut sits just above the top
 * of the darker class.
 */
import sharp from "sharp";
import { AppError } from "@/lib/errors";

export type OtsuClass = {
  /** Share of all pixels in the class, 0–1. */
  weight: number;
  mean: number;
  /** Population variance of the levels in the class. */
  variance: number;
};

export type OtsuSplit = {
  /** First foreground level (see the file comment). */
  threshold: number;
  background: OtsuClass;
  foreground: OtsuClass;
  betweenClassVariance: number;
  withinClassVariance: number;
  totalVariance: number;
  /** σ_B² / σ_T² in [0, 1]: how well two classes explain the histogram (1 = two pure levels). */
  separability: number;
};

const TIE_TOLERANCE = 1e-12;

function validateHistogram(histogram: ArrayLike<number>): number {
  if (histogram.length < 2) throw new AppError("bad_request", "A histogram needs at least two levels.");
  let total = 0;
  for (let level = 0; level < histogram.length; level++) {
    const count = histogram[level];
    if (!Number.isFinite(count) || count < 0) {
      throw new AppError("bad_request", `Histogram count at level ${level} must be a finite number >= 0 (got ${count}).`);
    }
    total += count;
  }
  if (total === 0) throw new AppError("bad_request", "The histogram is empty (all counts are 0).");
  return total;
}

function classStats(histogram: ArrayLike<number>, from: number, to: number, total: number): OtsuClass {
  let count = 0;
  let sum = 0;
  for (let level = from; level < to; level++) {
    count += histogram[level];
    sum += level * histogram[level];
  }
  const mean = sum / count;
  let squares = 0;
  for (let level = from; level < to; level++) squares += histogram[level] * (level - mean) ** 2;
  return { weight: count / total, mean, variance: squares / count };
}

/**
 * The full Otsu split of a histogram (index = level, value = pixel count), or `null` when fewer
 * than two levels are occupied (no threshold leaves both classes non-empty). Throws on an empty
 * histogram or negative/non-finite counts.
 */
export function otsuSplit(histogram: ArrayLike<number>): OtsuSplit | null {
  const total = validateHistogram(histogram);
  let grandSum = 0;
  for (let level = 0; level < histogram.length; level++) grandSum += level * histogram[level];

  let best = -1;
  let bestThreshold = -1;
  let backgroundCount = 0;
  let backgroundSum = 0;
  for (let threshold = 1; threshold < histogram.length; threshold++) {
    backgroundCount += histogram[threshold - 1];
    backgroundSum += (threshold - 1) * histogram[threshold - 1];
    const foregroundCount = total - backgroundCount;
    if (backgroundCount === 0 || foregroundCount === 0) continue;
    const w0 = backgroundCount / total;
    const w1 = foregroundCount / total;
    const meanGap = backgroundSum / backgroundCount - (grandSum - backgroundSum) / foregroundCount;
    const between = w0 * w1 * meanGap * meanGap;
    // Strictly greater (beyond rounding noise) so that ties keep the lowest threshold.
    if (between > best * (1 + TIE_TOLERANCE) || bestThreshold < 0) {
      best = between;
      bestThreshold = threshold;
    }
  }
  if (bestThreshold < 0) return null;

  const background = classStats(histogram, 0, bestThreshold, total);
  const foreground = classStats(histogram, bestThreshold, histogram.length, total);
  const whole = classStats(histogram, 0, histogram.length, total);
  const betweenClassVariance = background.weight * foreground.weight * (background.mean - foreground.mean) ** 2;
  return {
    threshold: bestThreshold,
    background,
    foreground,
    betweenClassVariance,
    withinClassVariance: background.weight * background.variance + foreground.weight * foreground.variance,
    totalVariance: whole.variance,
    separability: whole.variance > 0 ? Math.min(1, betweenClassVariance / whole.variance) : 0,
  };
}

/** First foreground level by Otsu's method, or `null` when fewer than two levels are occupied. */
export function otsuThreshold(histogram: ArrayLike<number>): number | null {
  return otsuSplit(histogram)?.threshold ?? null;
}

/** Counts of each byte value (256 levels) in 8-bit single-channel raw pixels. */
export function histogramOfBytes(pixels: Uint8Array): number[] {
  const counts = new Array<number>(256).fill(0);
  for (let i = 0; i < pixels.length; i++) counts[pixels[i]]++;
  return counts;
}

/** Maps a sharp failure to an AppError a person can act on (pixel limit vs undecodable input). */
export function imagingError(error: unknown): AppError {
  const message = error instanceof Error ? error.message : String(error);
  if (/pixel limit/i.test(message)) {
    return new AppError("payload_too_large", "The photo has more pixels than this step accepts.", { cause: error });
  }
  return new AppError("unsupported_media_type", `The photo could not be decoded (${message}).`, { cause: error });
}

/**
 * 256-level histogram of the upright photo in greyscale (libvips' sRGB → B-W conversion), counted
 * from raw bytes because sharp's `stats()` reports no histogram.
 */
export async function greyscaleHistogram(input: Buffer, options: { limitInputPixels?: number } = {}): Promise<{ width: number; height: number; histogram: number[] }> {
  try {
    const { data, info } = await sharp(input, { limitInputPixels: options.limitInputPixels ?? 100_000_000, autoOrient: true })
      .greyscale()
      .removeAlpha()
      .raw()
      .toBuffer({ resolveWithObject: true });
    if (info.channels !== 1) throw new Error(`expected 1 channel, got ${info.channels}`);
    return { width: info.width, height: info.height, histogram: histogramOfBytes(data) };
  } catch (error) {
    throw imagingError(error);
  }
}
