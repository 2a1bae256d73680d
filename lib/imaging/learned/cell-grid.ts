/**
 * Per-pixel measurements of the working image summed into square cells (`cellSize` px), with 2-D
 * prefix sums so that any window of whole cells is summed in O(1). Every patch feature
 * (features.ts) is a window sum over these channels, which is why scoring every cell of a photo
 * costs little more than scoring a few: the pixels are visited once.
 *
 * Pixel measurements, on luma L = 0.299 R + 0.587 G + 0.114 B (ITU-R BT.601 weights; from memory):
 * - colour: L, opponent chroma cr = R − G and cb = (R + G)/2 − B, with their squares;
 * - gradient: 3 × 3 Sobel on L, its magnitude, the structure tensor (gx², gy², gx·gy) and an
 *   8-bin unsigned direction histogram weighted by magnitude;
 * - texture: rotation-invariant uniform local binary patterns (LBP riu2, Ojala, Pietikäinen &
 *   Mäenpää 2002; from memory) over the 8 neighbours with a tolerance of LBP_TOLERANCE, 10 bins;
 * - Laplacian (4-neighbour) and its square;
 * - centre versus surround: mean of the 3 × 3 box minus mean of the 9 × 9 box around the pixel
 *   (bright thin marks positive, dark ones negative), its per-cell extremes and the
 *   ridge-weighted centroid of each cell, which places a Line on the mark rather than the cell;
 * - how much of the cell lies inside the Surface.
 */
import { countSpans, type SpanSet } from "@/lib/imaging/raster/spans";
import type { WorkingImage } from "./working-image";

export const CH = {
  n: 0,
  l: 1,
  l2: 2,
  cr: 3,
  cr2: 4,
  cb: 5,
  cb2: 6,
  mag: 7,
  jxx: 8,
  jyy: 9,
  jxy: 10,
  strong: 11,
  lap: 12,
  lap2: 13,
  dogPos: 14,
  dogNeg: 15,
  inside: 16,
  ridgeW: 17,
  ridgeX: 18,
  ridgeY: 19,
  /** 8 direction bins from here. */
  dir: 20,
  /** 10 LBP bins from here. */
  lbp: 28,
} as const;
export const CHANNELS = 38;

/** Sobel magnitude above which a pixel counts as "strong gradient" (0–255 luma scale). */
const STRONG_GRADIENT = 40;
const LBP_TOLERANCE = 4;

export type CellGrid = {
  cellSize: number;
  cols: number;
  rows: number;
  /** Cell-major prefix sums: corner (x, y), channel k at ((y·(cols+1) + x)·CHANNELS + k). */
  prefix: Float64Array;
  /** Per cell: extremes of centre-versus-surround. */
  dogMax: Float32Array;
  dogMin: Float32Array;
  /** Median cell means over the Surface (or the photo): the part's own colour. */
  reference: { l: number; cr: number; cb: number };
};

/** Mean over the (2r+1)² box around each pixel, clipped at the borders (running sums, row by row). */
export function boxMeans(values: Float32Array, width: number, height: number, r: number): Float32Array {
  const across = new Float32Array(width * height);
  for (let y = 0; y < height; y++) {
    const row = y * width;
    let sum = 0;
    for (let x = 0; x < Math.min(width, r); x++) sum += values[row + x];
    for (let x = 0; x < width; x++) {
      if (x + r < width) sum += values[row + x + r];
      if (x - r - 1 >= 0) sum -= values[row + x - r - 1];
      across[row + x] = sum;
    }
  }
  const counts = new Float32Array(width);
  for (let x = 0; x < width; x++) counts[x] = Math.min(width, x + r + 1) - Math.max(0, x - r);
  const out = new Float32Array(width * height);
  const column = new Float64Array(width);
  for (let y = 0; y < Math.min(height, r); y++) for (let x = 0; x < width; x++) column[x] += across[y * width + x];
  for (let y = 0; y < height; y++) {
    const add = y + r < height ? (y + r) * width : -1;
    const drop = y - r - 1 >= 0 ? (y - r - 1) * width : -1;
    const rowsIn = Math.min(height, y + r + 1) - Math.max(0, y - r);
    const row = y * width;
    for (let x = 0; x < width; x++) {
      if (add >= 0) column[x] += across[add + x];
      if (drop >= 0) column[x] -= across[drop + x];
      out[row + x] = column[x] / (rowsIn * counts[x]);
    }
  }
  return out;
}

/** LBP riu2 code: the number of set bits when the circular pattern has at most 2 transitions, else 9. */
export const LBP_RIU2 = Uint8Array.from({ length: 256 }, (_, code) => {
  let transitions = 0;
  let ones = 0;
  for (let bit = 0; bit < 8; bit++) {
    const a = (code >> bit) & 1;
    ones += a;
    if (a !== ((code >> ((bit + 1) % 8)) & 1)) transitions++;
  }
  return transitions <= 2 ? ones : 9;
});

/** tan of 22.5°, 45°, 67.5°: the edges of the 8 unsigned direction bins. */
const TAN_22 = Math.tan(Math.PI / 8);
const TAN_67 = Math.tan((3 * Math.PI) / 8);

/** Unsigned direction bin 0–7 of (gx, gy), bin k = [k·22.5°, (k+1)·22.5°), without atan2. */
export function directionBin(gx: number, gy: number): number {
  const flip = gy < 0 || (gy === 0 && gx < 0);
  const x = flip ? -gx : gx;
  const y = flip ? -gy : gy;
  const ax = x < 0 ? -x : x;
  // First quadrant bins 0–3 (x >= 0), second quadrant bins 4–7 mirrored.
  const k = y < TAN_22 * ax ? 0 : y < ax ? 1 : y < TAN_67 * ax ? 2 : 3;
  return x >= 0 ? k : 7 - k;
}

function median(values: number[]): number {
  if (values.length === 0) return 0;
  const sorted = Float64Array.from(values).sort();
  return sorted[Math.floor(sorted.length / 2)];
}

/** A cell-aligned pixel box [x0, x1) × [y0, y1) of the working image. */
export type PixelBox = { x0: number; y0: number; x1: number; y1: number };

/**
 * Sums the measurements of `image` into cells; `surface` (working pixels) marks what is inside.
 * Only pixels in `within` are measured (the Surface's box plus the context margin: nothing else
 * is ever scored), so cells outside it stay empty.
 */
export function buildCellGrid(image: WorkingImage, cellSize: number, surface: SpanSet | null, within?: PixelBox): CellGrid {
  const { rgb, width, height } = image;
  const cols = Math.ceil(width / cellSize);
  const rows = Math.ceil(height / cellSize);
  const cells = cols * rows;
  const acc = new Float64Array(CHANNELS * cells);
  const dogMax = new Float32Array(cells).fill(-Infinity);
  const dogMin = new Float32Array(cells).fill(Infinity);
  const box = within ?? { x0: 0, y0: 0, x1: width, y1: height };
  // Box means need 4 px beyond the measured box; they are computed on that crop only.
  const crop = { x0: Math.max(0, box.x0 - 4), y0: Math.max(0, box.y0 - 4), x1: Math.min(width, box.x1 + 4), y1: Math.min(height, box.y1 + 4) };
  const cropWidth = crop.x1 - crop.x0;
  const cropHeight = crop.y1 - crop.y0;
  const cropLuma = new Float32Array(cropWidth * cropHeight);
  for (let y = crop.y0; y < crop.y1; y++) {
    for (let x = crop.x0, i = (y - crop.y0) * cropWidth, p = (y * width + x) * 3; x < crop.x1; x++, i++, p += 3) cropLuma[i] = 0.299 * rgb[p] + 0.587 * rgb[p + 1] + 0.114 * rgb[p + 2];
  }
  const near = boxMeans(cropLuma, cropWidth, cropHeight, 1);
  const around = boxMeans(cropLuma, cropWidth, cropHeight, 4);
  const cellOfColumn = Int32Array.from({ length: width }, (_, x) => Math.floor(x / cellSize));
  // Luma of a pixel inside the crop (the 3 × 3 neighbourhood of a measured pixel always is, or is clamped to the image).
  const lumaAt = (x: number, y: number) => cropLuma[(y - crop.y0) * cropWidth + (x - crop.x0)];

  for (let y = box.y0; y < box.y1; y++) {
    const yUp = Math.max(0, y - 1);
    const yDown = Math.min(height - 1, y + 1);
    const rowCell = Math.floor(y / cellSize) * cols;
    const cropRow = (y - crop.y0) * cropWidth - crop.x0;
    for (let x = box.x0; x < box.x1; x++) {
      const left = x > 0 ? x - 1 : 0;
      const right = x < width - 1 ? x + 1 : x;
      const cell = rowCell + cellOfColumn[x];
      const a = cell * CHANNELS;
      const p = (y * width + x) * 3;
      const l = cropLuma[cropRow + x];
      const cr = rgb[p] - rgb[p + 1];
      const cb = (rgb[p] + rgb[p + 1]) / 2 - rgb[p + 2];
      const ul = lumaAt(left, yUp),
        u = lumaAt(x, yUp),
        ur = lumaAt(right, yUp);
      const le = lumaAt(left, y),
        ri = lumaAt(right, y);
      const dl = lumaAt(left, yDown),
        d = lumaAt(x, yDown),
        dr = lumaAt(right, yDown);
      const gx = ur + 2 * ri + dr - ul - 2 * le - dl;
      const gy = dl + 2 * d + dr - ul - 2 * u - ur;
      // Sobel's gain is 4 on a unit step; divide so magnitudes are in luma levels per pixel.
      const mag = Math.sqrt(gx * gx + gy * gy) / 4;
      const lap = u + d + le + ri - 4 * l;
      const dog = near[cropRow + x] - around[cropRow + x];
      const t = l + LBP_TOLERANCE;
      const code = (ul >= t ? 1 : 0) | (u >= t ? 2 : 0) | (ur >= t ? 4 : 0) | (ri >= t ? 8 : 0) | (dr >= t ? 16 : 0) | (d >= t ? 32 : 0) | (dl >= t ? 64 : 0) | (le >= t ? 128 : 0);
      const ridge = dog * dog;

      acc[a + CH.n] += 1;
      acc[a + CH.l] += l;
      acc[a + CH.l2] += l * l;
      acc[a + CH.cr] += cr;
      acc[a + CH.cr2] += cr * cr;
      acc[a + CH.cb] += cb;
      acc[a + CH.cb2] += cb * cb;
      acc[a + CH.mag] += mag;
      acc[a + CH.jxx] += gx * gx;
      acc[a + CH.jyy] += gy * gy;
      acc[a + CH.jxy] += gx * gy;
      if (mag > STRONG_GRADIENT) acc[a + CH.strong] += 1;
      acc[a + CH.lap] += lap;
      acc[a + CH.lap2] += lap * lap;
      if (dog > 0) acc[a + CH.dogPos] += dog;
      else acc[a + CH.dogNeg] -= dog;
      acc[a + CH.ridgeW] += ridge;
      acc[a + CH.ridgeX] += ridge * (x + 0.5);
      acc[a + CH.ridgeY] += ridge * (y + 0.5);
      if (mag > 0) acc[a + CH.dir + directionBin(gx, gy)] += mag;
      acc[a + CH.lbp + LBP_RIU2[code]] += 1;
      if (dog > dogMax[cell]) dogMax[cell] = dog;
      if (dog < dogMin[cell]) dogMin[cell] = dog;
    }
  }

  if (surface) {
    for (let k = 0; k < surface.rowCount; k++) {
      const rowCell = Math.floor((surface.top + k) / cellSize) * cols;
      for (let i = surface.offsets[k]; i < surface.offsets[k + 1]; i += 2) {
        for (let x = surface.cols[i]; x < surface.cols[i + 1]; x++) acc[(rowCell + Math.floor(x / cellSize)) * CHANNELS + CH.inside] += 1;
      }
    }
  } else {
    for (let cell = 0; cell < cells; cell++) acc[cell * CHANNELS + CH.inside] = acc[cell * CHANNELS + CH.n];
  }

  const reference = referenceColour(acc, cells, surface !== null && countSpans(surface) > 0);
  return { cellSize, cols, rows, prefix: prefixSums(acc, cols, rows), dogMax, dogMin, reference };
}

/** Median cell means over cells at least half inside (all cells when there is no Surface). */
function referenceColour(acc: Float64Array, cells: number, hasSurface: boolean) {
  const l: number[] = [];
  const cr: number[] = [];
  const cb: number[] = [];
  for (let cell = 0; cell < cells; cell++) {
    const a = cell * CHANNELS;
    const n = acc[a + CH.n];
    if (n === 0 || (hasSurface && acc[a + CH.inside] < n / 2)) continue;
    l.push(acc[a + CH.l] / n);
    cr.push(acc[a + CH.cr] / n);
    cb.push(acc[a + CH.cb] / n);
  }
  return { l: median(l), cr: median(cr), cb: median(cb) };
}

function prefixSums(acc: Float64Array, cols: number, rows: number): Float64Array {
  const stride = (cols + 1) * CHANNELS;
  const prefix = new Float64Array((rows + 1) * stride);
  const row = new Float64Array(CHANNELS);
  for (let y = 0; y < rows; y++) {
    row.fill(0);
    for (let x = 0; x < cols; x++) {
      const a = (y * cols + x) * CHANNELS;
      const below = (y + 1) * stride + (x + 1) * CHANNELS;
      const above = y * stride + (x + 1) * CHANNELS;
      for (let k = 0; k < CHANNELS; k++) {
        row[k] += acc[a + k];
        prefix[below + k] = prefix[above + k] + row[k];
      }
    }
  }
  return prefix;
}

/** Adds the sums of every channel over cells [x0, x1) × [y0, y1) (clipped to the grid) into `out`. */
export function windowSums(grid: CellGrid, x0: number, y0: number, x1: number, y1: number, out: Float64Array): Float64Array {
  out.fill(0);
  const ax = Math.max(0, x0),
    ay = Math.max(0, y0),
    bx = Math.min(grid.cols, x1),
    by = Math.min(grid.rows, y1);
  if (ax >= bx || ay >= by) return out;
  const stride = (grid.cols + 1) * CHANNELS;
  const [p11, p01, p10, p00] = [by * stride + bx * CHANNELS, ay * stride + bx * CHANNELS, by * stride + ax * CHANNELS, ay * stride + ax * CHANNELS];
  const prefix = grid.prefix;
  for (let k = 0; k < CHANNELS; k++) out[k] = prefix[p11 + k] - prefix[p01 + k] - prefix[p10 + k] + prefix[p00 + k];
  return out;
}
