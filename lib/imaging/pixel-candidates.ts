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
 * Where: only inside `area` (the Surface and the view's active-screen zone, an edge band in from
 * their edges; lib/imaging/pixel-search-area.ts), or the `within` box, or the whole photo.
 *
 * Speed: the median is what costs (libvips' 9 × 9 median over 12 MP takes seconds), and a fault
 * is rare, so it runs only where one may be. A cheap pass compares each 16 × 16 tile's darkest
 * and brightest value per channel with the tile's mean and marks tiles where one deviates by at
 * least PREFILTER_RATIO of the seed threshold; the exact median test then runs on those tiles and
 * 16 px around them only (a group stays that close to its seeds, or it is not pixel-sized). A seed
 * deviates from the median by ≥ the threshold; the tile mean differs from the median by the
 * fault's own share of the tile (1/256 per faulty pixel) plus noise averaged over 256 pixels, far
 * less than the quarter kept in hand. Where more than MAX_WORK_SHARE of the area needs the exact
 * test (a busy screen), it runs over the whole area as before.
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
 * Noise σ per channel: 1.4826 × the median |residual| over up to nine 64 × 64 patches spread over
 * the searched area (MAD, so the few faults and edges of a test-screen photo barely move it).
 */
import sharp, { type Sharp } from "sharp";
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { imagingError } from "@/lib/imaging/otsu";
import type { PIXEL_DARK, PIXEL_LIT, PIXEL_SUBPIXEL } from "@/lib/measure/pixel-faults";
import { describeGroup, dropRinging, type Rgb } from "./pixel-groups";
import { outlierGroups, outlierLevels, residualSigma, suspectTiles, TILE, workBoxes } from "./pixel-outliers";
import { compileSearchArea, searchableTiles, type Box, type CompiledArea, type PixelSearchArea } from "./pixel-search-area";

const pointSchema = z.tuple([z.number().finite(), z.number().finite()]);
const optionsSchema = z.object({
  medianSize: z
    .number()
    .int()
    .min(3)
    .max(25)
    .refine((v) => v % 2 === 1, "medianSize must be odd.")
    .default(9),
  sigmas: z.number().positive().default(6),
  minContrast: z.number().min(1).max(255).default(24),
  lowRatio: z.number().gt(0).max(1).default(0.5),
  /** Default: a third of the median window (beyond that the median no longer sees background). */
  maxFaultAreaPx: z.number().int().positive().optional(),
  /** Search only this box of the upright photo; results stay in photo px. */
  within: z.object({ x: z.number().int().min(0), y: z.number().int().min(0), width: z.number().int().positive(), height: z.number().int().positive() }).optional(),
  /** Search only inside these regions, an edge band in from their edges (see pixel-search-area.ts). */
  area: z
    .object({
      regions: z
        .array(z.object({ polygons: z.array(z.array(pointSchema).min(3)).min(1) }))
        .min(1)
        .max(8),
      edgeBandPx: z.number().min(0).max(2000),
    })
    .optional(),
  maxCandidates: z.number().int().positive().default(500),
  /** Raw RGB plus a mask costs about 4 bytes per pixel. */
  limitInputPixels: z.number().int().positive().default(50_000_000),
});
export type PixelCandidateOptions = z.input<typeof optionsSchema>;
export type { PixelSearchArea };

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
  /** The box of the upright photo that was searched (the whole photo unless limited). */
  searched: Box;
  candidates: PixelCandidate[];
  noiseSigma: [number, number, number];
  seedThreshold: [number, number, number];
  /** Outlier groups too large to be a pixel fault (not returned). */
  largeGroups: number;
  /** Weak candidates next to a much stronger one (compression ringing), not returned. */
  droppedAsRinging: number;
  /** Candidates found within the edge band of the search area (not returned). */
  droppedNearEdge: number;
  /** More than `maxCandidates` were found; the weakest were left out. */
  truncated: boolean;
};

const PREFILTER_RATIO = 0.75;
const MAX_WORK_SHARE = 0.5;
/** Groups with more pixels than this (seeds and fringe) are never pixel-scale. */
const MAX_GROUP_PX = 4096;

async function decodeRgb(input: Buffer, limitInputPixels: number, region: (size: { width: number; height: number }) => Box): Promise<{ rgb: Rgb; box: Box }> {
  if (!Buffer.isBuffer(input) || input.length === 0) throw new AppError("bad_request", "No photo bytes were given.");
  try {
    const meta = await sharp(input, { limitInputPixels }).metadata();
    const size = { width: meta.autoOrient?.width ?? meta.width ?? 0, height: meta.autoOrient?.height ?? meta.height ?? 0 };
    const box = region(size);
    if (box.width === 0 || box.height === 0) return { rgb: { data: Buffer.alloc(0), width: 0, height: 0 }, box: { x: 0, y: 0, width: 0, height: 0 } };
    if (box.x + box.width > size.width || box.y + box.height > size.height) {
      throw new AppError("bad_request", `The search box ${box.width} × ${box.height} at (${box.x}, ${box.y}) does not fit in the ${size.width} × ${size.height} photo.`);
    }
    let pipeline: Sharp = sharp(input, { limitInputPixels, autoOrient: true });
    if (box.x !== 0 || box.y !== 0 || box.width !== size.width || box.height !== size.height) pipeline = pipeline.extract({ left: box.x, top: box.y, width: box.width, height: box.height });
    const { data, info } = await pipeline.removeAlpha().toColourspace("srgb").raw().toBuffer({ resolveWithObject: true });
    if (info.channels !== 3) throw new Error(`expected 3 channels, got ${info.channels}`);
    return { rgb: { data, width: info.width, height: info.height }, box };
  } catch (error) {
    throw error instanceof AppError ? error : imagingError(error);
  }
}

/** The searched box: the area's box (within `within`, if both), `within`, or the whole photo. */
function searchBox(area: CompiledArea | null, within: Box | undefined, size: { width: number; height: number }): Box {
  if (!area) return within ?? { x: 0, y: 0, width: size.width, height: size.height };
  const limit = within ?? { x: 0, y: 0, width: size.width, height: size.height };
  const x = Math.max(area.box.x, limit.x);
  const y = Math.max(area.box.y, limit.y);
  return { x, y, width: Math.max(0, Math.min(area.box.x + area.box.width, limit.x + limit.width) - x), height: Math.max(0, Math.min(area.box.y + area.box.height, limit.y + limit.height) - y) };
}

/** Finds pixel-scale outliers on a uniform test screen and suggests them as pixel-fault Spots. */
export async function suggestPixelCandidates(input: Buffer, options: PixelCandidateOptions = {}): Promise<PixelCandidateResult> {
  const parsed = optionsSchema.safeParse(options);
  if (!parsed.success) throw new AppError("bad_request", `Invalid pixel-candidate options: ${parsed.error.issues[0].message}`);
  const { medianSize, sigmas, minContrast, lowRatio, within, maxCandidates, limitInputPixels } = parsed.data;
  const maxFaultAreaPx = parsed.data.maxFaultAreaPx ?? Math.floor((medianSize * medianSize) / 3);
  const edgeBand = parsed.data.area?.edgeBandPx ?? 0;
  let area: CompiledArea | null = null;
  const { rgb, box } = await decodeRgb(input, limitInputPixels, (size) => {
    area = parsed.data.area ? compileSearchArea(parsed.data.area, size) : null;
    return searchBox(area, within, size);
  });
  const empty = {
    searched: box,
    candidates: [],
    noiseSigma: [0, 0, 0] as [number, number, number],
    seedThreshold: [0, 0, 0] as [number, number, number],
    largeGroups: 0,
    droppedAsRinging: 0,
    droppedNearEdge: 0,
    truncated: false,
  };
  if (box.width === 0 || box.height === 0) return empty;
  const compiled = area as CompiledArea | null;
  const tiles = compiled
    ? searchableTiles(compiled, box, TILE, edgeBand)
    : { columns: Math.ceil(box.width / TILE), rows: Math.ceil(box.height / TILE), usable: new Uint8Array(Math.ceil(box.width / TILE) * Math.ceil(box.height / TILE)).fill(1) };
  const usableAt = (x: number, y: number) => tiles.usable[Math.min(tiles.rows - 1, Math.floor(y / TILE)) * tiles.columns + Math.min(tiles.columns - 1, Math.floor(x / TILE))] === 1;
  const sigma = await residualSigma(rgb, medianSize, usableAt);
  const high = sigma.map((s) => Math.max(sigmas * s, minContrast));
  const low = high.map((h) => lowRatio * h);
  const suspect = suspectTiles(
    rgb,
    tiles,
    high.map((h) => PREFILTER_RATIO * h),
  );
  let boxes = workBoxes(suspect, tiles.columns, tiles.rows, rgb);
  const work = boxes.reduce((sum, b) => sum + b.width * b.height, 0);
  if (work > MAX_WORK_SHARE * rgb.width * rgb.height) boxes = [{ x: 0, y: 0, width: rgb.width, height: rgb.height }];
  const levels = await outlierLevels(rgb, medianSize, boxes, high, low);

  const candidates: PixelCandidate[] = [];
  let largeGroups = 0;
  let droppedNearEdge = 0;
  boxes.forEach((workBox, k) => {
    for (const { seeds, members } of outlierGroups(levels[k], workBox, rgb.width)) {
      // Size is judged on the seed pixels: a weak fringe (JPEG chroma smear) does not disqualify a fault.
      if (seeds.length > maxFaultAreaPx || members.length > MAX_GROUP_PX) {
        largeGroups++;
        continue;
      }
      const candidate = describeGroup(rgb, members, seeds, medianSize, box.x, box.y);
      if (compiled && compiled.classify(candidate.x, candidate.y) !== "inside") droppedNearEdge++;
      else candidates.push(candidate);
    }
  });
  candidates.sort((a, b) => b.score - a.score);
  const kept = dropRinging(candidates);
  const round = (v: number) => Math.round(v * 100) / 100;
  return {
    searched: box,
    candidates: kept.slice(0, maxCandidates),
    noiseSigma: sigma.map(round) as [number, number, number],
    seedThreshold: high.map(round) as [number, number, number],
    largeGroups,
    droppedAsRinging: candidates.length - kept.length,
    droppedNearEdge,
    truncated: kept.length > maxCandidates,
  };
}
