/**
 * Suggested pixel-fault candidates on a photo of a screen showing one uniform test colour. These
 * are suggestions: the inspector accepts (turns into a Spot) or dismisses each one.
 *
 * Method: each colour channel minus a median-filtered copy (libvips median, `medianSize` square)
 * leaves pixel-scale outliers; a channel's threshold is max(`sigmas` × its robust noise σ,
 * `minContrast`) for seeds and `lowRatio` of that for growing (hysteresis). Seeds and the
 * 8-connected weaker pixels around them form one candidate. Groups larger than `maxFaultAreaPx`
 * are not pixel-scale (smudges, edges, reflections) and are only counted.
 *
 * Size, centre and radius come from the seed pixels only (the weak fringe wanders with noise). A
 * candidate within 8 px of one 2.5 × stronger is taken as JPEG ringing and dropped (so is, rarely,
 * a real faint fault beside a strong one: the strong one still shows the inspector where to look).
 *
 * Kind: the candidate's summed deviation per channel over its box plus 2 px (sums survive blur and
 * JPEG ringing), divided by the room each channel had (255 − background up, background down).
 * If every channel that could move in the strongest channel's direction moved at least half as
 * much, it is `pixel-lit` (up) or `pixel-dark` (down); otherwise `pixel-subpixel`. Limits of the
 * method: on a single-primary screen (pure green) a dead green element looks like a dead pixel
 * and is suggested as `pixel-dark`; JPEG 4:2:0 chroma subsampling smears one sub-pixel's colour
 * over about 16 × 16 px, so such faults may come back as lit/dark — shoot sub-pixel checks
 * lossless or 4:4:4, on white, black and each primary.
 *
 * Noise σ per channel: 1.4826 × the median |residual| on up to four 64-row sample bands (MAD, so
 * the few faults and edges of a test-screen photo barely move it).
 */
import sharp, { type Sharp } from "sharp";
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { imagingError } from "@/lib/imaging/otsu";
import { PIXEL_DARK, PIXEL_LIT, PIXEL_SUBPIXEL } from "@/lib/measure/pixel-faults";

const optionsSchema = z.object({
  medianSize: z.number().int().min(3).max(25).refine((v) => v % 2 === 1, "medianSize must be odd.").default(9),
  sigmas: z.number().positive().default(6),
  minContrast: z.number().min(1).max(255).default(24),
  lowRatio: z.number().gt(0).max(1).default(0.5),
  /** Default: a third of the median window (beyond that the median no longer sees background). */
  maxFaultAreaPx: z.number().int().positive().optional(),
  /** Search only this box of the upright photo (e.g. the active area); results stay in photo px. */
  within: z.object({ x: z.number().int().min(0), y: z.number().int().min(0), width: z.number().int().positive(), height: z.number().int().positive() }).optional(),
  maxCandidates: z.number().int().positive().default(500),
  /** Raw RGB plus a mask costs about 4 bytes per pixel. */
  limitInputPixels: z.number().int().positive().default(50_000_000),
});
export type PixelCandidateOptions = z.input<typeof optionsSchema>;

export type PixelCandidateKind = typeof PIXEL_LIT | typeof PIXEL_DARK | typeof PIXEL_SUBPIXEL;

export type PixelCandidate = {
  /** Centre in upright-photo pixel coordinates (pixel i spans [i, i+1)). */
  x: number;
  y: number;
  /** Smallest disc about the centre covering every seed (over-threshold) pixel of the candidate. */
  radius: number;
  kind: PixelCandidateKind;
  /** Strongest channel's deviation from the local background as a share of its room, 0–1. */
  score: number;
  areaPx: number;
};

export type PixelCandidateResult = {
  /** The box of the upright photo that was searched (the whole photo unless `within` was given). */
  searched: { x: number; y: number; width: number; height: number };
  candidates: PixelCandidate[];
  noiseSigma: [number, number, number];
  seedThreshold: [number, number, number];
  /** Outlier groups too large to be a pixel fault (not returned). */
  largeGroups: number;
  /** Weak candidates next to a much stronger one (compression ringing), not returned. */
  droppedAsRinging: number;
  /** More than `maxCandidates` were found; the weakest were left out. */
  truncated: boolean;
};

const STRIP_ROWS = 1024;
const HEADROOM_MARGIN = 16;
const KIND_RATIO = 0.5;
const SUM_PAD = 2;
const RINGING_DISTANCE = 8;
const RINGING_RATIO = 0.4;
/** Groups with more pixels than this (seeds and fringe) are never pixel-scale. */
const MAX_GROUP_PX = 4096;

type Rgb = { data: Buffer; width: number; height: number };

/** Median filter of rows [from, to) of the image (libvips reads only what it needs). */
function medianRows({ data, width, height }: Rgb, medianSize: number, from: number, to: number): Promise<Buffer> {
  return sharp(data, { raw: { width, height, channels: 3 }, limitInputPixels: false })
    .extract({ left: 0, top: from, width, height: to - from })
    .median(medianSize)
    .raw()
    .toBuffer();
}

/** Median of |value| from a histogram of integer |values|, interpolated inside the median's bin. */
function interpolatedMedian(histogram: Uint32Array, total: number): number {
  let seen = 0;
  for (let level = 0; level < histogram.length; level++) {
    const count = histogram[level];
    if (count > 0 && (seen + count) * 2 >= total) {
      // Bin 0 holds |r| in [0, 0.5), bin k holds [k − 0.5, k + 0.5).
      const low = level === 0 ? 0 : level - 0.5;
      const span = level === 0 ? 0.5 : 1;
      return low + (span * (total / 2 - seen)) / count;
    }
    seen += count;
  }
  return 0;
}

/** Robust σ per channel of the residual (image − median) on up to 4 sample bands of 64 rows. */
async function residualSigma(rgb: Rgb, medianSize: number): Promise<[number, number, number]> {
  const { data, width, height } = rgb;
  const half = (medianSize - 1) / 2;
  const bandRows = Math.min(64, height);
  const bands = Math.min(4, Math.ceil(height / bandRows));
  const histograms = [new Uint32Array(256), new Uint32Array(256), new Uint32Array(256)];
  let samples = 0;
  for (let band = 0; band < bands; band++) {
    const top = Math.round(((height - bandRows) * (band + 0.5)) / bands);
    const from = Math.max(0, top - half);
    const median = await medianRows(rgb, medianSize, from, Math.min(height, top + bandRows + half));
    for (let y = top; y < top + bandRows; y++) {
      for (let x = 0, i = y * width * 3, m = (y - from) * width * 3; x < width; x++, i += 3, m += 3) {
        for (let c = 0; c < 3; c++) histograms[c][Math.abs(data[i + c] - median[m + c])]++;
        samples++;
      }
    }
  }
  // σ = 1.4826 × MAD for normal noise; the residual's median is 0 on a uniform screen.
  return histograms.map((histogram) => 1.4826 * interpolatedMedian(histogram, samples)) as [number, number, number];
}

/** 0 = normal, 1 = over the low threshold, 2 = over the seed threshold, per pixel. */
async function outlierLevels(rgb: Rgb, medianSize: number, high: number[], low: number[]): Promise<Uint8Array> {
  const { data, width, height } = rgb;
  const levels = new Uint8Array(width * height);
  const half = (medianSize - 1) / 2;
  for (let top = 0; top < height; top += STRIP_ROWS) {
    const bottom = Math.min(height, top + STRIP_ROWS);
    const from = Math.max(0, top - half);
    const to = Math.min(height, bottom + half);
    const median = await medianRows(rgb, medianSize, from, to);
    for (let y = top; y < bottom; y++) {
      for (let x = 0, i = y * width * 3, m = (y - from) * width * 3; x < width; x++, i += 3, m += 3) {
        let level = 0;
        for (let c = 0; c < 3; c++) {
          const deviation = Math.abs(data[i + c] - median[m + c]);
          if (deviation >= high[c]) level = 2;
          else if (deviation >= low[c] && level === 0) level = 1;
        }
        levels[y * width + x] = level;
      }
    }
  }
  return levels;
}

/** Per-channel median of a box of the image (the local background of a candidate). */
function boxMedian({ data, width }: Rgb, x0: number, y0: number, x1: number, y1: number): number[] {
  const histograms = [new Uint32Array(256), new Uint32Array(256), new Uint32Array(256)];
  for (let y = y0; y <= y1; y++) for (let x = x0; x <= x1; x++) for (let c = 0; c < 3; c++) histograms[c][data[(y * width + x) * 3 + c]]++;
  const half = ((x1 - x0 + 1) * (y1 - y0 + 1)) / 2;
  return histograms.map((histogram) => {
    let seen = 0;
    let level = 0;
    while (level < 255 && (seen += histogram[level]) < half) level++;
    return level;
  });
}

function classify(sums: number[], background: number[]): PixelCandidateKind {
  const up = background.map((b) => b < 255 - HEADROOM_MARGIN);
  const down = background.map((b) => b > HEADROOM_MARGIN);
  const moved = sums.map((s, c) => (s >= 0 ? (up[c] ? s / (255 - background[c]) : 0) : down[c] ? s / background[c] : 0));
  let strongest = 0;
  for (let c = 1; c < 3; c++) if (Math.abs(moved[c]) > Math.abs(moved[strongest])) strongest = c;
  const peak = Math.abs(moved[strongest]);
  if (peak === 0) return sums.reduce((a, b) => a + b, 0) >= 0 ? PIXEL_LIT : PIXEL_DARK;
  const direction = Math.sign(moved[strongest]);
  const couldMove = direction > 0 ? up : down;
  const allMoved = [0, 1, 2].every((c) => !couldMove[c] || direction * moved[c] >= KIND_RATIO * peak);
  const opposite = [0, 1, 2].some((c) => -direction * moved[c] >= KIND_RATIO * peak);
  if (!allMoved || opposite) return PIXEL_SUBPIXEL;
  return direction > 0 ? PIXEL_LIT : PIXEL_DARK;
}

/** A deviation as a share of the room the channel had in that direction (floored at the margin). */
function shareOfRoom(deviation: number, background: number): number {
  const room = deviation >= 0 ? 255 - background : background;
  return Math.min(1, Math.abs(deviation) / Math.max(HEADROOM_MARGIN, room));
}

/**
 * Centre and radius from the seed pixels (centre weighted by each one's strongest share of room;
 * the weak fringe wanders with noise), kind from the sums over the whole group's box.
 */
function describeGroup(rgb: Rgb, members: number[], seeds: number[], medianSize: number, offsetX: number, offsetY: number): PixelCandidate {
  const { data, width, height } = rgb;
  let minX = width, minY = height, maxX = 0, maxY = 0;
  for (const index of members) {
    const x = index % width;
    const y = (index - x) / width;
    minX = Math.min(minX, x); maxX = Math.max(maxX, x); minY = Math.min(minY, y); maxY = Math.max(maxY, y);
  }
  const half = (medianSize - 1) / 2;
  const background = boxMedian(rgb, Math.max(0, minX - half), Math.max(0, minY - half), Math.min(width - 1, maxX + half), Math.min(height - 1, maxY + half));
  const sums = [0, 0, 0];
  for (let y = Math.max(0, minY - SUM_PAD); y <= Math.min(height - 1, maxY + SUM_PAD); y++) {
    for (let x = Math.max(0, minX - SUM_PAD); x <= Math.min(width - 1, maxX + SUM_PAD); x++) {
      for (let c = 0; c < 3; c++) sums[c] += data[(y * width + x) * 3 + c] - background[c];
    }
  }
  const strength = (index: number) => Math.max(...[0, 1, 2].map((c) => shareOfRoom(data[index * 3 + c] - background[c], background[c])));
  let weight = 0, sumX = 0, sumY = 0, score = 0;
  for (const index of seeds) {
    const w = strength(index);
    const x = index % width;
    sumX += w * (x + 0.5);
    sumY += w * ((index - x) / width + 0.5);
    weight += w;
    score = Math.max(score, w);
  }
  const cx = sumX / weight;
  const cy = sumY / weight;
  let radius = 0;
  for (const index of seeds) {
    const x = index % width;
    const y = (index - x) / width;
    // Farthest corner of this pixel from the centre.
    radius = Math.max(radius, Math.hypot(Math.max(Math.abs(x - cx), Math.abs(x + 1 - cx)), Math.max(Math.abs(y - cy), Math.abs(y + 1 - cy))));
  }
  const round = (v: number) => Math.round(v * 1000) / 1000;
  return { x: round(cx + offsetX), y: round(cy + offsetY), radius: round(radius), kind: classify(sums, background), score: round(score), areaPx: seeds.length };
}

/**
 * Drops candidates within RINGING_DISTANCE px of one at least 1 / RINGING_RATIO times stronger:
 * JPEG ringing around a high-contrast fault leaves weak islands inside its 8 × 8 block. `sorted`
 * must be strongest first.
 */
function dropRinging(sorted: PixelCandidate[]): PixelCandidate[] {
  const cellOf = (v: number) => Math.floor(v / RINGING_DISTANCE);
  const grid = new Map<string, PixelCandidate[]>();
  const kept: PixelCandidate[] = [];
  for (const candidate of sorted) {
    const cx = cellOf(candidate.x);
    const cy = cellOf(candidate.y);
    let ringing = false;
    for (let gy = cy - 1; gy <= cy + 1 && !ringing; gy++) {
      for (let gx = cx - 1; gx <= cx + 1 && !ringing; gx++) {
        ringing = (grid.get(`${gx},${gy}`) ?? []).some(
          (strong) => candidate.score < RINGING_RATIO * strong.score && Math.hypot(strong.x - candidate.x, strong.y - candidate.y) <= RINGING_DISTANCE,
        );
      }
    }
    if (ringing) continue;
    kept.push(candidate);
    const key = `${cx},${cy}`;
    grid.set(key, [...(grid.get(key) ?? []), candidate]);
  }
  return kept;
}

async function decodeRgb(input: Buffer, limitInputPixels: number, within?: { x: number; y: number; width: number; height: number }): Promise<Rgb> {
  if (!Buffer.isBuffer(input) || input.length === 0) throw new AppError("bad_request", "No photo bytes were given.");
  let pipeline: Sharp;
  try {
    pipeline = sharp(input, { limitInputPixels, autoOrient: true });
    if (within) {
      const meta = await sharp(input, { limitInputPixels }).metadata();
      const width = meta.autoOrient?.width ?? meta.width ?? 0;
      const height = meta.autoOrient?.height ?? meta.height ?? 0;
      if (within.x + within.width > width || within.y + within.height > height) {
        throw new AppError("bad_request", `The search box ${within.width} × ${within.height} at (${within.x}, ${within.y}) does not fit in the ${width} × ${height} photo.`);
      }
      pipeline = pipeline.extract({ left: within.x, top: within.y, width: within.width, height: within.height });
    }
    const { data, info } = await pipeline.removeAlpha().toColourspace("srgb").raw().toBuffer({ resolveWithObject: true });
    if (info.channels !== 3) throw new Error(`expected 3 channels, got ${info.channels}`);
    return { data, width: info.width, height: info.height };
  } catch (error) {
    throw error instanceof AppError ? error : imagingError(error);
  }
}

/** Finds pixel-scale outliers on a uniform test screen and suggests them as pixel-fault Spots. */
export async function suggestPixelCandidates(input: Buffer, options: PixelCandidateOptions = {}): Promise<PixelCandidateResult> {
  const parsed = optionsSchema.safeParse(options);
  if (!parsed.success) throw new AppError("bad_request", `Invalid pixel-candidate options: ${parsed.error.issues[0].message}`);
  const { medianSize, sigmas, minContrast, lowRatio, within, maxCandidates, limitInputPixels } = parsed.data;
  const maxFaultAreaPx = parsed.data.maxFaultAreaPx ?? Math.floor((medianSize * medianSize) / 3);

  const rgb = await decodeRgb(input, limitInputPixels, within);
  const { width, height } = rgb;
  const sigma = await residualSigma(rgb, medianSize);
  const high = sigma.map((s) => Math.max(sigmas * s, minContrast));
  const low = high.map((h) => lowRatio * h);
  const levels = await outlierLevels(rgb, medianSize, high, low);

  const candidates: PixelCandidate[] = [];
  let largeGroups = 0;
  const queue: number[] = [];
  for (let seed = 0; seed < levels.length; seed++) {
    if (levels[seed] !== 2) continue;
    const seeds: number[] = [];
    levels[seed] = 0;
    queue.length = 0;
    queue.push(seed);
    seeds.push(seed);
    for (let head = 0; head < queue.length; head++) {
      const index = queue[head];
      const x = index % width;
      const y = (index - x) / width;
      for (let ny = Math.max(0, y - 1); ny <= Math.min(height - 1, y + 1); ny++) {
        for (let nx = Math.max(0, x - 1); nx <= Math.min(width - 1, x + 1); nx++) {
          const n = ny * width + nx;
          if (levels[n] === 0) continue;
          if (levels[n] === 2) seeds.push(n);
          levels[n] = 0;
          queue.push(n);
        }
      }
    }
    // Size is judged on the seed pixels: a weak fringe (JPEG chroma smear) does not disqualify a fault.
    if (seeds.length > maxFaultAreaPx || queue.length > MAX_GROUP_PX) largeGroups++;
    else candidates.push(describeGroup(rgb, queue.slice(), seeds, medianSize, within?.x ?? 0, within?.y ?? 0));
  }
  candidates.sort((a, b) => b.score - a.score);
  const kept = dropRinging(candidates);
  const round = (v: number) => Math.round(v * 100) / 100;
  return {
    searched: { x: within?.x ?? 0, y: within?.y ?? 0, width, height },
    candidates: kept.slice(0, maxCandidates),
    noiseSigma: sigma.map(round) as [number, number, number],
    seedThreshold: high.map(round) as [number, number, number],
    largeGroups,
    droppedAsRinging: candidates.length - kept.length,
    truncated: kept.length > maxCandidates,
  };
}
