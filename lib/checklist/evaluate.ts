/**
 * Evaluates one functional checklist item's result. Pure, shared by the bench (live hint) and the
 * server (the stored verdict).
 *
 * Rules chosen here:
 * - A numeric reading is first rounded to the item's `decimals` (half away from zero, on the
 *   decimal digits as typed — 3.395 → 3.40 — not on the nearest binary double), as a meter display
 *   would show it; the rounded value is what is stored and compared. (c) common practice.
 * - Limits are inclusive: a reading equal to `min` or `max` passes.
 * - An item without `min` and `max` records the reading and always passes.
 * - A failed item becomes a functional defect of the item's `severityOnFail`.
 */
import { AppError } from "@/lib/errors";
import type { ChecklistValue } from "@/lib/units/schemas";
import type { ChecklistItem } from "@/lib/part-types/schemas";

export type ItemEvaluation = {
  passed: boolean;
  /** Why it failed, as a sentence for the bench; null when it passed. */
  failureReason: string | null;
  /** The value as stored (numeric readings rounded to the item's decimals). */
  value: ChecklistValue;
};

/** Number of digits after the decimal point in the shortest text form of `value` (1e-7 → 7). */
export function decimalPlaces(value: number): number {
  if (!Number.isFinite(value)) return 0;
  const [mantissa, exponent] = Math.abs(value).toExponential().split("e");
  const fraction = mantissa.split(".")[1]?.length ?? 0;
  return Math.max(0, fraction - Number(exponent));
}

/** `value × 10^decimals` rounded half away from zero, shifting the decimal digits (no binary drift). */
export function scaledInteger(value: number, decimals: number): number {
  if (!Number.isFinite(value)) throw new AppError("bad_request", "The reading must be a finite number.");
  const [mantissa, exponent] = Math.abs(value).toExponential().split("e");
  const shifted = Number(`${mantissa}e${Number(exponent) + decimals}`);
  const rounded = Math.round(shifted);
  return value < 0 ? -rounded : rounded;
}

export function roundToDecimals(value: number, decimals: number): number {
  return Number(`${scaledInteger(value, decimals)}e-${decimals}`);
}

/** "3.40 V", "812 cycles", "87 %". */
export function formatReading(value: number, decimals: number, unit: string): string {
  const text = roundToDecimals(value, decimals).toFixed(decimals);
  return unit ? `${text} ${unit}` : text;
}

const kindMismatch = (item: ChecklistItem) => {
  const wanted = item.kind === "numeric" ? "a reading (a number)" : item.kind === "choice" ? "one of the listed choices" : "pass or fail";
  return new AppError("bad_request", `“${item.label}” takes ${wanted}.`, { fieldErrors: { value: `Enter ${wanted}.` } });
};

export function evaluateChecklistItem(item: ChecklistItem, value: ChecklistValue): ItemEvaluation {
  if (item.kind === "pass_fail") {
    if (!("pass" in value) || typeof value.pass !== "boolean") throw kindMismatch(item);
    return { passed: value.pass, failureReason: value.pass ? null : `Marked as failed: ${item.label}.`, value: { pass: value.pass } };
  }
  if (item.kind === "choice") {
    if (!("choice" in value) || typeof value.choice !== "string") throw kindMismatch(item);
    const option = item.options.find((o) => o.value === value.choice);
    if (!option) {
      throw new AppError("bad_request", `“${value.choice}” is not one of the choices for “${item.label}” (${item.options.map((o) => o.label).join(", ")}).`, {
        fieldErrors: { value: "Pick one of the listed choices." },
      });
    }
    return { passed: option.passes, failureReason: option.passes ? null : `“${option.label}” does not pass: ${item.label}.`, value: { choice: option.value } };
  }
  if (!("reading" in value) || typeof value.reading !== "number") throw kindMismatch(item);
  if (!Number.isFinite(value.reading)) throw new AppError("bad_request", `The reading for “${item.label}” must be a finite number.`, { fieldErrors: { value: "Enter a number." } });
  if (Math.abs(value.reading) > 1e12) throw new AppError("bad_request", `The reading for “${item.label}” is implausibly large.`, { fieldErrors: { value: "Check the reading." } });
  const reading = scaledInteger(value.reading, item.decimals);
  const stored = roundToDecimals(value.reading, item.decimals);
  const shown = (v: number) => formatReading(v, item.decimals, item.unit);
  if (item.min !== null && reading < scaledInteger(item.min, item.decimals)) {
    return { passed: false, failureReason: `${shown(stored)} is below the minimum ${shown(item.min)}.`, value: { reading: stored } };
  }
  if (item.max !== null && reading > scaledInteger(item.max, item.decimals)) {
    return { passed: false, failureReason: `${shown(stored)} is above the maximum ${shown(item.max)}.`, value: { reading: stored } };
  }
  return { passed: true, failureReason: null, value: { reading: stored } };
}

/**
 * A reading below the item's `suspectBelow` level: the part is set aside as suspect, which is more
 * than failing the item (e.g. an over-discharged lithium cell below about 2.5 V may not charge
 * normally and is treated as suspect: docs/references.md, a for the 2.5 V protection cut-off,
 * Battery University BU-802c; c for the handling). Compared like the limits, on the rounded value.
 */
export function suspectReading(item: ChecklistItem, value: ChecklistValue): { reading: string; level: string } | null {
  if (item.kind !== "numeric" || item.suspectBelow == null || !("reading" in value) || !Number.isFinite(value.reading)) return null;
  if (scaledInteger(value.reading, item.decimals) >= scaledInteger(item.suspectBelow, item.decimals)) return null;
  return { reading: formatReading(value.reading, item.decimals, item.unit), level: formatReading(item.suspectBelow, item.decimals, item.unit) };
}

/** "3.40–4.40 V", "at least 80 %", "at most 800 cycles", "any value". */
export function describeLimits(item: Extract<ChecklistItem, { kind: "numeric" }>): string {
  const shown = (v: number) => formatReading(v, item.decimals, item.unit);
  if (item.min !== null && item.max !== null) return `${roundToDecimals(item.min, item.decimals).toFixed(item.decimals)}–${shown(item.max)}`;
  if (item.min !== null) return `at least ${shown(item.min)}`;
  if (item.max !== null) return `at most ${shown(item.max)}`;
  return "any value (recorded only)";
}
