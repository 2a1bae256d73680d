/**
 * Lengths and areas of marked regions in pixels and, where the photo is calibrated, millimetres.
 * The `…Mm` helpers return null when the calibration has no scale, never a guess.
 */
import { AppError } from "@/lib/errors";
import type { LineShape, SpotShape } from "@/lib/geometry/shape";
import type { Calibration } from "@/lib/measure/types";

function assertFinite(value: number, what: string): void {
  if (!Number.isFinite(value)) throw new AppError("bad_request", `${what} must be a finite number (got ${value}).`);
}

/** Length of a Line's centre line (the polyline through its points), in pixels. */
export function lineLengthPx(line: LineShape): number {
  if (line.kind !== "line") throw new AppError("bad_request", `Expected a line shape, got "${line.kind}".`);
  if (line.points.length < 2) throw new AppError("bad_request", "A line needs at least two points.");
  let length = 0;
  for (let i = 1; i < line.points.length; i++) {
    const [ax, ay] = line.points[i - 1];
    const [bx, by] = line.points[i];
    for (const v of [ax, ay, bx, by]) assertFinite(v, "A line point coordinate");
    length += Math.hypot(bx - ax, by - ay);
  }
  return length;
}

/** Diameter of a Spot in pixels. */
export function spotDiameterPx(spot: SpotShape): number {
  if (spot.kind !== "spot") throw new AppError("bad_request", `Expected a spot shape, got "${spot.kind}".`);
  assertFinite(spot.radius, "A spot radius");
  if (spot.radius < 0) throw new AppError("bad_request", `A spot radius cannot be negative (got ${spot.radius}).`);
  return 2 * spot.radius;
}

/** Pixels per millimetre of a calibration, or null when uncalibrated. */
export function scaleOf(calibration: Calibration): number | null {
  if (calibration.pxPerMm === null) return null;
  if (!(calibration.pxPerMm > 0) || !Number.isFinite(calibration.pxPerMm)) {
    throw new AppError("bad_request", `A calibration scale must be a positive number of px/mm (got ${calibration.pxPerMm}).`);
  }
  return calibration.pxPerMm;
}

/** A length in pixels converted to millimetres, or null when uncalibrated. */
export function pxToMm(lengthPx: number, calibration: Calibration): number | null {
  assertFinite(lengthPx, "A length in pixels");
  const scale = scaleOf(calibration);
  return scale === null ? null : lengthPx / scale;
}

/** An area in pixels converted to mm² (px / (px/mm)²), or null when uncalibrated. */
export function areaPxToMm2(areaPx: number, calibration: Calibration): number | null {
  assertFinite(areaPx, "An area in pixels");
  if (areaPx < 0) throw new AppError("bad_request", `An area cannot be negative (got ${areaPx}).`);
  const scale = scaleOf(calibration);
  return scale === null ? null : areaPx / (scale * scale);
}

/** Centre-line length of a Line in mm, or null when uncalibrated. */
export function lineLengthMm(line: LineShape, calibration: Calibration): number | null {
  return pxToMm(lineLengthPx(line), calibration);
}

/** Diameter of a Spot in mm, or null when uncalibrated. */
export function spotDiameterMm(spot: SpotShape, calibration: Calibration): number | null {
  return pxToMm(spotDiameterPx(spot), calibration);
}
