/**
 * Regions of a photo as an SVG overlay, in the same colours, dashes and fills as the Bench canvas
 * (the one style source, lib/annotate/defect-styles.ts and class-looks.ts), so a class is told apart by
 * pattern as well as colour in e-mails and PDFs too. Pure string building; annotated-photo.ts
 * rasterises it with sharp.
 *
 * Sizes: the canvas's styles are in screen px; here they are multiplied by `scale` (chosen by the
 * caller from the output size) so marks read alike on a thumbnail and on a full page.
 */
import type { FillPattern, RegionStyle } from "@/lib/annotate/defect-styles";
import type { Shape } from "@/lib/geometry/shape";

export type Transform = { sx: number; sy: number };
export type StyledShape = { shape: Shape; style: RegionStyle; kind: "defect" | "surface" };

const TILE = 8;
const f = (n: number) => String(Math.round(n * 1000) / 1000);
const esc = (s: string) => s.replace(/&/g, "&amp;").replace(/"/g, "&quot;").replace(/</g, "&lt;");

/** A stable id for a fill pattern in one colour (patterns are shared by regions of a class). */
export const patternId = (fill: FillPattern, colour: string) => `f-${fill}-${colour.replace(/[^0-9a-zA-Z]/g, "")}`;

/** <pattern> for a hatch/dot fill: a dark underlay line under the class colour, as pattern-tiles.ts draws it. */
export function patternDef(fill: FillPattern, colour: string, scale: number): string {
  if (fill === "tint" || fill === "none") return "";
  const s = TILE * scale;
  const lines: string[] = [];
  if (fill === "hatch-forward" || fill === "cross-hatch") for (const k of [-1, 0, 1]) lines.push(`M${f(k * s)} ${f(s)}L${f(k * s + s)} 0`);
  if (fill === "hatch-back" || fill === "cross-hatch") for (const k of [-1, 0, 1]) lines.push(`M${f(k * s)} 0L${f(k * s + s)} ${f(s)}`);
  if (fill === "rows") lines.push(`M0 ${f(s / 2)}L${f(s)} ${f(s / 2)}`);
  const body =
    fill === "dots"
      ? `<circle cx="${f(s / 2)}" cy="${f(s / 2)}" r="${f(1.6 * scale)}" fill="${colour}" stroke="rgba(0,0,0,0.45)" stroke-width="${f(1.3 * scale)}"/>`
      : `<path d="${lines.join("")}" fill="none" stroke="rgba(0,0,0,0.45)" stroke-width="${f(1.3 * scale)}"/><path d="${lines.join("")}" fill="none" stroke="${colour}" stroke-width="${f(0.6 * scale)}"/>`;
  return `<pattern id="${patternId(fill, colour)}" patternUnits="userSpaceOnUse" width="${f(s)}" height="${f(s)}">${body}</pattern>`;
}

function geometry(shape: Shape, t: Transform, scale: number): { tag: string; attrs: string; area: boolean } {
  switch (shape.kind) {
    case "rect":
      return { tag: "rect", attrs: `x="${f(shape.x * t.sx)}" y="${f(shape.y * t.sy)}" width="${f(shape.width * t.sx)}" height="${f(shape.height * t.sy)}"`, area: true };
    case "polygon":
      return { tag: "polygon", attrs: `points="${shape.points.map(([x, y]) => `${f(x * t.sx)},${f(y * t.sy)}`).join(" ")}"`, area: true };
    case "spot": {
      // A one-pixel dead pixel must still be findable on a thumbnail.
      const r = Math.max(shape.radius * Math.min(t.sx, t.sy), 3 * scale);
      return { tag: "circle", attrs: `cx="${f(shape.x * t.sx)}" cy="${f(shape.y * t.sy)}" r="${f(r)}"`, area: true };
    }
    case "line":
      return { tag: "polyline", attrs: `points="${shape.points.map(([x, y]) => `${f(x * t.sx)},${f(y * t.sy)}`).join(" ")}"`, area: false };
  }
}

const dashAttr = (style: RegionStyle, scale: number) =>
  style.stroke.dash.length ? ` stroke-dasharray="${style.stroke.dash.map((d) => f(d * scale)).join(" ")}" stroke-linecap="${style.stroke.lineCap}"` : "";

/** One region: halo, area fill (tint + pattern), then the dashed outline on top. */
export function shapeSvg({ shape, style }: StyledShape, t: Transform, scale: number): string {
  const { tag, attrs, area } = geometry(shape, t, scale);
  const strokeWidth = style.strokeWidth * scale;
  const out: string[] = [];
  if (shape.kind === "line") {
    // The scratch's own measured width as a translucent band, then the class's dashed centre line.
    const band = Math.max(shape.width * Math.min(t.sx, t.sy), strokeWidth);
    out.push(`<${tag} ${attrs} fill="none" stroke="${style.colour}" stroke-opacity="${Math.max(style.tintOpacity, 0.25)}" stroke-width="${f(band)}" stroke-linejoin="round" stroke-linecap="round"/>`);
  }
  out.push(`<${tag} ${attrs} fill="none" stroke="${esc(style.halo)}" stroke-width="${f(strokeWidth + 2 * scale)}" stroke-linejoin="round"/>`);
  if (area && style.tintOpacity > 0) out.push(`<${tag} ${attrs} fill="${style.colour}" fill-opacity="${style.tintOpacity}" stroke="none"/>`);
  if (area && style.fill !== "tint" && style.fill !== "none") out.push(`<${tag} ${attrs} fill="url(#${patternId(style.fill, style.colour)})" stroke="none"/>`);
  out.push(`<${tag} ${attrs} fill="none" stroke="${style.colour}" stroke-width="${f(strokeWidth)}" stroke-linejoin="round"${dashAttr(style, scale)}/>`);
  return out.join("");
}

/** A legend swatch: the class's fill and dashed outline in a small box at (x, y). */
export function swatchSvg(style: RegionStyle, x: number, y: number, width: number, height: number, scale: number): string {
  const rect: StyledShape = { shape: { kind: "rect", x, y, width, height }, style, kind: "defect" };
  return shapeSvg(rect, { sx: 1, sy: 1 }, scale);
}

/** The <defs> every shape of `styles` needs. */
export function defsSvg(styles: readonly RegionStyle[], scale: number): string {
  const seen = new Set<string>();
  const defs: string[] = [];
  for (const style of styles) {
    const id = patternId(style.fill, style.colour);
    if (seen.has(id)) continue;
    seen.add(id);
    defs.push(patternDef(style.fill, style.colour, scale));
  }
  return `<defs>${defs.join("")}</defs>`;
}
