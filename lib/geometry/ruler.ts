/**
 * The Ruler mark: two points on the photo and the real distance between them, typed in by the
 * inspector, from which the photo's pixels-per-millimetre follow. It is kept apart from `Shape`
 * because it paints nothing and is never measured as a defect.
 */
import { MAX_RULER_LENGTH_MM } from "./limits";
import { distance } from "./points";
import type { Point } from "./shape";

export type RulerMark = { a: Point; b: Point; lengthMm: number };

export function rulerLengthPx(ruler: RulerMark): number {
  return distance(ruler.a, ruler.b);
}

/** Pixels per millimetre along the ruler. */
export function rulerPxPerMm(ruler: RulerMark): number {
  return rulerLengthPx(ruler) / ruler.lengthMm;
}

export type ParsedLength = { ok: true; lengthMm: number } | { ok: false; message: string };

/**
 * Reads a typed ruler length such as "12.5", "12,5" (decimal comma) or "12.5 mm". Anything else,
 * and lengths outside (0, MAX_RULER_LENGTH_MM], get a message for the input's error line.
 */
export function parseRulerLength(text: string): ParsedLength {
  const match = /^\s*(\d+(?:[.,]\d+)?|[.,]\d+)\s*(?:mm)?\s*$/i.exec(text);
  if (!match) return { ok: false, message: "Type the length in millimetres, for example 12.5." };
  const lengthMm = Number(match[1].replace(",", "."));
  return checkRulerLength(lengthMm);
}

export function checkRulerLength(lengthMm: number): ParsedLength {
  if (!Number.isFinite(lengthMm) || lengthMm <= 0) return { ok: false, message: "The length must be more than 0 mm." };
  if (lengthMm > MAX_RULER_LENGTH_MM) return { ok: false, message: `The length must be at most ${MAX_RULER_LENGTH_MM} mm.` };
  return { ok: true, lengthMm };
}
