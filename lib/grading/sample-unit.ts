/**
 * A sample unit for the Rubrics screen's live preview: one number per thing the rubric reads
 * (a "reading"), turned into photo measurements the real evaluation grades. Nothing is measured;
 * the numbers are what a trainer types to see which rules fire.
 *
 * How readings become photos (so every rule reads exactly the typed number):
 * - one sample photo per view of the part type, each with all of its view's zones present
 *   (10 000 px each), plus one photo "any view" for readings whose rule names no view;
 * - a zone reading without a view goes on the first view that has the zone;
 * - the sample photos are calibrated at 10 px/mm and their surface is 1 000 000 px;
 * - a class with any non-zero reading on a photo is present there (count at least 1).
 */
import type { DefectMeasure, PhotoMeasurement, PixelFaultClass } from "@/lib/measure/types";
import type { DefectSeverity } from "@/lib/part-types/severity";
import { ruleZone, type Rubric } from "./rubric-schema";
import type { FunctionalFailureCounts } from "./unit-metrics";
import type { ViewDefinition } from "@/lib/part-types/schemas";

export const ANY_VIEW = "(any view)";
const SURFACE_PX = 1_000_000;
const ZONE_PX = 10_000;
const PX_PER_MM = 10;

export type SampleReading = {
  key: string;
  metric: "share" | "count" | "maxLengthMm" | "totalLengthMm" | "areaMm2" | "maxDiameterMm";
  defect: string;
  view: string | null;
  zone: string | null;
};
export type PixelReading = { key: string; view: string | null };

export type SampleValues = {
  readings: Record<string, number>;
  pixelClasses: Record<string, PixelFaultClass>;
  functionalFailures: FunctionalFailureCounts;
};

export const readingKey = (r: Omit<SampleReading, "key">) => [r.metric, r.defect, r.view ?? "", r.zone ?? ""].join("|");

/** What a rubric reads, once per distinct selector, in rubric order. */
export function sampleReadingsFor(rubric: Rubric): { readings: SampleReading[]; pixels: PixelReading[]; severities: DefectSeverity[] } {
  const readings = new Map<string, SampleReading>();
  const pixels = new Map<string, PixelReading>();
  const severities = new Set<DefectSeverity>();
  for (const rule of rubric.rules) {
    if (rule.metric === "functionalFailures") severities.add(rule.severity);
    else if (rule.metric === "pixelFaultClass") pixels.set(rule.view ?? "", { key: rule.view ?? "", view: rule.view ?? null });
    else {
      const reading = { metric: rule.metric, defect: rule.defect, view: rule.view ?? null, zone: ruleZone(rule) ?? null };
      const key = readingKey(reading);
      if (!readings.has(key)) readings.set(key, { key, ...reading });
    }
  }
  return { readings: [...readings.values()], pixels: [...pixels.values()], severities: [...severities] };
}

// Unread millimetre values are 0, not unknown: a sample has nothing it could not measure.
const emptyDefect = (): DefectMeasure => ({ px: 0, share: 0, count: 0, areaMm2: 0, maxLengthMm: 0, totalLengthMm: 0, maxDiameterMm: 0 });

function samplePhoto(photoId: string, viewKey: string, zones: string[]): PhotoMeasurement {
  return {
    photoId,
    viewKey,
    width: 1000,
    height: 1000,
    calibration: { method: "ruler", pxPerMm: PX_PER_MM, detail: "Sample photo, 10 px/mm." },
    surfacePx: SURFACE_PX,
    surfaceMm2: SURFACE_PX / PX_PER_MM ** 2,
    byDefect: {},
    byZone: Object.fromEntries(zones.map((zone) => [zone, { zonePx: ZONE_PX, byDefect: {} }])),
    pixelFaults: null,
  };
}

function applyReading(photo: PhotoMeasurement, reading: SampleReading, value: number) {
  const defect = (photo.byDefect[reading.defect] ??= emptyDefect());
  if (value > 0) {
    defect.count = Math.max(defect.count, 1);
    defect.px = Math.max(defect.px, 1);
  }
  if (reading.zone !== null) {
    const zone = (photo.byZone[reading.zone] ??= { zonePx: ZONE_PX, byDefect: {} });
    const entry = (zone.byDefect[reading.defect] ??= { px: 0, share: 0, areaMm2: 0 });
    const px = reading.metric === "share" ? (Math.min(value, 100) / 100) * zone.zonePx : value * PX_PER_MM ** 2;
    entry.px = Math.max(entry.px, Math.min(px, zone.zonePx));
    entry.share = entry.px / zone.zonePx;
    entry.areaMm2 = entry.px / PX_PER_MM ** 2;
    return;
  }
  switch (reading.metric) {
    case "share":
      defect.share = Math.min(value, 100) / 100;
      defect.px = Math.max(defect.px, Math.round(defect.share * SURFACE_PX));
      break;
    case "count":
      defect.count = Math.round(value);
      break;
    default:
      defect[reading.metric] = value;
  }
}

/** Sample photo measurements and failure counts from the typed values (missing values are 0). */
export function buildSampleUnit(views: readonly ViewDefinition[], rubric: Rubric, values: SampleValues): { photos: PhotoMeasurement[]; functionalFailures: FunctionalFailureCounts } {
  const photos = new Map<string, PhotoMeasurement>(
    views.map((view, i) => [
      view.key,
      samplePhoto(
        `sample-${i + 1}`,
        view.key,
        view.zones.map((z) => z.id),
      ),
    ]),
  );
  const anyView = samplePhoto("sample-any", ANY_VIEW, []);
  const photoFor = (view: string | null, zone: string | null) => {
    if (view !== null) return photos.get(view) ?? null;
    if (zone !== null) return [...photos.values()].find((photo) => zone in photo.byZone) ?? anyView;
    return anyView;
  };
  const { readings, pixels } = sampleReadingsFor(rubric);
  for (const reading of readings) {
    const value = values.readings[reading.key] ?? 0;
    const photo = photoFor(reading.view, reading.zone);
    if (photo && Number.isFinite(value) && value >= 0) applyReading(photo, reading, value);
  }
  for (const pixel of pixels) {
    const photo = photoFor(pixel.view, null);
    if (photo)
      photo.pixelFaults = { panelPixels: 1_000_000, counts: { alwaysLit: 0, alwaysDark: 0, subPixel: 0, clustersLitOrDark: 0, clustersSubPixel: 0 }, isoClass: values.pixelClasses[pixel.key] ?? "I" };
  }
  return { photos: [...photos.values(), anyView], functionalFailures: values.functionalFailures };
}
