/**
 * How each defect class looks on the Bench canvas. A class is told apart by colour AND by a
 * stroke pattern (dash array) AND by an area fill (tint, hatch or dots), so an inspector with a
 * colour-vision deficiency, or a grey-scale printout of a screenshot, still sees which is which.
 *
 * Colours: the eight colours of Okabe & Ito's "Color Universal Design" palette (2008; hex values
 * from memory), which stay distinguishable under the common forms of colour blindness, plus
 * white as a ninth. Which class wears which colour, dash and fill is decided by the class's key
 * in class-looks.ts, never by its place in a part type's list. Every stroke is drawn over a contrasting halo (black or white, whichever contrasts more
 * with the colour by the WCAG formula), so black, white and yellow marks stay visible on any photo.
 *
 * Dash lengths and stroke widths are **screen** pixels: the painter divides them by the zoom, so
 * a thin scratch stays visible when zoomed out and a dash looks the same at every zoom.
 */

export type FillPattern = "tint" | "hatch-forward" | "hatch-back" | "cross-hatch" | "dots" | "rows" | "none";

export type StrokePattern = Readonly<{
  /** Name for the legend and for screen readers. */
  name: string;
  /** Screen px, alternating on/off; empty = solid. */
  dash: readonly number[];
  /** Round caps turn the near-zero dashes of "dotted" into dots. */
  lineCap: "butt" | "round";
}>;

export type RegionStyle = Readonly<{
  colour: string;
  /** Underlay stroke, slightly wider, for contrast against the photo. */
  halo: string;
  stroke: StrokePattern;
  fill: FillPattern;
  /** Opacity of the flat tint under any pattern (0 = none). */
  tintOpacity: number;
  /** Stroke width in screen px. */
  strokeWidth: number;
}>;

export type PaletteColour = Readonly<{ name: string; hex: string }>;

/** Okabe–Ito colours (from memory) plus white; class-looks.ts says which class wears which. */
export const CLASS_COLOURS: readonly PaletteColour[] = [
  { name: "vermillion", hex: "#D55E00" },
  { name: "sky blue", hex: "#56B4E9" },
  { name: "yellow", hex: "#F0E442" },
  { name: "bluish green", hex: "#009E73" },
  { name: "reddish purple", hex: "#CC79A7" },
  { name: "orange", hex: "#E69F00" },
  { name: "blue", hex: "#0072B2" },
  { name: "white", hex: "#FFFFFF" },
  { name: "black", hex: "#000000" },
];

/** Nine dash arrays that differ in rhythm, not only in length (our own choice). */
export const CLASS_STROKES: readonly StrokePattern[] = [
  { name: "solid", dash: [], lineCap: "butt" },
  { name: "long dash", dash: [12, 6], lineCap: "butt" },
  { name: "dotted", dash: [0.001, 5], lineCap: "round" },
  { name: "short dash", dash: [4, 4], lineCap: "butt" },
  { name: "dash dot", dash: [12, 4, 0.001, 4], lineCap: "round" },
  { name: "dash dot dot", dash: [10, 3, 0.001, 3, 0.001, 3], lineCap: "round" },
  { name: "long short", dash: [14, 4, 5, 4], lineCap: "butt" },
  { name: "double dash", dash: [4, 3, 4, 9], lineCap: "butt" },
  { name: "sparse dots", dash: [0.001, 9], lineCap: "round" },
];

/** Fills a class may take (areas only; lines are told apart by their dashes). */
export const CLASS_FILLS: readonly FillPattern[] = ["tint", "hatch-forward", "hatch-back", "cross-hatch", "dots", "rows"];

const CLASS_STROKE_WIDTH = 2;
const CLASS_TINT_OPACITY = 0.18;

/** WCAG 2.x relative luminance of an sRGB hex colour (#RGB or #RRGGBB). */
export function relativeLuminance(hex: string): number {
  const digits = hex.replace(/^#/, "");
  const full = digits.length === 3 ? [...digits].map((d) => d + d).join("") : digits;
  if (!/^[0-9a-fA-F]{6}$/.test(full)) throw new RangeError(`Not a hex colour: ${hex}`);
  const channel = (offset: number) => {
    const c = parseInt(full.slice(offset, offset + 2), 16) / 255;
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * channel(0) + 0.7152 * channel(2) + 0.0722 * channel(4);
}

/** WCAG contrast ratio (L1 + 0.05) / (L2 + 0.05), lighter over darker. */
export function contrastRatio(a: string, b: string): number {
  const [light, dark] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x);
  return (light + 0.05) / (dark + 0.05);
}

/** Black or white, whichever contrasts more with `hex`, slightly see-through. */
export function haloFor(hex: string): string {
  return contrastRatio(hex, "#000000") >= contrastRatio(hex, "#FFFFFF") ? "rgba(0, 0, 0, 0.8)" : "rgba(255, 255, 255, 0.85)";
}

/** The pieces a class style is built from: indices into the lists above, and a fill. */
export type ClassLook = Readonly<{ colour: number; stroke: number; fill: FillPattern }>;

/** A full style from its pieces (every class shares the stroke width and tint strength). */
export function styleOfLook(look: ClassLook): RegionStyle {
  const colour = CLASS_COLOURS[look.colour].hex;
  return { colour, halo: haloFor(colour), stroke: CLASS_STROKES[look.stroke], fill: look.fill, tintOpacity: CLASS_TINT_OPACITY, strokeWidth: CLASS_STROKE_WIDTH };
}

/** A key naming a style's pattern (dash + fill), used to check that classes differ without colour. */
export function patternKey(style: RegionStyle): string {
  return `${style.stroke.dash.join(",") || "solid"}|${style.fill}`;
}

/** The part's own outline: neutral light grey, long dash-dot, no fill (it covers the whole part). */
export const SURFACE_STYLE: RegionStyle = {
  colour: "#E8E8E8",
  halo: "rgba(0, 0, 0, 0.8)",
  stroke: { name: "long dash dot", dash: [16, 5, 2, 5], lineCap: "butt" },
  fill: "none",
  tintOpacity: 0,
  strokeWidth: 1.5,
};

/** The calibration ruler: white with a black halo and end ticks, never filled. */
export const RULER_STYLE: RegionStyle = {
  colour: "#FFFFFF",
  halo: "rgba(0, 0, 0, 0.85)",
  stroke: { name: "solid", dash: [], lineCap: "butt" },
  fill: "none",
  tintOpacity: 0,
  strokeWidth: 2,
};

/** Inspection zones: thin, fine dots, so they never read as a defect. */
export const ZONE_STYLE: RegionStyle = {
  colour: "#F2F2F2",
  halo: "rgba(0, 0, 0, 0.6)",
  stroke: { name: "fine dots", dash: [1, 3], lineCap: "butt" },
  fill: "none",
  tintOpacity: 0,
  strokeWidth: 1,
};

/** A saved region whose class the part type no longer lists: mid grey, solid, cross-hatched. */
export const UNKNOWN_DEFECT_STYLE: RegionStyle = {
  colour: "#9A9A9A",
  halo: "rgba(0, 0, 0, 0.8)",
  stroke: { name: "solid", dash: [], lineCap: "butt" },
  fill: "cross-hatch",
  tintOpacity: 0.12,
  strokeWidth: 2,
};

/** The selection outline drawn around the selected region, in the app's "signal" amber. */
export const SELECTION_COLOUR = "#E08A12";

/** "#RRGGBB" at an opacity, as rgba(), for Konva fills. */
export function hexWithAlpha(hex: string, alpha: number): string {
  if (!/^#[0-9a-fA-F]{6}$/.test(hex)) throw new RangeError(`Not a #RRGGBB colour: ${hex}`);
  const n = parseInt(hex.slice(1), 16);
  return `rgba(${(n >> 16) & 255}, ${(n >> 8) & 255}, ${n & 255}, ${alpha})`;
}
