/**
 * The two coordinate spaces of the Bench canvas and the viewport between them.
 *
 * - `ImagePoint`: pixels of the **upright original** photo (the space every stored shape uses;
 *   see lib/geometry/shape.ts), even though the canvas draws the smaller preview derivative.
 * - `StagePoint`: pixels of the Konva stage (CSS pixels of the canvas element, origin top-left).
 *
 * A `Viewport` maps one to the other: stage = image × scale + offset. The brands make the type
 * checker refuse a stage point where an image point is due, so a missed conversion is a compile
 * error and not a region drawn in the wrong place.
 */
import type { Bounds } from "@/lib/geometry/bounds";
import type { Point } from "@/lib/geometry/shape";

declare const space: unique symbol;

/** A point in upright original-photo pixels. Build with `imagePoint`. */
export type ImagePoint = Readonly<{ x: number; y: number }> & { readonly [space]: "image" };
/** A point in stage (screen) pixels, e.g. Konva's `stage.getPointerPosition()`. Build with `stagePoint`. */
export type StagePoint = Readonly<{ x: number; y: number }> & { readonly [space]: "stage" };

export type Size = Readonly<{ width: number; height: number }>;

/** stage = image × scale + (offsetX, offsetY). `scale` is stage pixels per original pixel. */
export type Viewport = Readonly<{ scale: number; offsetX: number; offsetY: number }>;

export type ScaleLimits = Readonly<{ min: number; max: number }>;
/** From 1 % (a 40 MP photo fits a small stage) to 32 stage px per original pixel (single dead pixels). */
export const DEFAULT_SCALE_LIMITS: ScaleLimits = { min: 0.01, max: 32 };

export const IDENTITY_VIEWPORT: Viewport = { scale: 1, offsetX: 0, offsetY: 0 };

export function imagePoint(x: number, y: number): ImagePoint {
  return { x, y } as ImagePoint;
}

export function stagePoint(x: number, y: number): StagePoint {
  return { x, y } as StagePoint;
}

/** An image point as a stored-shape tuple. */
export function toShapePoint(p: ImagePoint): Point {
  return [p.x, p.y];
}

/** A stored-shape tuple as an image point (stored shapes are in image space by contract). */
export function fromShapePoint([x, y]: Point): ImagePoint {
  return imagePoint(x, y);
}

export function toStage(viewport: Viewport, p: ImagePoint): StagePoint {
  return stagePoint(p.x * viewport.scale + viewport.offsetX, p.y * viewport.scale + viewport.offsetY);
}

export function toImage(viewport: Viewport, p: StagePoint): ImagePoint {
  return imagePoint((p.x - viewport.offsetX) / viewport.scale, (p.y - viewport.offsetY) / viewport.scale);
}

/** A length on screen (a hit tolerance, a handle size) in original pixels at this zoom. */
export function stageToImageDistance(viewport: Viewport, stagePixels: number): number {
  return stagePixels / viewport.scale;
}

export function imageToStageDistance(viewport: Viewport, imagePixels: number): number {
  return imagePixels * viewport.scale;
}

export function clampScale(scale: number, limits: ScaleLimits = DEFAULT_SCALE_LIMITS): number {
  return Math.min(limits.max, Math.max(limits.min, scale));
}

/**
 * Zoom to `scale` keeping the image point under `anchor` where it is on screen (zoom around the
 * pointer). From anchor = p·s + o before and after: o' = anchor − (anchor − o)·s'/s.
 */
export function zoomTo(viewport: Viewport, scale: number, anchor: StagePoint, limits: ScaleLimits = DEFAULT_SCALE_LIMITS): Viewport {
  const next = clampScale(scale, limits);
  const ratio = next / viewport.scale;
  return {
    scale: next,
    offsetX: anchor.x - (anchor.x - viewport.offsetX) * ratio,
    offsetY: anchor.y - (anchor.y - viewport.offsetY) * ratio,
  };
}

/** Multiply the zoom by `factor` around `anchor` (factor > 1 zooms in); the scale is clamped. */
export function zoomAround(viewport: Viewport, anchor: StagePoint, factor: number, limits: ScaleLimits = DEFAULT_SCALE_LIMITS): Viewport {
  if (!(factor > 0) || !Number.isFinite(factor)) return viewport;
  return zoomTo(viewport, viewport.scale * factor, anchor, limits);
}

/**
 * Wheel delta (pixels, as in WheelEvent.deltaY with deltaMode 0) to a zoom factor. Exponential,
 * so scrolling in and back out by the same amount returns to the same zoom; 100 px ≈ ×1.16.
 */
export function wheelZoomFactor(deltaY: number): number {
  return Math.exp(-deltaY * 0.0015);
}

/** Move the view by a stage-pixel drag. */
export function pan(viewport: Viewport, dx: number, dy: number): Viewport {
  return { ...viewport, offsetX: viewport.offsetX + dx, offsetY: viewport.offsetY + dy };
}

/** The whole photo, centred, as large as fits the stage minus `padding` stage px on each side. */
export function fitToView(image: Size, stage: Size, padding = 16, limits: ScaleLimits = DEFAULT_SCALE_LIMITS): Viewport {
  if (!(image.width > 0 && image.height > 0)) throw new RangeError(`fitToView needs a positive image size, got ${image.width} × ${image.height}`);
  const availableWidth = Math.max(1, stage.width - 2 * padding);
  const availableHeight = Math.max(1, stage.height - 2 * padding);
  const scale = clampScale(Math.min(availableWidth / image.width, availableHeight / image.height), limits);
  return {
    scale,
    offsetX: (stage.width - image.width * scale) / 2,
    offsetY: (stage.height - image.height * scale) / 2,
  };
}

/** One original pixel per stage pixel, keeping the image point under `anchor` in place. */
export function oneToOne(viewport: Viewport, anchor: StagePoint, limits: ScaleLimits = DEFAULT_SCALE_LIMITS): Viewport {
  return zoomTo(viewport, 1, anchor, limits);
}

/** The part of the image space visible on the stage (for culling off-screen regions). */
export function visibleImageBounds(viewport: Viewport, stage: Size): Bounds {
  const topLeft = toImage(viewport, stagePoint(0, 0));
  const bottomRight = toImage(viewport, stagePoint(stage.width, stage.height));
  return { minX: topLeft.x, minY: topLeft.y, maxX: bottomRight.x, maxY: bottomRight.y };
}

/** previewScale = previewWidth / originalWidth (e.g. 2560 / 4000 = 0.64). */
export function previewScaleOf(preview: Size, original: Size): number {
  return preview.width / original.width;
}

/**
 * How to draw the preview bitmap inside the image-space group so it covers the original's
 * size: scale it by 1 / previewScale. Per axis, because the derivative's height is rounded to
 * whole pixels and its ratio can differ from the width's in the fourth decimal
 * (4000 × 3001 → 2560 × 1921). Drawing the node with `width`/`height` set to the original size
 * is the same thing.
 */
export function imageNodeScale(preview: Size, original: Size): { scaleX: number; scaleY: number } {
  return { scaleX: original.width / preview.width, scaleY: original.height / preview.height };
}

/**
 * Whether the preview is being magnified past its own resolution (one preview pixel spans more
 * than one stage pixel), the point at which loading the original would show more detail.
 */
export function previewIsMagnified(viewport: Viewport, previewScale: number): boolean {
  return viewport.scale > previewScale;
}
