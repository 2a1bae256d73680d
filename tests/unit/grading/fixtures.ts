/**
 * Builders of PhotoMeasurement values for the grading tests (plain data, no measuring engine):
 * a 1000 × 1000 px photo whose whole image is the surface, calibrated at 10 px/mm unless
 * `pxPerMm: null` is given.
 */
import type { DefectMeasure, PhotoMeasurement, PixelFaultClass } from "@/lib/measure/types";

const SIDE = 1000;
const SURFACE_PX = SIDE * SIDE;

type DefectInput = Partial<DefectMeasure> & { share?: number };
type ZoneInput = { zonePx?: number; byDefect?: Record<string, { px?: number; share: number; areaMm2?: number | null }> };

export function photo(input: {
  photoId: string;
  viewKey: string;
  pxPerMm?: number | null;
  defects?: Record<string, DefectInput>;
  zones?: Record<string, ZoneInput>;
  pixelClass?: PixelFaultClass;
}): PhotoMeasurement {
  const pxPerMm = input.pxPerMm === undefined ? 10 : input.pxPerMm;
  const byDefect: Record<string, DefectMeasure> = {};
  for (const [defect, d] of Object.entries(input.defects ?? {})) {
    const share = d.share ?? 0;
    byDefect[defect] = {
      px: d.px ?? Math.round(share * SURFACE_PX),
      share,
      count: d.count ?? 1,
      areaMm2: d.areaMm2 ?? null,
      maxLengthMm: d.maxLengthMm ?? null,
      totalLengthMm: d.totalLengthMm ?? null,
      maxDiameterMm: d.maxDiameterMm ?? null,
    };
  }
  const byZone: PhotoMeasurement["byZone"] = {};
  for (const [zone, z] of Object.entries(input.zones ?? {})) {
    const zonePx = z.zonePx ?? 100_000;
    byZone[zone] = {
      zonePx,
      byDefect: Object.fromEntries(Object.entries(z.byDefect ?? {}).map(([defect, m]) => [defect, { px: m.px ?? Math.round(m.share * zonePx), share: m.share, areaMm2: m.areaMm2 ?? null }])),
    };
  }
  return {
    photoId: input.photoId,
    viewKey: input.viewKey,
    width: SIDE,
    height: SIDE,
    calibration: pxPerMm === null ? { method: "none", pxPerMm: null, detail: "no ruler" } : { method: "ruler", pxPerMm, detail: "test ruler" },
    surfacePx: SURFACE_PX,
    surfaceMm2: pxPerMm === null ? null : SURFACE_PX / (pxPerMm * pxPerMm),
    byDefect,
    byZone,
    pixelFaults: input.pixelClass
      ? {
          panelPixels: 2_000_000,
          counts: { alwaysLit: 0, alwaysDark: 0, subPixel: 0, clustersLitOrDark: 0, clustersSubPixel: 0 },
          isoClass: input.pixelClass,
        }
      : null,
  };
}

export const noFailures = { critical: 0, major: 0, minor: 0 };
