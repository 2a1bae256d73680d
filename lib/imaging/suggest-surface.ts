/**
 * Suggests a Surface (the part's own outline) for a part shot on a plain backdrop. The inspector
 * accepts, edits or discards it; nothing here is stored.
 *
 * Steps: upright greyscale copy downscaled to `maxWorkingSide` (plus a 3 × 3 median against
 * speckle) → Otsu threshold → the class touching the image border less is the part → its largest
 * 4-connected component → holes filled (background 8-connected to the border stays background) →
 * outer boundary traced along pixel edges → ring through the edge midpoints, simplified with
 * Douglas–Peucker → scaled back to the full upright photo's pixel coordinates.
 */
import sharp from "sharp";
import { z } from "zod";
import { AppError } from "@/lib/errors";
import type { Point, PolygonShape } from "@/lib/geometry/shape";
import { simplifyRing } from "@/lib/geometry/simplify";
import { histogramOfBytes, imagingError, otsuSplit } from "@/lib/imaging/otsu";

const optionsSchema = z.object({
  /** Long side of the working copy in pixels (no enlargement). */
  maxWorkingSide: z.number().int().min(64).max(4096).default(640),
  /** Douglas–Peucker tolerance in working-copy pixels. */
  simplifyTolerance: z.number().positive().max(20).default(1),
  /** Which class is the part: decided from the border by default. */
  part: z.enum(["auto", "darker", "lighter"]).default("auto"),
  limitInputPixels: z.number().int().positive().default(100_000_000),
});
export type SuggestSurfaceOptions = z.input<typeof optionsSchema>;

export type SurfaceSuggestion =
  | {
      shape: PolygonShape;
      /** Otsu's first level of the lighter class, on the 0–255 greyscale working copy. */
      threshold: number;
      part: "darker" | "lighter";
      /** Otsu's σ_B² / σ_T² of the working copy, 0–1. */
      separability: number;
      /** Filled part area in full-photo pixels (from the working mask, scaled). */
      areaPx: number;
      confidence: "high" | "medium" | "low";
      note: string;
    }
  | { shape: null; threshold: number | null; confidence: "none"; note: string };

type Mask = { width: number; height: number; data: Uint8Array };

/** Largest 4-connected component of `mask` (1 = candidate), as a new 0/1 mask, and its size. */
function largestComponent(mask: Mask): { component: Mask; size: number; candidateTotal: number } {
  const { width, height, data } = mask;
  const labels = new Int32Array(width * height);
  const queue = new Int32Array(width * height);
  let bestLabel = 0;
  let bestSize = 0;
  let candidateTotal = 0;
  let next = 0;
  for (let start = 0; start < data.length; start++) {
    if (!data[start] || labels[start]) continue;
    next++;
    let head = 0;
    let tail = 0;
    queue[tail++] = start;
    labels[start] = next;
    while (head < tail) {
      const index = queue[head++];
      const x = index % width;
      const neighbours = [x > 0 ? index - 1 : -1, x < width - 1 ? index + 1 : -1, index - width, index + width];
      for (const n of neighbours) {
        if (n < 0 || n >= data.length || !data[n] || labels[n]) continue;
        labels[n] = next;
        queue[tail++] = n;
      }
    }
    candidateTotal += tail;
    if (tail > bestSize) {
      bestSize = tail;
      bestLabel = next;
    }
  }
  const component = new Uint8Array(width * height);
  for (let i = 0; i < labels.length; i++) component[i] = labels[i] === bestLabel && bestLabel > 0 ? 1 : 0;
  return { component: { width, height, data: component }, size: bestSize, candidateTotal };
}

/** Sets every pixel not 8-connected to the border through non-part pixels (holes) to part. */
function fillHoles(mask: Mask): Mask {
  const { width, height, data } = mask;
  const outside = new Uint8Array(width * height);
  const queue = new Int32Array(width * height);
  let tail = 0;
  const seed = (index: number) => {
    if (!data[index] && !outside[index]) {
      outside[index] = 1;
      queue[tail++] = index;
    }
  };
  for (let x = 0; x < width; x++) {
    seed(x);
    seed((height - 1) * width + x);
  }
  for (let y = 0; y < height; y++) {
    seed(y * width);
    seed(y * width + width - 1);
  }
  for (let head = 0; head < tail; head++) {
    const index = queue[head];
    const x = index % width;
    const y = (index - x) / width;
    for (let dy = -1; dy <= 1; dy++) {
      for (let dx = -1; dx <= 1; dx++) {
        const nx = x + dx;
        const ny = y + dy;
        if (nx >= 0 && ny >= 0 && nx < width && ny < height) seed(ny * width + nx);
      }
    }
  }
  const filled = new Uint8Array(width * height);
  for (let i = 0; i < filled.length; i++) filled[i] = outside[i] ? 0 : 1;
  return { width, height, data: filled };
}

/**
 * Corners of the outer boundary of a 4-connected, hole-free component, walked along pixel edges
 * with the part on the right-hand side (y down). Vertices are pixel corners (integers).
 */
export function traceOuterBoundary(mask: Mask): Point[] {
  const { width, height, data } = mask;
  const first = data.indexOf(1);
  if (first < 0) return [];
  const inside = (x: number, y: number) => x >= 0 && y >= 0 && x < width && y < height && data[y * width + x] === 1;
  const startX = first % width;
  const startY = (first - startX) / width;
  let x = startX;
  let y = startY;
  let dx = 1;
  let dy = 0;
  const corners: Point[] = [[x, y]];
  const maxSteps = 4 * width * height + 4;
  for (let step = 0; step < maxSteps; step++) {
    x += dx;
    y += dy;
    // Right-hand normal of (dx, dy) in y-down coordinates is (−dy, dx).
    const rx = -dy;
    const ry = dx;
    const aheadRight = inside(x + (dx + rx - 1) / 2, y + (dy + ry - 1) / 2);
    const aheadLeft = inside(x + (dx - rx - 1) / 2, y + (dy - ry - 1) / 2);
    let ndx = dx;
    let ndy = dy;
    if (!aheadRight) [ndx, ndy] = [rx, ry];
    else if (aheadLeft) [ndx, ndy] = [-rx, -ry];
    if (x === startX && y === startY && ndx === 1 && ndy === 0) return corners;
    if (ndx !== dx || ndy !== dy) corners.push([x, y]);
    dx = ndx;
    dy = ndy;
  }
  throw new Error("Boundary tracing did not close (internal error).");
}

/** The ring through the midpoints of the unit edges between consecutive corners. */
function edgeMidpointRing(corners: Point[]): Point[] {
  const ring: Point[] = [];
  for (let i = 0; i < corners.length; i++) {
    const [ax, ay] = corners[i];
    const [bx, by] = corners[(i + 1) % corners.length];
    const length = Math.abs(bx - ax) + Math.abs(by - ay);
    const ux = Math.sign(bx - ax);
    const uy = Math.sign(by - ay);
    ring.push([ax + ux / 2, ay + uy / 2]);
    if (length > 1) ring.push([bx - ux / 2, by - uy / 2]);
  }
  return ring;
}

function countBorder(mask: Uint8Array, width: number, height: number): { lighter: number; all: number } {
  let lighter = 0;
  let all = 0;
  for (let y = 0; y < height; y++) {
    const step = y === 0 || y === height - 1 ? 1 : width - 1;
    for (let x = 0; x < width; x += step) {
      lighter += mask[y * width + x];
      all++;
    }
  }
  return { lighter, all };
}

function judge(separability: number, share: number, touchesBorder: boolean, mainShare: number) {
  const doubts: string[] = [];
  if (separability < 0.75) doubts.push(`part and backdrop overlap in brightness (separability ${separability.toFixed(2)})`);
  if (touchesBorder) doubts.push("the outline touches the photo edge (part cut off, or backdrop not plain)");
  if (share < 0.02 || share > 0.9) doubts.push(`the part covers ${(share * 100).toFixed(1)} % of the photo`);
  if (mainShare < 0.9) doubts.push(`only ${(mainShare * 100).toFixed(0)} % of the part-coloured pixels are in the outline (clutter or a split part)`);
  const confidence: "high" | "medium" | "low" = doubts.length === 0 ? "high" : separability < 0.5 || doubts.length >= 2 ? "low" : "medium";
  return { confidence, doubts };
}

/** Suggests the part's outline as a polygon in the upright photo's pixel coordinates. */
export async function suggestSurface(input: Buffer, options: SuggestSurfaceOptions = {}): Promise<SurfaceSuggestion> {
  const parsed = optionsSchema.safeParse(options);
  if (!parsed.success) throw new AppError("bad_request", `Invalid surface options: ${parsed.error.issues[0].message}`);
  const { maxWorkingSide, simplifyTolerance, part, limitInputPixels } = parsed.data;
  if (!Buffer.isBuffer(input) || input.length === 0) throw new AppError("bad_request", "No photo bytes were given.");

  let fullWidth: number;
  let fullHeight: number;
  let grey: { data: Buffer; width: number; height: number };
  try {
    const meta = await sharp(input, { limitInputPixels }).metadata();
    fullWidth = meta.autoOrient?.width ?? meta.width ?? 0;
    fullHeight = meta.autoOrient?.height ?? meta.height ?? 0;
    const { data, info } = await sharp(input, { limitInputPixels, autoOrient: true })
      .resize({ width: maxWorkingSide, height: maxWorkingSide, fit: "inside", withoutEnlargement: true })
      .greyscale()
      .removeAlpha()
      .median(3)
      .raw()
      .toBuffer({ resolveWithObject: true });
    if (info.channels !== 1) throw new Error(`expected 1 channel, got ${info.channels}`);
    grey = { data, width: info.width, height: info.height };
  } catch (error) {
    throw imagingError(error);
  }
  const { width, height } = grey;

  const split = otsuSplit(histogramOfBytes(grey.data));
  if (!split) return { shape: null, threshold: null, confidence: "none", note: "The photo is one flat grey level: no part to separate." };

  const lighter = new Uint8Array(width * height);
  for (let i = 0; i < lighter.length; i++) lighter[i] = grey.data[i] >= split.threshold ? 1 : 0;
  const border = countBorder(lighter, width, height);
  const partSide: "darker" | "lighter" = part !== "auto" ? part : border.lighter * 2 < border.all ? "lighter" : "darker";
  const partMask = partSide === "lighter" ? lighter : lighter.map((v) => 1 - v);

  const { component, size, candidateTotal } = largestComponent({ width, height, data: partMask });
  if (size === 0) return { shape: null, threshold: split.threshold, confidence: "none", note: "No part-coloured pixels were found." };
  const filled = fillHoles(component);
  const ring = simplifyRing(edgeMidpointRing(traceOuterBoundary(filled)), simplifyTolerance);

  const scaleX = fullWidth / width;
  const scaleY = fullHeight / height;
  const round = (v: number) => Math.round(v * 100) / 100;
  const points: Point[] = ring.map(([x, y]) => [round(x * scaleX), round(y * scaleY)]);
  let filledPx = 0;
  let touchesBorder = false;
  for (let i = 0; i < filled.data.length; i++) {
    if (!filled.data[i]) continue;
    filledPx++;
    const x = i % width;
    const y = (i - x) / width;
    if (x === 0 || y === 0 || x === width - 1 || y === height - 1) touchesBorder = true;
  }
  const { confidence, doubts } = judge(split.separability, filledPx / (width * height), touchesBorder, size / candidateTotal);
  const note =
    `Otsu threshold ${split.threshold} on a ${width} × ${height} greyscale copy; the ${partSide} class is the part ` +
    `(it touches the photo border less). ${points.length} vertices. ` +
    (doubts.length ? `Check: ${doubts.join("; ")}.` : "Clean separation.");
  return {
    shape: { kind: "polygon", points },
    threshold: split.threshold,
    part: partSide,
    separability: split.separability,
    areaPx: Math.round(filledPx * scaleX * scaleY),
    confidence,
    note,
  };
}
