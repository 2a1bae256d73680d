/**
 * The outlier search behind lib/imaging/pixel-candidates.ts (which states the method): the noise
 * estimate, the cheap per-tile pass, the boxes the exact median test runs on, and the groups of
 * outlier pixels it finds. Pure apart from libvips' median.
 */
import sharp from "sharp";
import type { Rgb } from "./pixel-groups";
import type { Box } from "./pixel-search-area";

/** Side of the tiles the cheap pass marks and the exact test grows by, px. */
export const TILE = 16;
const SIGMA_PATCH = 64;

/**
 * Median filters of several boxes of the image in one libvips call: each box, with the window's
 * half-width of context around it, is copied into one tall strip (beyond the image's edge the edge
 * pixel repeats, as libvips extends an image); a box's own pixels see only their context there, so
 * their medians are those of the whole image. Per box: where its context starts in the strip.
 */
async function medianOfBoxes(rgb: Rgb, medianSize: number, boxes: readonly Box[]): Promise<{ strip: Buffer; stripWidth: number; placed: { outer: Box; row: number }[] }> {
  const half = (medianSize - 1) / 2;
  const outers = boxes.map((box) => ({ x: box.x - half, y: box.y - half, width: box.width + 2 * half, height: box.height + 2 * half }));
  const stripWidth = Math.max(1, ...outers.map((o) => o.width));
  const placed: { outer: Box; row: number }[] = [];
  let rows = 0;
  for (const outer of outers) {
    placed.push({ outer, row: rows });
    rows += outer.height + medianSize; // a gap, so one box's window never reaches into the next
  }
  const packed = Buffer.alloc(stripWidth * rows * 3);
  const { data, width, height } = rgb;
  for (const { outer, row } of placed) {
    const x0 = Math.max(0, outer.x);
    const x1 = Math.min(width, outer.x + outer.width);
    for (let y = 0; y < outer.height; y++) {
      const source = Math.min(height - 1, Math.max(0, outer.y + y)) * width;
      const target = (row + y) * stripWidth;
      data.copy(packed, (target + x0 - outer.x) * 3, (source + x0) * 3, (source + x1) * 3);
      for (let x = outer.x; x < x0; x++) data.copy(packed, (target + x - outer.x) * 3, source * 3, source * 3 + 3);
      for (let x = x1; x < outer.x + outer.width; x++) data.copy(packed, (target + x - outer.x) * 3, (source + width - 1) * 3, (source + width) * 3);
    }
  }
  const strip = await sharp(packed, { raw: { width: stripWidth, height: rows, channels: 3 }, limitInputPixels: false })
    .median(medianSize)
    .raw()
    .toBuffer();
  return { strip, stripWidth, placed };
}

/** `box` grown by `margin` on every side, clipped to the image. */
export function grow(box: Box, margin: number, image: { width: number; height: number }): Box {
  const x = Math.max(0, box.x - margin);
  const y = Math.max(0, box.y - margin);
  return { x, y, width: Math.min(image.width, box.x + box.width + margin) - x, height: Math.min(image.height, box.y + box.height + margin) - y };
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

/** Robust σ per channel of the residual (image − median) on up to nine patches inside the area. */
export async function residualSigma(rgb: Rgb, medianSize: number, usableAt: (x: number, y: number) => boolean): Promise<[number, number, number]> {
  const { data, width, height } = rgb;
  const pw = Math.min(SIGMA_PATCH, width);
  const ph = Math.min(SIGMA_PATCH, height);
  const spots: Box[] = [];
  for (let j = 0; j < 3; j++) for (let i = 0; i < 3; i++) spots.push({ x: Math.round(((width - pw) * (i + 0.5)) / 3), y: Math.round(((height - ph) * (j + 0.5)) / 3), width: pw, height: ph });
  const inside = spots.filter((p) => usableAt(p.x + pw / 2, p.y + ph / 2));
  const histograms = [new Uint32Array(256), new Uint32Array(256), new Uint32Array(256)];
  let samples = 0;
  const patches = inside.length > 0 ? inside : spots;
  const { strip, stripWidth, placed } = await medianOfBoxes(rgb, medianSize, patches);
  patches.forEach((patch, k) => {
    const { outer, row } = placed[k];
    for (let y = patch.y; y < patch.y + patch.height; y++) {
      for (let x = patch.x, i = (y * width + x) * 3, m = ((row + y - outer.y) * stripWidth + (x - outer.x)) * 3; x < patch.x + patch.width; x++, i += 3, m += 3) {
        for (let c = 0; c < 3; c++) histograms[c][Math.abs(data[i + c] - strip[m + c])]++;
        samples++;
      }
    }
  });
  // σ = 1.4826 × MAD for normal noise; the residual's median is 0 on a uniform screen.
  return histograms.map((histogram) => 1.4826 * interpolatedMedian(histogram, samples)) as [number, number, number];
}

/**
 * Tiles holding a pixel that deviates from the tile's own mean by ≥ `limit` (per channel): one
 * pass per tile gathers each channel's sum, minimum and maximum, and the extremes are compared
 * with the mean.
 */
export function suspectTiles(rgb: Rgb, tiles: { columns: number; rows: number; usable: Uint8Array }, limit: number[]): Uint8Array {
  const { data, width, height } = rgb;
  const suspect = new Uint8Array(tiles.columns * tiles.rows);
  const [l0, l1, l2] = limit;
  for (let ty = 0; ty < tiles.rows; ty++) {
    const y0 = ty * TILE;
    const y1 = Math.min(height, y0 + TILE);
    for (let tx = 0; tx < tiles.columns; tx++) {
      const t = ty * tiles.columns + tx;
      if (!tiles.usable[t]) continue;
      const x0 = tx * TILE;
      const span = (Math.min(width, x0 + TILE) - x0) * 3;
      let s0 = 0,
        s1 = 0,
        s2 = 0;
      let lo0 = 255,
        lo1 = 255,
        lo2 = 255,
        hi0 = 0,
        hi1 = 0,
        hi2 = 0;
      for (let y = y0; y < y1; y++) {
        const end = (y * width + x0) * 3 + span;
        for (let i = (y * width + x0) * 3; i < end; i += 3) {
          const v0 = data[i];
          const v1 = data[i + 1];
          const v2 = data[i + 2];
          s0 += v0;
          s1 += v1;
          s2 += v2;
          if (v0 < lo0) lo0 = v0;
          if (v0 > hi0) hi0 = v0;
          if (v1 < lo1) lo1 = v1;
          if (v1 > hi1) hi1 = v1;
          if (v2 < lo2) lo2 = v2;
          if (v2 > hi2) hi2 = v2;
        }
      }
      const n = ((y1 - y0) * span) / 3;
      const m0 = s0 / n,
        m1 = s1 / n,
        m2 = s2 / n;
      if (hi0 - m0 >= l0 || m0 - lo0 >= l0 || hi1 - m1 >= l1 || m1 - lo1 >= l1 || hi2 - m2 >= l2 || m2 - lo2 >= l2) suspect[t] = 1;
    }
  }
  return suspect;
}

/** Boxes (crop px) of the 8-connected groups of suspect tiles, each grown by one tile. */
export function workBoxes(suspect: Uint8Array, columns: number, rows: number, image: { width: number; height: number }): Box[] {
  const seen = new Uint8Array(suspect.length);
  const boxes: Box[] = [];
  for (let start = 0; start < suspect.length; start++) {
    if (!suspect[start] || seen[start]) continue;
    let minX = columns,
      minY = rows,
      maxX = 0,
      maxY = 0;
    const stack = [start];
    seen[start] = 1;
    while (stack.length > 0) {
      const t = stack.pop()!;
      const tx = t % columns;
      const ty = (t - tx) / columns;
      minX = Math.min(minX, tx);
      maxX = Math.max(maxX, tx);
      minY = Math.min(minY, ty);
      maxY = Math.max(maxY, ty);
      // Neighbours two tiles away join too: their grown boxes would touch.
      for (let ny = Math.max(0, ty - 2); ny <= Math.min(rows - 1, ty + 2); ny++) {
        for (let nx = Math.max(0, tx - 2); nx <= Math.min(columns - 1, tx + 2); nx++) {
          const n = ny * columns + nx;
          if (suspect[n] && !seen[n]) {
            seen[n] = 1;
            stack.push(n);
          }
        }
      }
    }
    boxes.push(grow({ x: minX * TILE, y: minY * TILE, width: (maxX - minX + 1) * TILE, height: (maxY - minY + 1) * TILE }, TILE, image));
  }
  return boxes;
}

/**
 * Per box (box-local, row-major): 0 = normal, 1 = over the low threshold, 2 = over the seed
 * threshold, from the exact median residual.
 */
export async function outlierLevels(rgb: Rgb, medianSize: number, boxes: readonly Box[], high: number[], low: number[]): Promise<Uint8Array[]> {
  if (boxes.length === 0) return [];
  const { data, width } = rgb;
  const { strip, stripWidth, placed } = await medianOfBoxes(rgb, medianSize, boxes);
  return boxes.map((box, k) => {
    const { outer, row } = placed[k];
    const levels = new Uint8Array(box.width * box.height);
    for (let y = box.y; y < box.y + box.height; y++) {
      for (let x = box.x, i = (y * width + x) * 3, m = ((row + y - outer.y) * stripWidth + (x - outer.x)) * 3, l = (y - box.y) * box.width; x < box.x + box.width; x++, i += 3, m += 3, l++) {
        let level = 0;
        for (let c = 0; c < 3; c++) {
          const deviation = Math.abs(data[i + c] - strip[m + c]);
          if (deviation >= high[c]) level = 2;
          else if (deviation >= low[c] && level === 0) level = 1;
        }
        levels[l] = level;
      }
    }
    return levels;
  });
}

/**
 * The 8-connected groups of a box's outlier pixels that hold a seed, as lists of seed and member
 * pixels (indices into the whole crop). Consumes `levels`.
 */
export function outlierGroups(levels: Uint8Array, box: Box, cropWidth: number): { seeds: number[]; members: number[] }[] {
  const groups: { seeds: number[]; members: number[] }[] = [];
  const global = (local: number) => (box.y + Math.floor(local / box.width)) * cropWidth + box.x + (local % box.width);
  for (let start = 0; start < levels.length; start++) {
    if (levels[start] !== 2) continue;
    const queue = [start];
    const seeds = [start];
    levels[start] = 0;
    for (let head = 0; head < queue.length; head++) {
      const index = queue[head];
      const x = index % box.width;
      const y = (index - x) / box.width;
      for (let ny = Math.max(0, y - 1); ny <= Math.min(box.height - 1, y + 1); ny++) {
        for (let nx = Math.max(0, x - 1); nx <= Math.min(box.width - 1, x + 1); nx++) {
          const n = ny * box.width + nx;
          if (levels[n] === 0) continue;
          if (levels[n] === 2) seeds.push(n);
          levels[n] = 0;
          queue.push(n);
        }
      }
    }
    groups.push({ seeds: seeds.map(global), members: queue.map(global) });
  }
  return groups;
}
