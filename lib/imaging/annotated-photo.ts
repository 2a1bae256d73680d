/**
 * A photo with its regions drawn in and a legend below it, as a JPEG: the attachments of an
 * evidence pack, the photos of a lot report and the thumbnails of a condition certificate.
 * Pure (buffers in, buffer out); the caller reads the photo and its regions.
 *
 * Decisions:
 * - Regions are in the upright original's pixels (`regionSpace`); the input may be the original or
 *   its preview (same picture, other size): shapes are scaled from `regionSpace` to the output.
 * - The output fits in `maxEdge` px (never enlarged); styles scale with it (`styleScale`), so a
 *   320 px thumbnail and a 1 600 px page photo both show readable dashes and hatching.
 * - Styles come from the Bench's style table (lib/annotate/class-looks.ts: a class's look follows
 *   its key), so a class looks the same here as on the canvas. A region of a class the part type
 *   does not list is drawn in the "unlisted class" style and named by its key in the legend.
 * - The legend lists the classes present on this photo, each with its swatch (fill + dash) and
 *   its number of regions, and the Surface when one is drawn. Text is drawn as paths in the
 *   report font (svg-text.ts), so no server font is needed.
 */
import sharp from "sharp";
import { defectStyleMap } from "@/lib/annotate/class-looks";
import { SURFACE_STYLE, UNKNOWN_DEFECT_STYLE, type RegionStyle } from "@/lib/annotate/defect-styles";
import type { Shape } from "@/lib/geometry/shape";
import { defsSvg, shapeSvg, swatchSvg, type StyledShape } from "./annotation-svg";
import { measureText, svgText } from "./svg-text";

export type AnnotatedPhotoInput = {
  image: Buffer;
  /** Size of the upright original the region coordinates refer to; default: the image's own upright size. */
  regionSpace?: { width: number; height: number };
  regions: readonly { defect: string; shape: Shape }[];
  surface?: readonly Shape[];
  /** The part type's defect classes, in the order the legend lists them. */
  classes: readonly { key: string; label: string }[];
  /** A line above the legend, e.g. "Unit OV-24-0113 · Front · grade C". */
  caption?: string;
  maxEdge?: number;
  legend?: boolean;
  quality?: number;
};

export type AnnotatedPhoto = { jpeg: Buffer; width: number; height: number; photoHeight: number };

/**
 * Output sizes (long edge, px) by use. Report: a half A4 page is about 7 in wide, so 1 000 px
 * prints at ~140 dpi; more costs time (decoding and drawing grow with the area) for no visible
 * gain. Certificate: a quarter-width thumbnail (~1.7 in) at 320 px is ~190 dpi, and the photo
 * worker already stores a 320 px thumbnail to start from. Attachment: e-mailed to a supplier
 * who zooms in, so larger.
 */
export const ANNOTATED_EDGE = { report: 1000, certificate: 320, attachment: 1600 } as const;

/** Below this many output px on the long edge, marks keep their screen size; above, they grow. */
const REFERENCE_EDGE = 1000;
const DEFAULT_MAX_EDGE = ANNOTATED_EDGE.attachment;

export const styleScale = (longEdge: number) => Math.max(1, longEdge / REFERENCE_EDGE);

export type LegendEntry = { label: string; style: RegionStyle; count?: number };

function legendEntries(input: AnnotatedPhotoInput, styleOf: (defect: string) => RegionStyle): LegendEntry[] {
  const counts = new Map<string, number>();
  for (const region of input.regions) counts.set(region.defect, (counts.get(region.defect) ?? 0) + 1);
  const known = input.classes.filter((c) => counts.has(c.key)).map((c) => ({ label: c.label, style: styleOf(c.key), count: counts.get(c.key) }));
  const listed = new Set(input.classes.map((c) => c.key));
  const unknown = [...counts.keys()].filter((key) => !listed.has(key)).map((key) => ({ label: `${key} (class not listed)`, style: UNKNOWN_DEFECT_STYLE, count: counts.get(key) }));
  const surface = input.surface?.length ? [{ label: "Surface (part outline)", style: SURFACE_STYLE }] : [];
  return [...known, ...unknown, ...surface];
}

/** Lays the legend out in rows that wrap at `width`; returns its SVG (from y = top) and height. */
function legendSvg(entries: LegendEntry[], caption: string | undefined, width: number, top: number, scale: number): { svg: string; height: number } {
  const size = 13 * scale;
  const pad = 10 * scale;
  const swatch = { width: 26 * scale, height: 14 * scale };
  const gap = 18 * scale;
  const lineHeight = 22 * scale;
  const parts: string[] = [];
  let y = top + pad;
  if (caption) {
    parts.push(svgText(caption, { x: pad, y: y + size, size, fill: "#111111", weight: "semibold" }).svg);
    y += lineHeight;
  }
  let x = pad;
  for (const entry of entries) {
    const label = entry.count === undefined ? entry.label : `${entry.label} (${entry.count})`;
    const itemWidth = swatch.width + 6 * scale + measureText(label, size);
    if (x > pad && x + itemWidth > width - pad) {
      x = pad;
      y += lineHeight;
    }
    parts.push(`<rect x="${x}" y="${y + 1 * scale}" width="${swatch.width}" height="${swatch.height}" fill="#8a8f94"/>`);
    parts.push(swatchSvg(entry.style, x, y + 1 * scale, swatch.width, swatch.height, scale));
    parts.push(svgText(label, { x: x + swatch.width + 6 * scale, y: y + size * 0.95, size, fill: "#111111" }).svg);
    x += itemWidth + gap;
  }
  if (!entries.length && !caption) return { svg: "", height: 0 };
  // y is the top of the last row of entries, or already below the caption when there are none.
  const bottom = entries.length ? y + lineHeight : y;
  return { svg: parts.join(""), height: Math.ceil(bottom + pad - top) };
}

export type AnnotationOverlay = { svg: string; legendHeight: number; legend: LegendEntry[] };

/** The SVG drawn over a `width` × `height` photo (plus the legend band below it). */
export function annotationOverlay(input: AnnotatedPhotoInput, size: { width: number; height: number }, space: { width: number; height: number }): AnnotationOverlay {
  const { width, height } = size;
  const scale = styleScale(Math.max(width, height));
  const transform = { sx: width / space.width, sy: height / space.height };
  const styles = defectStyleMap(input.classes.map((c) => c.key));
  const styleOf = (defect: string) => styles.get(defect) ?? UNKNOWN_DEFECT_STYLE;
  const shapes: StyledShape[] = [
    ...(input.surface ?? []).map((shape) => ({ shape, style: SURFACE_STYLE, kind: "surface" as const })),
    ...input.regions.map((region) => ({ shape: region.shape, style: styleOf(region.defect), kind: "defect" as const })),
  ];
  const entries = input.legend === false ? [] : legendEntries(input, styleOf);
  const legend = input.legend === false ? { svg: "", height: 0 } : legendSvg(entries, input.caption, width, height, scale);
  const svg =
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height + legend.height}">` +
    defsSvg([...shapes.map((s) => s.style), ...entries.map((e) => e.style)], scale) +
    shapes.map((s) => shapeSvg(s, transform, scale)).join("") +
    legend.svg +
    `</svg>`;
  return { svg, legendHeight: legend.height, legend: entries };
}

export async function renderAnnotatedPhoto(input: AnnotatedPhotoInput): Promise<AnnotatedPhoto> {
  const maxEdge = input.maxEdge ?? DEFAULT_MAX_EDGE;
  const meta = await sharp(input.image).metadata();
  const upright = meta.autoOrient ?? { width: meta.width, height: meta.height };
  if (!upright.width || !upright.height) throw new Error("The photo has no size");
  const fit = Math.min(1, maxEdge / Math.max(upright.width, upright.height));
  const width = Math.max(1, Math.round(upright.width * fit));
  const height = Math.max(1, Math.round(upright.height * fit));
  const overlay = annotationOverlay(input, { width, height }, input.regionSpace ?? upright);

  const jpeg = await sharp(input.image)
    .rotate()
    .resize(width, height, { fit: "fill" })
    .extend({ bottom: overlay.legendHeight, background: "#FFFFFF" })
    .composite([{ input: Buffer.from(overlay.svg), top: 0, left: 0 }])
    .jpeg({ quality: input.quality ?? 82 })
    .toBuffer();
  return { jpeg, width, height: height + overlay.legendHeight, photoHeight: height };
}
