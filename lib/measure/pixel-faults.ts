/**
 * Pixel faults on a display panel, counted from the Spot regions an inspector marked, and the
 * panel's class under ISO 13406-2:2001 (withdrawn; summarised here, the licensed standard governs).
 *
 * Rules chosen here (docs/references.md marks the scaling rule as unconfirmed):
 * - Every Spot of class `pixel-lit` (type 1), `pixel-dark` (type 2) or `pixel-subpixel` (type 3) is
 *   one fault at its centre. Other shapes of these classes are not counted (listed in `assumptions`).
 * - A cluster is two or more faults that fit in one 5 × 5 block of PANEL pixels, i.e. whose panel
 *   column and row indices both differ by at most 4. Faults are linked pairwise by that test and
 *   each connected group of two or more is one cluster (single linkage). Types 1 and 2 cluster
 *   together; type 3 clusters only with type 3. Clustered faults still count in their type.
 * - Limits scale linearly with the panel's pixel count and are **rounded down**:
 *   `limit = floor(tablePerMillion × panelPixels / 1 000 000)`, so a panel never gets more than its
 *   proportional allowance (a small panel may get 0 where the table says 2).
 * - The class is the best (I before II …) whose every limit the counts meet; "beyond" otherwise.
 */
import { z } from "zod";
import { AppError } from "@/lib/errors";
import type { Point, Shape } from "@/lib/geometry/shape";
import { SHAPE_KINDS, spotShapeSchema } from "@/lib/geometry/shape-schemas";
import type { PixelFaultClass, PixelFaultCounts } from "@/lib/measure/types";

export const PIXEL_LIT = "pixel-lit";
export const PIXEL_DARK = "pixel-dark";
export const PIXEL_SUBPIXEL = "pixel-subpixel";
export const PIXEL_FAULT_DEFECTS = [PIXEL_LIT, PIXEL_DARK, PIXEL_SUBPIXEL] as const;
export type PixelFaultDefect = (typeof PIXEL_FAULT_DEFECTS)[number];

export type IsoPixelClass = Exclude<PixelFaultClass, "beyond">;
export const ISO_PIXEL_CLASSES: IsoPixelClass[] = ["I", "II", "III", "IV"];

/** ISO 13406-2 maximum faults per 1 000 000 pixels (docs/references.md, mark a). */
export const ISO_13406_2_PER_MILLION: Record<IsoPixelClass, PixelFaultCounts> = {
  I: { alwaysLit: 0, alwaysDark: 0, subPixel: 0, clustersLitOrDark: 0, clustersSubPixel: 0 },
  II: { alwaysLit: 2, alwaysDark: 2, subPixel: 5, clustersLitOrDark: 0, clustersSubPixel: 2 },
  III: { alwaysLit: 5, alwaysDark: 15, subPixel: 50, clustersLitOrDark: 0, clustersSubPixel: 5 },
  IV: { alwaysLit: 50, alwaysDark: 150, subPixel: 500, clustersLitOrDark: 5, clustersSubPixel: 50 },
};

const countKeys = ["alwaysLit", "alwaysDark", "subPixel", "clustersLitOrDark", "clustersSubPixel"] as const;

/** Allowed counts per class for a panel of `panelPixels` pixels (rounded down, see file comment). */
export function pixelFaultLimits(panelPixels: number): Record<IsoPixelClass, PixelFaultCounts> {
  if (!Number.isSafeInteger(panelPixels) || panelPixels <= 0) {
    throw new AppError("bad_request", `Panel pixel count must be a positive whole number (got ${panelPixels}).`);
  }
  const limits = {} as Record<IsoPixelClass, PixelFaultCounts>;
  for (const isoClass of ISO_PIXEL_CLASSES) {
    const row = {} as PixelFaultCounts;
    // Integer arithmetic: table values × pixel counts stay far below 2^53.
    for (const key of countKeys) row[key] = Math.floor((ISO_13406_2_PER_MILLION[isoClass][key] * panelPixels) / 1_000_000);
    limits[isoClass] = row;
  }
  return limits;
}

/** The best ISO 13406-2 class whose limits `counts` meet, or "beyond". */
export function pixelFaultClass(counts: PixelFaultCounts, panelPixels: number): PixelFaultClass {
  const limits = pixelFaultLimits(panelPixels);
  for (const isoClass of ISO_PIXEL_CLASSES) {
    if (countKeys.every((key) => counts[key] <= limits[isoClass][key])) return isoClass;
  }
  return "beyond";
}

/**
 * How photo pixel coordinates relate to panel pixels.
 * - `scale`: panel rows and columns run along the photo's axes, `photoPxPerPanelPx` photo pixels per
 *   panel pixel; the offset is unknown, so index differences are `round(|Δphoto| / scale)`.
 * - `corners`: photo positions of the active area's outer corners, in panel order top-left,
 *   top-right, bottom-right, bottom-left (any rotation or perspective); exact indices follow.
 */
export type PanelMapping = { kind: "scale"; photoPxPerPanelPx: number } | { kind: "corners"; corners: [Point, Point, Point, Point] };

const pointSchema = z.tuple([z.number().finite(), z.number().finite()]);
const inputSchema = z.object({
  panel: z.object({
    widthPx: z.number().int().positive({ message: "Panel width must be a positive whole number of pixels." }),
    heightPx: z.number().int().positive({ message: "Panel height must be a positive whole number of pixels." }),
  }),
  regions: z.array(
    z.object({
      id: z.string(),
      defect: z.string(),
      // Only Spots are read; other kinds just need their tag.
      shape: z.union([spotShapeSchema.extend({ radius: spotShapeSchema.shape.radius.nonnegative() }), z.object({ kind: z.enum(SHAPE_KINDS).exclude(["spot"]) }).passthrough()]),
    }),
  ),
  mapping: z
    .discriminatedUnion("kind", [
      z.object({ kind: z.literal("scale"), photoPxPerPanelPx: z.number().finite().positive({ message: "photoPxPerPanelPx must be > 0." }) }),
      z.object({ kind: z.literal("corners"), corners: z.tuple([pointSchema, pointSchema, pointSchema, pointSchema]) }),
    ])
    .optional(),
});
export type PixelFaultInput = {
  panel: { widthPx: number; heightPx: number };
  regions: { id: string; defect: string; shape: Shape }[];
  /** Omitted: one photo pixel is taken as one panel pixel (noted in `assumptions`). */
  mapping?: PanelMapping;
};

export type PixelFaultAssessment = {
  panelPixels: number;
  counts: PixelFaultCounts;
  isoClass: PixelFaultClass;
  limits: Record<IsoPixelClass, PixelFaultCounts>;
  clusters: { kind: "lit-or-dark" | "sub-pixel"; regionIds: string[] }[];
  /** Plain sentences on what was assumed or left out. */
  assumptions: string[];
};

type Mat3 = [number, number, number, number, number, number, number, number, number];

/** Projective map of the unit square (0,0),(1,0),(1,1),(0,1) onto a quad (Heckbert's construction). */
export function squareToQuad(corners: [Point, Point, Point, Point]): Mat3 {
  const [[x0, y0], [x1, y1], [x2, y2], [x3, y3]] = corners;
  const sx = x0 - x1 + x2 - x3;
  const sy = y0 - y1 + y2 - y3;
  let g = 0;
  let h = 0;
  if (Math.abs(sx) > 1e-9 || Math.abs(sy) > 1e-9) {
    const dx1 = x1 - x2,
      dx2 = x3 - x2,
      dy1 = y1 - y2,
      dy2 = y3 - y2;
    const den = dx1 * dy2 - dx2 * dy1;
    if (Math.abs(den) < 1e-12) throw new AppError("bad_request", "The panel corners are degenerate (three in a line).");
    g = (sx * dy2 - dx2 * sy) / den;
    h = (dx1 * sy - sx * dy1) / den;
  }
  return [x1 - x0 + g * x1, x3 - x0 + h * x3, x0, y1 - y0 + g * y1, y3 - y0 + h * y3, y0, g, h, 1];
}

function invert3([a, b, c, d, e, f, g, h, i]: Mat3): Mat3 {
  const A = e * i - f * h,
    B = -(d * i - f * g),
    C = d * h - e * g;
  const det = a * A + b * B + c * C;
  if (Math.abs(det) < 1e-12) throw new AppError("bad_request", "The panel corners do not span an area.");
  return [A / det, -(b * i - c * h) / det, (b * f - c * e) / det, B / det, (a * i - c * g) / det, -(a * f - c * d) / det, C / det, -(a * h - b * g) / det, (a * e - b * d) / det];
}

/** Photo point → (u, v) in the unit square of the panel, for the `corners` mapping. */
export function photoToPanelUnit(corners: [Point, Point, Point, Point]): (p: Point) => Point {
  const m = invert3(squareToQuad(corners));
  return ([x, y]) => {
    const w = m[6] * x + m[7] * y + m[8];
    return [(m[0] * x + m[1] * y + m[2]) / w, (m[3] * x + m[4] * y + m[5]) / w];
  };
}

type Fault = { id: string; type: 1 | 2 | 3; col: number; row: number };

function indexFaults(spots: { id: string; type: 1 | 2 | 3; at: Point }[], input: z.infer<typeof inputSchema>, notes: string[]): Fault[] {
  const { widthPx, heightPx } = input.panel;
  const mapping = input.mapping;
  if (mapping?.kind === "corners") {
    const toUnit = photoToPanelUnit(mapping.corners);
    let outside = 0;
    const faults = spots.map(({ id, type, at }) => {
      const [u, v] = toUnit(at);
      if (u < 0 || v < 0 || u > 1 || v > 1) outside++;
      const col = Math.min(widthPx - 1, Math.max(0, Math.floor(u * widthPx)));
      const row = Math.min(heightPx - 1, Math.max(0, Math.floor(v * heightPx)));
      return { id, type, col, row };
    });
    if (outside > 0) notes.push(`${outside} spot(s) lie outside the panel corners; counted at the nearest edge pixel.`);
    return faults;
  }
  const scale = mapping?.photoPxPerPanelPx ?? 1;
  if (!mapping) notes.push("No panel mapping was given: one photo pixel is taken as one panel pixel, so clusters may be missed or over-counted.");
  // Positions in panel units; cluster tests round the differences (offset unknown).
  return spots.map(({ id, type, at }) => ({ id, type, col: at[0] / scale, row: at[1] / scale }));
}

function clusterGroups(faults: Fault[], rounded: boolean): string[][] {
  const parent = faults.map((_, i) => i);
  const root = (i: number): number => (parent[i] === i ? i : (parent[i] = root(parent[i])));
  const gap = (a: number, b: number) => (rounded ? Math.round(Math.abs(a - b)) : Math.abs(a - b));
  for (let i = 0; i < faults.length; i++) {
    for (let j = i + 1; j < faults.length; j++) {
      if (gap(faults[i].col, faults[j].col) <= 4 && gap(faults[i].row, faults[j].row) <= 4) parent[root(i)] = root(j);
    }
  }
  const groups = new Map<number, string[]>();
  faults.forEach((fault, i) => groups.set(root(i), [...(groups.get(root(i)) ?? []), fault.id]));
  return [...groups.values()].filter((ids) => ids.length >= 2);
}

/** Counts a photo's pixel-fault Spots and classifies the panel under ISO 13406-2. */
export function assessPixelFaults(input: PixelFaultInput): PixelFaultAssessment {
  const parsed = inputSchema.safeParse(input);
  if (!parsed.success) throw new AppError("bad_request", `Invalid pixel-fault input: ${parsed.error.issues[0].message}`);
  const data = parsed.data;
  const panelPixels = data.panel.widthPx * data.panel.heightPx;
  const assumptions: string[] = [];
  const typeOf: Record<PixelFaultDefect, 1 | 2 | 3> = { [PIXEL_LIT]: 1, [PIXEL_DARK]: 2, [PIXEL_SUBPIXEL]: 3 };

  const spots: { id: string; type: 1 | 2 | 3; at: Point }[] = [];
  let otherShapes = 0;
  for (const region of data.regions) {
    if (!(PIXEL_FAULT_DEFECTS as readonly string[]).includes(region.defect)) continue;
    if (region.shape.kind !== "spot") {
      otherShapes++;
      continue;
    }
    spots.push({ id: region.id, type: typeOf[region.defect as PixelFaultDefect], at: [region.shape.x, region.shape.y] });
  }
  if (otherShapes > 0) assumptions.push(`${otherShapes} pixel-fault region(s) are not Spots and were not counted.`);

  const faults = indexFaults(spots, data, assumptions);
  const rounded = data.mapping?.kind !== "corners";
  const litOrDark = clusterGroups(
    faults.filter((f) => f.type !== 3),
    rounded,
  );
  const subPixel = clusterGroups(
    faults.filter((f) => f.type === 3),
    rounded,
  );

  const counts: PixelFaultCounts = {
    alwaysLit: faults.filter((f) => f.type === 1).length,
    alwaysDark: faults.filter((f) => f.type === 2).length,
    subPixel: faults.filter((f) => f.type === 3).length,
    clustersLitOrDark: litOrDark.length,
    clustersSubPixel: subPixel.length,
  };
  return {
    panelPixels,
    counts,
    isoClass: pixelFaultClass(counts, panelPixels),
    limits: pixelFaultLimits(panelPixels),
    clusters: [...litOrDark.map((regionIds) => ({ kind: "lit-or-dark" as const, regionIds })), ...subPixel.map((regionIds) => ({ kind: "sub-pixel" as const, regionIds }))],
    assumptions,
  };
}
