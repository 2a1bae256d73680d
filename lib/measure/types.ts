/**
 * Shared result types of the measurement engine. `measureCoverage` (lib/imaging/coverage.ts)
 * fills `CoverageResult`; lib/measure adds calibration, lengths and pixel faults per photo;
 * lib/grading turns a unit's photo measurements into metrics and a grade.
 */
import type { Shape } from "@/lib/geometry/shape";

export type CoverageInput = {
  width: number;
  height: number;
  regions: { id: string; defect: string; shape: Shape }[];
  /** The part's own outline(s); the whole image when absent or empty. */
  surface?: Shape[];
  zones?: { id: string; shape: Shape }[];
};

export type CoverageResult = {
  /** Pixels of the surface (the whole image when no surface is given). */
  surfacePx: number;
  byDefect: Record<string, { px: number; share: number; count: number }>;
  byZone: Record<string, { zonePx: number; byDefect: Record<string, { px: number; share: number }> }>;
};

/** How a photo's pixel → millimetre scale was found. */
export type Calibration = { method: "ruler"; pxPerMm: number; detail: string } | { method: "nominal"; pxPerMm: number; detail: string } | { method: "none"; pxPerMm: null; detail: string };

/** ISO 13406-2 pixel-fault classes; "beyond" means worse than class IV allows. */
export type PixelFaultClass = "I" | "II" | "III" | "IV" | "beyond";

export type PixelFaultCounts = {
  /** Type 1: always lit. */
  alwaysLit: number;
  /** Type 2: always dark. */
  alwaysDark: number;
  /** Type 3: sub-pixel (stuck or dead colour element). */
  subPixel: number;
  /** Clusters (two or more faults within a 5 × 5 pixel block) of type 1 or 2. */
  clustersLitOrDark: number;
  /** Clusters of type 3. */
  clustersSubPixel: number;
};

export type DefectMeasure = {
  px: number;
  share: number;
  count: number;
  /** Union area in mm² where the photo is calibrated. */
  areaMm2: number | null;
  /** Line regions: longest single centre-line length and the sum, in mm where calibrated. */
  maxLengthMm: number | null;
  totalLengthMm: number | null;
  /** Spot regions: largest diameter in mm where calibrated. */
  maxDiameterMm: number | null;
};

export type PhotoMeasurement = {
  photoId: string;
  viewKey: string;
  width: number;
  height: number;
  calibration: Calibration;
  surfacePx: number;
  surfaceMm2: number | null;
  byDefect: Record<string, DefectMeasure>;
  byZone: Record<string, { zonePx: number; byDefect: Record<string, { px: number; share: number; areaMm2: number | null }> }>;
  /** Display views only (part type has a panel resolution). */
  pixelFaults: { panelPixels: number; counts: PixelFaultCounts; isoClass: PixelFaultClass } | null;
};
