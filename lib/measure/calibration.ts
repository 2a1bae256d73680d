/**
 * A photo's pixel → millimetre scale. Precedence: Ruler(s) marked on the photo, else the part
 * type's nominal outline size against the Surface's bounding box, else none (numbers stay in px).
 *
 * - Several rulers are pooled as Σ px / Σ mm (a length-weighted mean: a longer ruler suffers less
 *   from a click's error); the spread of the individual rulers is reported in `detail`.
 * - Nominal size: the Surface's axis-aligned bounding box is matched long side to long side (the
 *   part may be shot rotated by 90°) and the two ratios are averaged. This assumes the part is
 *   square to the photo edges and shot flat; a tilted part inflates the box.
 */
import { z } from "zod";
import { AppError } from "@/lib/errors";
import type { Point, Shape } from "@/lib/geometry/shape";
import type { Calibration } from "@/lib/measure/types";

export type RulerInput = { a: Point; b: Point; lengthMm: number };

const pointSchema = z.tuple([z.number().finite(), z.number().finite()], { message: "A ruler end must be [x, y] in pixels." });
const rulerSchema = z.object({
  a: pointSchema,
  b: pointSchema,
  lengthMm: z.number({ message: "A ruler's length in mm must be a number." }).finite().positive({ message: "A ruler's length in mm must be greater than 0." }),
});

/** Rulers shorter than this many pixels are rejected: the click error would swamp the scale. */
export const MIN_RULER_PX = 1;

/** Pixels per millimetre from one Ruler. Throws on a zero-length ruler or a non-positive length. */
export function calibrationFromRuler(ruler: RulerInput): number {
  const parsed = rulerSchema.safeParse(ruler);
  if (!parsed.success) throw new AppError("bad_request", `Invalid ruler: ${parsed.error.issues[0].message}`);
  const { a, b, lengthMm } = parsed.data;
  const lengthPx = Math.hypot(b[0] - a[0], b[1] - a[1]);
  if (lengthPx < MIN_RULER_PX) {
    throw new AppError("bad_request", `Invalid ruler: its ends are ${lengthPx.toFixed(2)} px apart; a ruler must span at least ${MIN_RULER_PX} px.`);
  }
  return lengthPx / lengthMm;
}

/** Axis-aligned bounding box of shapes (lines include half their width, spots their radius). */
export function shapesBoundingBox(shapes: Shape[]): { minX: number; minY: number; maxX: number; maxY: number } | null {
  let minX = Infinity,
    minY = Infinity,
    maxX = -Infinity,
    maxY = -Infinity;
  const include = (x: number, y: number, pad = 0) => {
    minX = Math.min(minX, x - pad);
    minY = Math.min(minY, y - pad);
    maxX = Math.max(maxX, x + pad);
    maxY = Math.max(maxY, y + pad);
  };
  for (const shape of shapes) {
    if (shape.kind === "rect") {
      include(shape.x, shape.y);
      include(shape.x + shape.width, shape.y + shape.height);
    } else if (shape.kind === "spot") include(shape.x, shape.y, shape.radius);
    else for (const [x, y] of shape.points) include(x, y, shape.kind === "line" ? shape.width / 2 : 0);
  }
  if (![minX, minY, maxX, maxY].every(Number.isFinite)) return null;
  return { minX, minY, maxX, maxY };
}

const nominalSchema = z.object({
  width: z.number().finite().positive({ message: "The nominal width in mm must be greater than 0." }),
  height: z.number().finite().positive({ message: "The nominal height in mm must be greater than 0." }),
});

const fmt = (v: number, digits = 1) => v.toFixed(digits);

function fromRulers(rulers: RulerInput[]): Calibration {
  const perRuler = rulers.map((ruler, i) => {
    try {
      return { pxPerMm: calibrationFromRuler(ruler), lengthMm: ruler.lengthMm };
    } catch (error) {
      throw rulers.length > 1 && error instanceof AppError ? new AppError("bad_request", `Ruler ${i + 1}: ${error.message}`) : error;
    }
  });
  const totalPx = perRuler.reduce((sum, r) => sum + r.pxPerMm * r.lengthMm, 0);
  const totalMm = perRuler.reduce((sum, r) => sum + r.lengthMm, 0);
  const pxPerMm = totalPx / totalMm;
  if (perRuler.length === 1) {
    return { method: "ruler", pxPerMm, detail: `Ruler: ${fmt(totalPx)} px over ${fmt(totalMm)} mm = ${fmt(pxPerMm, 2)} px/mm.` };
  }
  const values = perRuler.map((r) => r.pxPerMm);
  const low = Math.min(...values);
  const high = Math.max(...values);
  const spread = ((high - low) / pxPerMm) * 100;
  const warning = spread > 5 ? " The rulers disagree by more than 5 %: check their ends, or whether the photo is tilted." : "";
  return {
    method: "ruler",
    pxPerMm,
    detail:
      `${perRuler.length} rulers pooled: ${fmt(totalPx)} px over ${fmt(totalMm)} mm = ${fmt(pxPerMm, 2)} px/mm ` +
      `(single rulers ${fmt(low, 2)}–${fmt(high, 2)} px/mm, spread ${fmt(spread)} %).${warning}`,
  };
}

function fromNominal(surface: Shape[], nominal: { width: number; height: number }): Calibration {
  const parsed = nominalSchema.safeParse(nominal);
  if (!parsed.success) throw new AppError("bad_request", `Invalid nominal size: ${parsed.error.issues[0].message}`);
  const box = shapesBoundingBox(surface);
  const boxWidth = box ? box.maxX - box.minX : 0;
  const boxHeight = box ? box.maxY - box.minY : 0;
  if (boxWidth < 1 || boxHeight < 1) {
    return { method: "none", pxPerMm: null, detail: "The Surface outline has no usable extent, so the nominal size cannot calibrate this photo." };
  }
  const boxLong = Math.max(boxWidth, boxHeight);
  const boxShort = Math.min(boxWidth, boxHeight);
  const mmLong = Math.max(parsed.data.width, parsed.data.height);
  const mmShort = Math.min(parsed.data.width, parsed.data.height);
  const longRatio = boxLong / mmLong;
  const shortRatio = boxShort / mmShort;
  const pxPerMm = (longRatio + shortRatio) / 2;
  const mismatch = (Math.abs(longRatio - shortRatio) / pxPerMm) * 100;
  const warning = mismatch > 5 ? " The two sides disagree by more than 5 %: the part may be tilted, cropped or not this part type." : "";
  return {
    method: "nominal",
    pxPerMm,
    detail:
      `Nominal size: Surface box ${fmt(boxWidth)} × ${fmt(boxHeight)} px against ${fmt(parsed.data.width)} × ${fmt(parsed.data.height)} mm, ` +
      `long side to long side: ${fmt(longRatio, 2)} and ${fmt(shortRatio, 2)} px/mm, mean ${fmt(pxPerMm, 2)} px/mm ` +
      `(sides differ by ${fmt(mismatch)} %; assumes the part lies square to the photo edges).${warning}`,
  };
}

/** The photo's calibration: Ruler(s) first, then nominal size vs Surface, else none. */
export function calibratePhoto(input: { rulers: RulerInput[]; surface?: Shape[]; nominalSizeMm?: { width: number; height: number } | null }): Calibration {
  if (!Array.isArray(input.rulers)) throw new AppError("bad_request", "Rulers must be a list (it may be empty).");
  if (input.rulers.length > 0) return fromRulers(input.rulers);
  const surface = input.surface ?? [];
  if (input.nominalSizeMm && surface.length > 0) return fromNominal(surface, input.nominalSizeMm);
  const missing = input.nominalSizeMm ? "no Surface is marked" : surface.length > 0 ? "the part type has no nominal size" : "no Surface or nominal size";
  return { method: "none", pxPerMm: null, detail: `Not calibrated: no Ruler and ${missing}; lengths and areas stay in pixels.` };
}
