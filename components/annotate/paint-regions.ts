/**
 * Painting regions onto a 2D canvas context whose transform is already image space (the layer's
 * viewport transform, set by Konva). Plain functions, no React and no Konva nodes: the regions
 * layer is one Konva shape whose sceneFunc calls `paintScene`, so 1 000 regions cost one node,
 * off-screen regions are skipped, and nothing is rebuilt when the view pans (paths are cached
 * per immutable shape object).
 *
 * Screen-constant sizes: the context is scaled by `scale` (stage px per image px), so widths,
 * dashes, handle sizes and font sizes in screen px are divided by it before use.
 */
import type { Region } from "@/lib/annotate/types";
import { boundsOfPoints, boundsOfShape, expandBounds, type Bounds } from "@/lib/geometry/bounds";
import type { Point, Shape } from "@/lib/geometry/shape";
import { fillPattern } from "./pattern-tiles";
import { RULER_STYLE, SELECTION_COLOUR, SURFACE_STYLE, UNKNOWN_DEFECT_STYLE, ZONE_STYLE, type RegionStyle } from "@/lib/annotate/defect-styles";
import type { ImageZone } from "./zones";

export type PaintView = Readonly<{ scale: number; visible: Bounds }>;

export type SceneInput = Readonly<{
  regions: readonly Region[];
  hiddenDefects: readonly string[];
  styles: ReadonlyMap<string, RegionStyle>;
  zones: readonly ImageZone[];
}>;

/** Regions smaller than this on screen are drawn as a marker so they never vanish when zoomed out. */
const MARKER_BELOW_PX = 4;
/**
 * Below this size on screen a dash, hatch or tint could not be seen anyway: a solid outline is
 * drawn instead, which is far cheaper to rasterise when a thousand regions are zoomed out.
 */
const DETAIL_BELOW_PX = 14;
const MARKER_SIZE_PX = 5;
const HALO_EXTRA_PX = 2;
const LABEL_FONT = "600 12px ui-sans-serif, system-ui, sans-serif";

const paths = new WeakMap<object, Path2D>();
const boxes = new WeakMap<object, Bounds>();

function tracePolyline(path: Path2D, points: readonly Point[], closed: boolean): void {
  points.forEach(([x, y], i) => (i === 0 ? path.moveTo(x, y) : path.lineTo(x, y)));
  if (closed) path.closePath();
}

/** The shape's outline (a line's centre line), cached per shape object. */
export function shapePath(shape: Shape): Path2D {
  const cached = paths.get(shape);
  if (cached) return cached;
  const path = new Path2D();
  if (shape.kind === "rect") path.rect(shape.x, shape.y, shape.width, shape.height);
  else if (shape.kind === "spot") path.arc(shape.x, shape.y, shape.radius, 0, Math.PI * 2);
  else tracePolyline(path, shape.points, shape.kind === "polygon");
  paths.set(shape, path);
  return path;
}

function shapeBox(shape: Shape): Bounds {
  let box = boxes.get(shape);
  if (!box) boxes.set(shape, (box = boundsOfShape(shape, { includeStroke: true })));
  return box;
}

export function boxesOverlap(a: Bounds, b: Bounds): boolean {
  return a.minX <= b.maxX && a.maxX >= b.minX && a.minY <= b.maxY && a.maxY >= b.minY;
}

/** Halo, then the coloured stroke with the style's dashes, both at constant screen width. */
export function strokeStyled(ctx: CanvasRenderingContext2D, path: Path2D, style: RegionStyle, scale: number, widthPx = style.strokeWidth): void {
  ctx.setLineDash([]);
  ctx.lineJoin = "round";
  ctx.lineCap = "butt";
  // The halo is solid (a casing under the dashes): one dashed stroke per region, not two.
  ctx.lineWidth = (widthPx + HALO_EXTRA_PX) / scale;
  ctx.strokeStyle = style.halo;
  ctx.stroke(path);
  ctx.setLineDash(style.stroke.dash.map((d) => d / scale));
  ctx.lineCap = style.stroke.lineCap;
  ctx.lineWidth = widthPx / scale;
  ctx.strokeStyle = style.colour;
  ctx.stroke(path);
}

function fillStyled(ctx: CanvasRenderingContext2D, path: Path2D, style: RegionStyle, scale: number): void {
  if (style.tintOpacity > 0) {
    ctx.globalAlpha = style.tintOpacity;
    ctx.fillStyle = style.colour;
    ctx.fill(path);
  }
  const pattern = style.fill === "tint" || style.fill === "none" ? null : fillPattern(ctx, style.fill, style.colour, scale);
  if (pattern) {
    ctx.globalAlpha = 0.8;
    ctx.fillStyle = pattern;
    ctx.fill(path);
  }
  ctx.globalAlpha = 1;
}

function paintMarker(ctx: CanvasRenderingContext2D, box: Bounds, style: RegionStyle, scale: number): void {
  const size = MARKER_SIZE_PX / scale;
  const x = (box.minX + box.maxX) / 2 - size / 2;
  const y = (box.minY + box.maxY) / 2 - size / 2;
  ctx.fillStyle = style.halo;
  ctx.fillRect(x - 1 / scale, y - 1 / scale, size + 2 / scale, size + 2 / scale);
  ctx.fillStyle = style.colour;
  ctx.fillRect(x, y, size, size);
}

/** One defect or surface shape in its style. */
export function paintShape(ctx: CanvasRenderingContext2D, shape: Shape, style: RegionStyle, view: PaintView): void {
  const box = shapeBox(shape);
  if (!boxesOverlap(box, view.visible)) return;
  const extent = Math.max(box.maxX - box.minX, box.maxY - box.minY) * view.scale;
  if (extent < MARKER_BELOW_PX) return paintMarker(ctx, box, style, view.scale);
  const shown = extent < DETAIL_BELOW_PX ? simplified(style) : style;
  const path = shapePath(shape);
  if (shape.kind === "line") {
    // The scratch at its real width, faint, under a screen-width centre line in the class's dashes.
    if (shape.width * view.scale >= 1.5) {
      ctx.setLineDash([]);
      ctx.globalAlpha = 0.35;
      ctx.lineCap = "round";
      ctx.lineJoin = "round";
      ctx.lineWidth = shape.width;
      ctx.strokeStyle = style.colour;
      ctx.stroke(path);
      ctx.globalAlpha = 1;
    }
  } else {
    fillStyled(ctx, path, shown, view.scale);
  }
  strokeStyled(ctx, path, shown, view.scale);
}

const simpleStyles = new WeakMap<RegionStyle, RegionStyle>();

/** The style without dashes, hatching or tint (tiny regions; see DETAIL_BELOW_PX). */
function simplified(style: RegionStyle): RegionStyle {
  let simple = simpleStyles.get(style);
  if (!simple) {
    simple = { ...style, stroke: { ...style.stroke, dash: [], lineCap: "butt" }, fill: "none", tintOpacity: 0 };
    simpleStyles.set(style, simple);
  }
  return simple;
}

/** One region in its style: a defect, a surface or the ruler. */
export function paintRegion(ctx: CanvasRenderingContext2D, region: Region, styles: ReadonlyMap<string, RegionStyle>, view: PaintView): void {
  if (region.role === "ruler") return paintRuler(ctx, region.ruler.a, region.ruler.b, `${region.ruler.lengthMm} mm`, view);
  const style = region.role === "surface" ? SURFACE_STYLE : (styles.get(region.defect) ?? UNKNOWN_DEFECT_STYLE);
  paintShape(ctx, region.shape, style, view);
  ctx.setLineDash([]);
}

/** Text at a constant screen size, white on a dark halo, with its top-left at (x, y) image px. */
export function paintLabel(ctx: CanvasRenderingContext2D, text: string, x: number, y: number, scale: number): void {
  ctx.save();
  ctx.translate(x, y);
  ctx.scale(1 / scale, 1 / scale);
  ctx.setLineDash([]);
  ctx.font = LABEL_FONT;
  ctx.textBaseline = "top";
  ctx.lineJoin = "round";
  ctx.lineWidth = 3;
  ctx.strokeStyle = "rgba(0, 0, 0, 0.8)";
  ctx.strokeText(text, 0, 0);
  ctx.fillStyle = "#FFFFFF";
  ctx.fillText(text, 0, 0);
  ctx.restore();
}

/** The ruler: a line with perpendicular end ticks and its length in mm beside the middle. */
export function paintRuler(ctx: CanvasRenderingContext2D, a: Point, b: Point, label: string | null, view: PaintView): void {
  const length = Math.hypot(b[0] - a[0], b[1] - a[1]);
  const path = new Path2D();
  path.moveTo(a[0], a[1]);
  path.lineTo(b[0], b[1]);
  if (length > 0) {
    const tick = 7 / view.scale;
    const nx = (-(b[1] - a[1]) / length) * tick;
    const ny = ((b[0] - a[0]) / length) * tick;
    for (const [x, y] of [a, b]) {
      path.moveTo(x - nx, y - ny);
      path.lineTo(x + nx, y + ny);
    }
  }
  strokeStyled(ctx, path, RULER_STYLE, view.scale);
  if (label) paintLabel(ctx, label, (a[0] + b[0]) / 2 + 8 / view.scale, (a[1] + b[1]) / 2 + 6 / view.scale, view.scale);
}

function paintZones(ctx: CanvasRenderingContext2D, zones: readonly ImageZone[], view: PaintView): void {
  for (const zone of zones) {
    if (zone.points.length < 3) continue;
    const box = boundsOfPoints(zone.points);
    if (!boxesOverlap(box, view.visible)) continue;
    const path = new Path2D();
    tracePolyline(path, zone.points, true);
    strokeStyled(ctx, path, ZONE_STYLE, view.scale);
    paintLabel(ctx, zone.label, box.minX + 4 / view.scale, box.minY + 4 / view.scale, view.scale);
  }
}

/** Everything of the regions layer, bottom to top: surfaces, zones, defects, the ruler. */
export function paintScene(ctx: CanvasRenderingContext2D, scene: SceneInput, view: PaintView): void {
  const hidden = new Set(scene.hiddenDefects);
  for (const region of scene.regions) if (region.role === "surface") paintRegion(ctx, region, scene.styles, view);
  paintZones(ctx, scene.zones, view);
  for (const region of scene.regions) if (region.role === "defect" && !hidden.has(region.defect)) paintRegion(ctx, region, scene.styles, view);
  for (const region of scene.regions) if (region.role === "ruler") paintRegion(ctx, region, scene.styles, view);
  ctx.setLineDash([]);
}

/** White casing under amber dashes: unlike any class stroke, so the selection never reads as a class. */
const SELECTION_STYLE: RegionStyle = { ...RULER_STYLE, colour: SELECTION_COLOUR, halo: "rgba(255, 255, 255, 0.95)", stroke: { name: "selection", dash: [8, 4], lineCap: "butt" } };

/** The selected region's outline, wide, in the selection style. */
export function paintSelection(ctx: CanvasRenderingContext2D, region: Region, view: PaintView): void {
  let path: Path2D;
  if (region.role === "ruler") {
    path = new Path2D();
    path.moveTo(region.ruler.a[0], region.ruler.a[1]);
    path.lineTo(region.ruler.b[0], region.ruler.b[1]);
  } else {
    path = shapePath(region.shape);
  }
  strokeStyled(ctx, path, SELECTION_STYLE, view.scale, 3);
  ctx.setLineDash([]);
}

/** Square grips at `points` (image px), constant on screen; off-screen ones are skipped. */
export function paintHandles(ctx: CanvasRenderingContext2D, points: readonly Point[], view: PaintView, sizePx = 9): void {
  const size = sizePx / view.scale;
  const margin = expandBounds(view.visible, size);
  ctx.setLineDash([]);
  ctx.lineWidth = 1.5 / view.scale;
  ctx.strokeStyle = "#111111";
  ctx.fillStyle = "#FFFFFF";
  for (const [x, y] of points) {
    if (x < margin.minX || x > margin.maxX || y < margin.minY || y > margin.maxY) continue;
    ctx.fillRect(x - size / 2, y - size / 2, size, size);
    ctx.strokeRect(x - size / 2, y - size / 2, size, size);
  }
}
