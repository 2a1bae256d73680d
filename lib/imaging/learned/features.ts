/**
 * The feature vector of one cell: statistics of three windows centred on it — the cell itself,
 * the 3 × 3-cell patch around it (24 px at the default 8 px cells) and the 9 × 9-cell context
 * (72 px) — read from the cell grid's prefix sums. Colours are taken relative to the part's own
 * colour (the grid's reference) so one model serves dark and light parts; the direction histogram
 * is turned so its strongest bin comes first, so a scratch looks the same at any angle.
 *
 * The list and its order are stored with each model (FEATURE_NAMES); a model whose list differs
 * from this code's is refused rather than fed shuffled numbers.
 */
import { CH, CHANNELS, windowSums, type CellGrid } from "./cell-grid";

export const FEATURE_NAMES = [
  "patch.l",
  "patch.l-rel",
  "patch.l-sd",
  "patch.cr-rel",
  "patch.cb-rel",
  "patch.cr-sd",
  "patch.cb-sd",
  "patch.gradient",
  "patch.coherence",
  "patch.strong-share",
  "patch.laplacian-var",
  "patch.dog-pos",
  "patch.dog-neg",
  "patch.dog-max",
  "patch.dog-min",
  ...Array.from({ length: 8 }, (_, k) => `patch.direction-${k}`),
  ...Array.from({ length: 10 }, (_, k) => `patch.lbp-${k}`),
  "cell.l-vs-ring",
  "cell.cr-vs-ring",
  "cell.cb-vs-ring",
  "cell.gradient",
  "cell.coherence",
  "cell.dog-max",
  "cell.dog-min",
  "patch.l-vs-ring",
  "patch.cr-vs-ring",
  "patch.cb-vs-ring",
  "context.l-sd",
  "context.gradient",
  "context.inside",
  "patch.inside",
] as const;
export const FEATURE_COUNT = FEATURE_NAMES.length;

const PATCH_RADIUS = 1;
export const CONTEXT_RADIUS = 4;

/** Reused window-sum buffers: the cell, its patch, its context. */
type Sums = { cell: Float64Array; patch: Float64Array; context: Float64Array };
const newSums = (): Sums => ({ cell: new Float64Array(CHANNELS), patch: new Float64Array(CHANNELS), context: new Float64Array(CHANNELS) });

const mean = (w: Float64Array, channel: number) => w[channel] / Math.max(1, w[CH.n]);
const sd = (w: Float64Array, value: number, square: number) => Math.sqrt(Math.max(0, mean(w, square) - mean(w, value) ** 2));

function coherence(w: Float64Array): number {
  const trace = w[CH.jxx] + w[CH.jyy];
  return trace > 1e-9 ? Math.sqrt((w[CH.jxx] - w[CH.jyy]) ** 2 + 4 * w[CH.jxy] ** 2) / trace : 0;
}

/** Mean of a channel over the ring `outer` minus `inner`. */
function ringMean(outer: Float64Array, inner: Float64Array, channel: number): number {
  const n = outer[CH.n] - inner[CH.n];
  return n > 0 ? (outer[channel] - inner[channel]) / n : mean(inner, channel);
}

/** Largest (sign 1) or smallest (sign −1) centre-versus-surround value over the cells within `radius`. */
function extremeDog(grid: CellGrid, cx: number, cy: number, radius: number, sign: 1 | -1): number {
  const values = sign > 0 ? grid.dogMax : grid.dogMin;
  let best = 0;
  for (let y = Math.max(0, cy - radius); y <= Math.min(grid.rows - 1, cy + radius); y++) {
    for (let x = Math.max(0, cx - radius); x <= Math.min(grid.cols - 1, cx + radius); x++) best = sign * values[y * grid.cols + x] > sign * best ? values[y * grid.cols + x] : best;
  }
  return best;
}

/** Writes the features of cell `index` into `out` (FEATURE_COUNT values from `offset`). */
function cellFeatures(grid: CellGrid, index: number, sums: Sums, out: Float64Array, offset: number): void {
  const cx = index % grid.cols;
  const cy = (index - cx) / grid.cols;
  const cell = windowSums(grid, cx, cy, cx + 1, cy + 1, sums.cell);
  const patch = windowSums(grid, cx - PATCH_RADIUS, cy - PATCH_RADIUS, cx + PATCH_RADIUS + 1, cy + PATCH_RADIUS + 1, sums.patch);
  const context = windowSums(grid, cx - CONTEXT_RADIUS, cy - CONTEXT_RADIUS, cx + CONTEXT_RADIUS + 1, cy + CONTEXT_RADIUS + 1, sums.context);
  const ref = grid.reference;
  let directionTotal = 0;
  let strongest = 0;
  for (let k = 0; k < 8; k++) {
    directionTotal += patch[CH.dir + k];
    if (patch[CH.dir + k] > patch[CH.dir + strongest]) strongest = k;
  }
  directionTotal ||= 1;
  let o = offset;
  out[o++] = mean(patch, CH.l);
  out[o++] = mean(patch, CH.l) - ref.l;
  out[o++] = sd(patch, CH.l, CH.l2);
  out[o++] = mean(patch, CH.cr) - ref.cr;
  out[o++] = mean(patch, CH.cb) - ref.cb;
  out[o++] = sd(patch, CH.cr, CH.cr2);
  out[o++] = sd(patch, CH.cb, CH.cb2);
  out[o++] = mean(patch, CH.mag);
  out[o++] = coherence(patch);
  out[o++] = mean(patch, CH.strong);
  out[o++] = sd(patch, CH.lap, CH.lap2);
  out[o++] = mean(patch, CH.dogPos);
  out[o++] = mean(patch, CH.dogNeg);
  out[o++] = extremeDog(grid, cx, cy, PATCH_RADIUS, 1);
  out[o++] = extremeDog(grid, cx, cy, PATCH_RADIUS, -1);
  for (let k = 0; k < 8; k++) out[o++] = patch[CH.dir + ((strongest + k) % 8)] / directionTotal;
  for (let k = 0; k < 10; k++) out[o++] = mean(patch, CH.lbp + k);
  out[o++] = mean(cell, CH.l) - ringMean(context, cell, CH.l);
  out[o++] = mean(cell, CH.cr) - ringMean(context, cell, CH.cr);
  out[o++] = mean(cell, CH.cb) - ringMean(context, cell, CH.cb);
  out[o++] = mean(cell, CH.mag);
  out[o++] = coherence(cell);
  out[o++] = grid.dogMax[index];
  out[o++] = grid.dogMin[index];
  out[o++] = mean(patch, CH.l) - ringMean(context, patch, CH.l);
  out[o++] = mean(patch, CH.cr) - ringMean(context, patch, CH.cr);
  out[o++] = mean(patch, CH.cb) - ringMean(context, patch, CH.cb);
  out[o++] = sd(context, CH.l, CH.l2);
  out[o++] = mean(context, CH.mag);
  out[o++] = mean(context, CH.inside);
  out[o++] = mean(patch, CH.inside);
}

/** Feature rows for the given cells (plain arrays, as the forest library takes them). */
export function featureRows(grid: CellGrid, indices: readonly number[]): number[][] {
  const sums = newSums();
  const scratch = new Float64Array(FEATURE_COUNT);
  return indices.map((index) => {
    cellFeatures(grid, index, sums, scratch, 0);
    return Array.from(scratch);
  });
}

const cellSums = (grid: CellGrid, index: number, out: Float64Array) => {
  const cx = index % grid.cols;
  const cy = (index - cx) / grid.cols;
  return windowSums(grid, cx, cy, cx + 1, cy + 1, out);
};

/** Share of each cell inside the Surface (of its measured pixels; 0 for cells not measured). */
export function insideShares(grid: CellGrid): Float32Array {
  const buffer = new Float64Array(CHANNELS);
  return Float32Array.from({ length: grid.cols * grid.rows }, (_, cell) => {
    const sums = cellSums(grid, cell, buffer);
    return sums[CH.n] > 0 ? sums[CH.inside] / sums[CH.n] : 0;
  });
}

/** Ridge-weighted centroid of cell `index` in working pixels (the cell centre when it is flat). */
export function ridgeCentroid(grid: CellGrid, index: number): [number, number] {
  const sums = cellSums(grid, index, new Float64Array(CHANNELS));
  const cx = index % grid.cols;
  const cy = (index - cx) / grid.cols;
  if (sums[CH.ridgeW] <= 1e-9) return [(cx + 0.5) * grid.cellSize, (cy + 0.5) * grid.cellSize];
  return [sums[CH.ridgeX] / sums[CH.ridgeW], sums[CH.ridgeY] / sums[CH.ridgeW]];
}
