/**
 * One photo's measurement: coverage per defect class and zone (measureCoverage), the photo's
 * px → mm calibration (calibratePhoto), lengths, diameters and areas in mm, and — on a display
 * part's panel views — the ISO 13406-2 pixel-fault class (assessPixelFaults). Pure apart from
 * the sharp rasteriser inside measureCoverage; no database.
 *
 * Decisions (each one is also written into `notes` when it applied):
 * - Zones are stored per view as polygons in 0..1 coordinates of the **Surface's bounding box**
 *   (x to the right, y down, as the view's instructions show the part). They map to pixels as
 *   `x = minX + u·(maxX − minX)`, `y = minY + v·(maxY − minY)`. Without a Surface the box is the
 *   whole image. A part shot turned or mirrored against its view's instructions gets its zones in
 *   the wrong place: the Surface box cannot tell.
 * - Lengths (maxLengthMm, totalLengthMm) come from Line regions only, as the centre line's length,
 *   not clipped to the Surface; diameters (maxDiameterMm) from Spot regions only. A class without
 *   such regions has null (not 0): the rubric reports "could not evaluate" rather than passing.
 * - Areas in mm² are the union pixel counts over (px/mm)², so overlaps never count twice.
 * - Pixel faults: see `panelFor`. The photo → panel scale is the Surface box against the panel
 *   resolution, long side to long side (the Surface is taken as the lit active area); without a
 *   Surface, one photo pixel is one panel pixel (assessPixelFaults notes that).
 */
import { z } from "zod";
import { AppError } from "@/lib/errors";
import type { PolygonShape, Shape } from "@/lib/geometry/shape";
import { measureCoverage, type CoverageOptions } from "@/lib/imaging/coverage";
import { calibratePhoto, shapesBoundingBox, type RulerInput } from "@/lib/measure/calibration";
import { areaPxToMm2, lineLengthPx, pxToMm, spotDiameterPx } from "@/lib/measure/lengths";
import { assessPixelFaults, PIXEL_FAULT_DEFECTS, type PanelMapping } from "@/lib/measure/pixel-faults";
import type { DefectMeasure, PhotoMeasurement } from "@/lib/measure/types";

export type NormalisedZone = { id: string; polygon: [number, number][] };
export type PanelSize = { width: number; height: number };

export type MeasurePhotoInput = {
  photoId: string;
  viewKey: string;
  /** Upright original size in pixels. */
  width: number;
  height: number;
  defects: { id: string; defect: string; shape: Shape }[];
  /** The part's own outline(s); the whole image when empty. */
  surfaces: Shape[];
  rulers: RulerInput[];
  /** The view's zones, in 0..1 coordinates of the Surface bounding box. */
  zones: NormalisedZone[];
  nominalSizeMm: { width: number; height: number } | null;
  /** The panel's pixel grid when this photo is assessed for pixel faults (see `panelFor`), else null. */
  panel: PanelSize | null;
};

export type PhotoMeasurementResult = { measurement: PhotoMeasurement; notes: string[] };

const unit = z
  .number({ error: "must be a number" })
  .finite("must be a finite number")
  .min(-0.5, "lies far outside the Surface box (below -0.5)")
  .max(1.5, "lies far outside the Surface box (above 1.5)");
const zonesSchema = z.array(
  z.object({
    id: z.string().min(1, "must not be empty"),
    polygon: z.array(z.tuple([unit, unit])).min(3, "a zone needs at least 3 points"),
  }),
);

/** The box zones are normalised to: the Surface's bounding box, else the whole image. */
export function zoneReferenceBox(surfaces: Shape[], size: { width: number; height: number }) {
  const box = surfaces.length > 0 ? shapesBoundingBox(surfaces) : null;
  if (box && box.maxX - box.minX > 0 && box.maxY - box.minY > 0) return { ...box, source: "surface" as const };
  return { minX: 0, minY: 0, maxX: size.width, maxY: size.height, source: "image" as const };
}

/** Zone polygons from 0..1 Surface-box coordinates to photo pixels. */
export function zonesToPixels(zones: NormalisedZone[], surfaces: Shape[], size: { width: number; height: number }): { id: string; shape: PolygonShape }[] {
  const parsed = zonesSchema.safeParse(zones);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const zone = typeof issue.path[0] === "number" ? zones[issue.path[0]]?.id : undefined;
    throw new AppError("bad_request", `The part type's zone ${zone ? `"${zone}"` : "list"} is not valid: ${issue.message}.`);
  }
  const box = zoneReferenceBox(surfaces, size);
  const w = box.maxX - box.minX;
  const h = box.maxY - box.minY;
  return parsed.data.map((zone) => ({
    id: zone.id,
    shape: { kind: "polygon", points: zone.polygon.map(([u, v]) => [box.minX + u * w, box.minY + v * h] as [number, number]) },
  }));
}

/**
 * Whether a photo is assessed for pixel faults, and against which panel: only for part types
 * with a panel resolution, on views whose key starts with "screen" (a lit test screen) or on any
 * photo where pixel-fault Spots were marked (a marked fault must never be ignored).
 */
export function panelFor(input: { panelResolution: PanelSize | null; viewKey: string; defects: { defect: string }[] }): PanelSize | null {
  if (!input.panelResolution) return null;
  const marked = input.defects.some((region) => (PIXEL_FAULT_DEFECTS as readonly string[]).includes(region.defect));
  return input.viewKey.startsWith("screen") || marked ? input.panelResolution : null;
}

/** Photo → panel mapping from the Surface box (long side to long side), or undefined without one. */
export function panelMappingFromSurface(surfaces: Shape[], panel: PanelSize): PanelMapping | undefined {
  const box = surfaces.length > 0 ? shapesBoundingBox(surfaces) : null;
  if (!box) return undefined;
  const boxLong = Math.max(box.maxX - box.minX, box.maxY - box.minY);
  const boxShort = Math.min(box.maxX - box.minX, box.maxY - box.minY);
  if (boxShort < 1) return undefined;
  const scale = (boxLong / Math.max(panel.width, panel.height) + boxShort / Math.min(panel.width, panel.height)) / 2;
  return { kind: "scale", photoPxPerPanelPx: scale };
}

const maxOrNull = (values: number[]) => (values.length === 0 ? null : Math.max(...values));
const sumOrNull = (values: number[]) => (values.length === 0 ? null : values.reduce((a, b) => a + b, 0));

export async function measurePhoto(input: MeasurePhotoInput, options: CoverageOptions = {}): Promise<PhotoMeasurementResult> {
  const notes: string[] = [];
  const size = { width: input.width, height: input.height };
  const zones = zonesToPixels(input.zones, input.surfaces, size);
  if (zones.length > 0 && zoneReferenceBox(input.surfaces, size).source === "image") {
    notes.push("No Surface is marked: zones were placed on the whole image instead of the part's outline.");
  }

  const coverage = await measureCoverage({ width: input.width, height: input.height, regions: input.defects, surface: input.surfaces, zones }, options);
  const calibration = calibratePhoto({ rulers: input.rulers, surface: input.surfaces, nominalSizeMm: input.nominalSizeMm });
  notes.push(calibration.detail);

  const byDefect: Record<string, DefectMeasure> = {};
  for (const [defect, measured] of Object.entries(coverage.byDefect)) {
    const ofClass = input.defects.filter((region) => region.defect === defect);
    const linesMm: number[] = [];
    const spotsMm: number[] = [];
    for (const { shape } of ofClass) {
      if (shape.kind === "line" && shape.points.length >= 2) {
        const mm = pxToMm(lineLengthPx(shape), calibration);
        if (mm !== null) linesMm.push(mm);
      } else if (shape.kind === "spot") {
        const mm = pxToMm(spotDiameterPx(shape), calibration);
        if (mm !== null) spotsMm.push(mm);
      }
    }
    byDefect[defect] = {
      ...measured,
      areaMm2: areaPxToMm2(measured.px, calibration),
      maxLengthMm: maxOrNull(linesMm),
      totalLengthMm: sumOrNull(linesMm),
      maxDiameterMm: maxOrNull(spotsMm),
    };
  }

  const byZone: PhotoMeasurement["byZone"] = {};
  for (const [zoneId, zone] of Object.entries(coverage.byZone)) {
    byZone[zoneId] = {
      zonePx: zone.zonePx,
      byDefect: Object.fromEntries(Object.entries(zone.byDefect).map(([defect, m]) => [defect, { px: m.px, share: m.share, areaMm2: areaPxToMm2(m.px, calibration) }])),
    };
    if (zone.zonePx === 0) notes.push(`Zone "${zoneId}" falls outside the Surface on this photo; its rules do not apply here.`);
  }

  let pixelFaults: PhotoMeasurement["pixelFaults"] = null;
  if (input.panel) {
    const mapping = panelMappingFromSurface(input.surfaces, input.panel);
    const assessment = assessPixelFaults({ panel: { widthPx: input.panel.width, heightPx: input.panel.height }, regions: input.defects, mapping });
    pixelFaults = { panelPixels: assessment.panelPixels, counts: assessment.counts, isoClass: assessment.isoClass };
    if (mapping?.kind === "scale") {
      notes.push(`Pixel faults: the Surface is taken as the panel's active area, ${mapping.photoPxPerPanelPx.toFixed(2)} photo px per panel px.`);
    }
    notes.push(...assessment.assumptions);
  }

  return {
    measurement: {
      photoId: input.photoId,
      viewKey: input.viewKey,
      width: input.width,
      height: input.height,
      calibration,
      surfacePx: coverage.surfacePx,
      surfaceMm2: areaPxToMm2(coverage.surfacePx, calibration),
      byDefect,
      byZone,
      pixelFaults,
    },
    notes,
  };
}
