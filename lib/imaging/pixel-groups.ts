/**
 * Describing one group of outlier pixels as a pixel-fault candidate (centre, radius, kind, score)
 * and dropping JPEG ringing around strong ones. Pure; lib/imaging/pixel-candidates.ts finds the
 * groups and states the method.
 */
import { PIXEL_DARK, PIXEL_LIT, PIXEL_SUBPIXEL } from "@/lib/measure/pixel-faults";
import type { PixelCandidate, PixelCandidateKind } from "./pixel-candidates";

export type Rgb = { data: Buffer; width: number; height: number };

const HEADROOM_MARGIN = 16;
const KIND_RATIO = 0.5;
const SUM_PAD = 2;
const RINGING_DISTANCE = 8;
const RINGING_RATIO = 0.4;

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
export function describeGroup(rgb: Rgb, members: number[], seeds: number[], medianSize: number, offsetX: number, offsetY: number): PixelCandidate {
  const { data, width, height } = rgb;
  let minX = width,
    minY = height,
    maxX = 0,
    maxY = 0;
  for (const index of members) {
    const x = index % width;
    const y = (index - x) / width;
    minX = Math.min(minX, x);
    maxX = Math.max(maxX, x);
    minY = Math.min(minY, y);
    maxY = Math.max(maxY, y);
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
  let weight = 0,
    sumX = 0,
    sumY = 0,
    score = 0;
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
export function dropRinging(sorted: PixelCandidate[]): PixelCandidate[] {
  const cellOf = (v: number) => Math.floor(v / RINGING_DISTANCE);
  const grid = new Map<string, PixelCandidate[]>();
  const kept: PixelCandidate[] = [];
  for (const candidate of sorted) {
    const cx = cellOf(candidate.x);
    const cy = cellOf(candidate.y);
    let ringing = false;
    for (let gy = cy - 1; gy <= cy + 1 && !ringing; gy++) {
      for (let gx = cx - 1; gx <= cx + 1 && !ringing; gx++) {
        ringing = (grid.get(`${gx},${gy}`) ?? []).some((strong) => candidate.score < RINGING_RATIO * strong.score && Math.hypot(strong.x - candidate.x, strong.y - candidate.y) <= RINGING_DISTANCE);
      }
    }
    if (ringing) continue;
    kept.push(candidate);
    const key = `${cx},${cy}`;
    grid.set(key, [...(grid.get(key) ?? []), candidate]);
  }
  return kept;
}
