/**
 * What rubric rules read about one unit: a compact, validated copy of its photo measurements
 * plus its failed functional checks, and `readMetric`, which aggregates one rule's metric.
 *
 * Aggregation over photos (a rule with a view reads only photos of that view; several photos of
 * one view aggregate the same way):
 * - share          → worst (max) photo: a share is relative to one photo's surface or zone, and
 *                    adding shares of different photos would mean nothing.
 * - count          → sum: each photo shows a different face. Two photos of the same face may count
 *                    one defect twice; give such rules a view.
 * - maxLengthMm, maxDiameterMm → max;  totalLengthMm, areaMm2 → sum.
 * - pixelFaultClass → worst class over photos that carry a pixel-fault count.
 * - functionalFailures → the unit's count of failed checklist items of that severity.
 * A photo without a defect class contributes 0. Millimetre metrics are unknown on a photo that
 * shows the class but has no value (no calibration, or no Line/Spot regions to measure): such
 * photos are listed in `unknown`, and the aggregate of the other photos is a lower bound.
 */
import { z } from "zod";
import { AppError } from "@/lib/errors";
import type { PhotoMeasurement, PixelFaultClass } from "@/lib/measure/types";
import type { DefectSeverity } from "@/lib/part-types/severity";
import { PIXEL_FAULT_CLASSES, isDefectRule, pixelClassRank, ruleZone, type Rule } from "./rubric-schema";

export type FunctionalFailureCounts = Record<DefectSeverity, number>;

export type DefectValues = {
  /** Percent (0–100) of the photo's surface. */
  sharePercent: number;
  count: number;
  areaMm2: number | null;
  maxLengthMm: number | null;
  totalLengthMm: number | null;
  maxDiameterMm: number | null;
};

export type PhotoMetrics = {
  photoId: string;
  viewKey: string;
  calibrated: boolean;
  byDefect: Record<string, DefectValues>;
  /** Zones present on the photo (zone px > 0); per defect: percent of the zone and area. */
  byZone: Record<string, Record<string, { sharePercent: number; px: number; areaMm2: number | null }>>;
  pixelFaultClass: PixelFaultClass | null;
};

export type UnitMetrics = { photos: PhotoMetrics[]; functionalFailures: FunctionalFailureCounts };

const count = z.number().int().min(0);
const fraction = z.number().min(0).max(1);
const optionalMm = z.number().min(0).nullable();
const measurementSchema = z.object({
  photoId: z.string().min(1),
  viewKey: z.string().min(1),
  calibration: z.object({ pxPerMm: z.number().positive().nullable() }),
  byDefect: z.record(z.string(), z.object({ share: fraction, count, areaMm2: optionalMm, maxLengthMm: optionalMm, totalLengthMm: optionalMm, maxDiameterMm: optionalMm })),
  byZone: z.record(z.string(), z.object({ zonePx: z.number().min(0), byDefect: z.record(z.string(), z.object({ px: z.number().min(0), share: fraction, areaMm2: optionalMm })) })),
  pixelFaults: z.object({ isoClass: z.enum(PIXEL_FAULT_CLASSES) }).nullable(),
});
const failuresSchema = z.strictObject({ critical: count, major: count, minor: count });

const invalid = (what: string, issue: z.core.$ZodIssue) => new AppError("bad_request", `Invalid ${what}: ${issue.path.map(String).join(".") || "value"}: ${issue.message}`);

/** Validates a unit's photo measurements and failure counts into the form rules read. */
export function buildUnitMetrics(input: { photos: readonly PhotoMeasurement[]; functionalFailures: FunctionalFailureCounts }): UnitMetrics {
  const failures = failuresSchema.safeParse(input.functionalFailures);
  if (!failures.success) throw invalid("functional failure counts", failures.error.issues[0]);
  const seen = new Set<string>();
  const photos = input.photos.map((raw, index): PhotoMetrics => {
    const parsed = measurementSchema.safeParse(raw);
    if (!parsed.success) throw invalid(`photo measurement ${index + 1}`, parsed.error.issues[0]);
    const photo = parsed.data;
    if (seen.has(photo.photoId)) throw new AppError("bad_request", `Photo "${photo.photoId}" is measured twice; each photo counts once.`);
    seen.add(photo.photoId);
    const byDefect: PhotoMetrics["byDefect"] = {};
    for (const [defect, m] of Object.entries(photo.byDefect)) {
      const { share, ...rest } = m;
      byDefect[defect] = { sharePercent: share * 100, ...rest };
    }
    const byZone: PhotoMetrics["byZone"] = {};
    for (const [zone, zoneMeasure] of Object.entries(photo.byZone)) {
      if (zoneMeasure.zonePx <= 0) continue; // zone outside the surface on this photo: not applicable
      byZone[zone] = Object.fromEntries(Object.entries(zoneMeasure.byDefect).map(([defect, m]) => [defect, { sharePercent: m.share * 100, px: m.px, areaMm2: m.areaMm2 }]));
    }
    return {
      photoId: photo.photoId,
      viewKey: photo.viewKey,
      calibrated: photo.calibration.pxPerMm !== null,
      byDefect,
      byZone,
      pixelFaultClass: photo.pixelFaults?.isoClass ?? null,
    };
  });
  return { photos, functionalFailures: failures.data };
}

export type UnknownReason = "uncalibrated" | "not-measured";
export type MissingReason = "no-photos" | "no-photo-of-view" | "zone-not-on-photos" | "no-pixel-fault-count";

export type MetricReading = {
  /** Aggregate over photos with a known value; null when nothing could be read (see `missing`). */
  value: number | PixelFaultClass | null;
  /** Photos that show the defect class but whose mm value is unknown, and why. */
  unknown: { photoId: string; viewKey: string; reason: UnknownReason }[];
  missing: MissingReason | null;
};

const maxOf = (values: number[]) => values.reduce((a, b) => Math.max(a, b), 0);
const sumOf = (values: number[]) => values.reduce((a, b) => a + b, 0);

/** Total count of a defect class over all photos (used by the built-in critical-defect rule). */
export const totalDefectCount = (metrics: UnitMetrics, defect: string): number => sumOf(metrics.photos.map((photo) => photo.byDefect[defect]?.count ?? 0));

/** Reads the value a rule compares, aggregated over the photos the rule applies to. */
export function readMetric(metrics: UnitMetrics, rule: Rule): MetricReading {
  if (rule.metric === "functionalFailures") {
    return { value: metrics.functionalFailures[rule.severity], unknown: [], missing: null };
  }
  const photos = rule.view === undefined ? metrics.photos : metrics.photos.filter((photo) => photo.viewKey === rule.view);
  if (photos.length === 0) return { value: null, unknown: [], missing: rule.view === undefined ? "no-photos" : "no-photo-of-view" };

  if (rule.metric === "pixelFaultClass") {
    const classes = photos.map((photo) => photo.pixelFaultClass).filter((cls): cls is PixelFaultClass => cls !== null);
    if (classes.length === 0) return { value: null, unknown: [], missing: "no-pixel-fault-count" };
    return { value: classes.reduce((a, b) => (pixelClassRank(b) > pixelClassRank(a) ? b : a)), unknown: [], missing: null };
  }
  if (!isDefectRule(rule)) throw new Error("unreachable: every other metric is a defect metric");

  const zone = ruleZone(rule);
  const known: number[] = [];
  const unknown: MetricReading["unknown"] = [];
  let applicable = 0;
  for (const photo of photos) {
    let present: boolean;
    let value: number | null;
    if (zone !== undefined) {
      const inZone = photo.byZone[zone];
      if (inZone === undefined) continue;
      const m = inZone[rule.defect];
      present = (m?.px ?? 0) > 0;
      value = rule.metric === "share" ? (m?.sharePercent ?? 0) : (m?.areaMm2 ?? null);
    } else {
      const m = photo.byDefect[rule.defect];
      present = (m?.count ?? 0) > 0;
      value = m === undefined ? 0 : rule.metric === "share" ? m.sharePercent : m[rule.metric];
    }
    applicable += 1;
    if (!present) known.push(0);
    else if (value !== null) known.push(value);
    else unknown.push({ photoId: photo.photoId, viewKey: photo.viewKey, reason: photo.calibrated ? "not-measured" : "uncalibrated" });
  }
  if (applicable === 0) return { value: null, unknown: [], missing: "zone-not-on-photos" };
  const aggregate = rule.metric === "share" || rule.metric === "maxLengthMm" || rule.metric === "maxDiameterMm" ? maxOf : sumOf;
  return { value: known.length > 0 ? aggregate(known) : null, unknown, missing: null };
}
