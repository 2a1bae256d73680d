/**
 * Pointer and wheel gestures as pure viewport math (on top of lib/annotate/coords.ts):
 * two-finger pinch, wheel zoom, double-click counting and keeping a region in view.
 * Points are stage (CSS) pixels.
 */
import type { Bounds } from "@/lib/geometry/bounds";
import { clampScale, DEFAULT_SCALE_LIMITS, pan, stagePoint, toImage, wheelZoomFactor, zoomAround, type ScaleLimits, type Size, type StagePoint, type Viewport } from "@/lib/annotate/coords";

export type PinchStart = Readonly<{ viewport: Viewport; a: StagePoint; b: StagePoint }>;

function midpoint(a: StagePoint, b: StagePoint): StagePoint {
  return stagePoint((a.x + b.x) / 2, (a.y + b.y) / 2);
}

/**
 * The viewport for two fingers now at (a, b) that were at (start.a, start.b) under
 * start.viewport: the zoom changes by the ratio of finger distances, and the image point that
 * was under the fingers' midpoint is under their midpoint now, so moving both fingers together
 * pans and spreading them zooms around where they are. The canvas applies it per move, from the
 * previous finger positions, to the viewport current at that moment.
 */
export function pinchViewport(start: PinchStart, a: StagePoint, b: StagePoint, limits: ScaleLimits = DEFAULT_SCALE_LIMITS): Viewport {
  const startDistance = Math.hypot(start.b.x - start.a.x, start.b.y - start.a.y);
  const distanceNow = Math.hypot(b.x - a.x, b.y - a.y);
  // Fingers that start on one spot give no usable ratio: pan only.
  const ratio = startDistance > 1 && distanceNow > 0 ? distanceNow / startDistance : 1;
  const scale = clampScale(start.viewport.scale * ratio, limits);
  const anchor = toImage(start.viewport, midpoint(start.a, start.b));
  const mid = midpoint(a, b);
  return { scale, offsetX: mid.x - anchor.x * scale, offsetY: mid.y - anchor.y * scale };
}

export type WheelInput = Readonly<{ deltaX: number; deltaY: number; deltaMode: number; ctrlKey: boolean }>;

/** WheelEvent.deltaMode: 0 pixels, 1 lines, 2 pages. */
const PIXELS_PER_LINE = 16;
const PIXELS_PER_PAGE = 800;

function toPixels(delta: number, deltaMode: number): number {
  return deltaMode === 1 ? delta * PIXELS_PER_LINE : deltaMode === 2 ? delta * PIXELS_PER_PAGE : delta;
}

/**
 * A wheel turn zooms around the pointer. A mostly sideways scroll (trackpads) pans instead;
 * a trackpad pinch arrives as a wheel event with ctrlKey and small deltas, and zooms.
 */
export function wheelViewport(viewport: Viewport, wheel: WheelInput, anchor: StagePoint, limits: ScaleLimits = DEFAULT_SCALE_LIMITS): Viewport {
  const dx = toPixels(wheel.deltaX, wheel.deltaMode);
  const dy = toPixels(wheel.deltaY, wheel.deltaMode);
  if (!wheel.ctrlKey && Math.abs(dx) > Math.abs(dy)) return pan(viewport, -dx, 0);
  // A trackpad pinch sends small deltas; scale them up so pinching feels like the wheel.
  const zoomDelta = wheel.ctrlKey ? dy * 8 : dy;
  return zoomAround(viewport, anchor, wheelZoomFactor(zoomDelta), limits);
}

export type ClickRecord = Readonly<{ time: number; x: number; y: number; count: number }>;

/** Two presses this close in time (ms) and place (stage px) make a double-click (common practice). */
export const DOUBLE_CLICK_MS = 500;
export const DOUBLE_CLICK_PX = 6;

/**
 * The click count of a press (1, 2, 3 …). PointerEvent.detail is 0 in Chromium, so the canvas
 * counts itself; this also gives touch and pen a double-tap.
 */
export function nextClick(previous: ClickRecord | null, time: number, at: StagePoint): ClickRecord {
  const continues = previous !== null && time - previous.time <= DOUBLE_CLICK_MS && time >= previous.time && Math.hypot(at.x - previous.x, at.y - previous.y) <= DOUBLE_CLICK_PX;
  return { time, x: at.x, y: at.y, count: continues ? previous.count + 1 : 1 };
}

/**
 * The viewport moved (zoom kept) so that `box` (image px) is on screen: unchanged when it already
 * is, otherwise centred on the box. Used when a region is picked from the list.
 */
export function revealBounds(viewport: Viewport, box: Bounds, stage: Size, margin = 24): Viewport {
  const left = box.minX * viewport.scale + viewport.offsetX;
  const top = box.minY * viewport.scale + viewport.offsetY;
  const right = box.maxX * viewport.scale + viewport.offsetX;
  const bottom = box.maxY * viewport.scale + viewport.offsetY;
  if (left >= margin && top >= margin && right <= stage.width - margin && bottom <= stage.height - margin) return viewport;
  const centreX = (box.minX + box.maxX) / 2;
  const centreY = (box.minY + box.maxY) / 2;
  return { ...viewport, offsetX: stage.width / 2 - centreX * viewport.scale, offsetY: stage.height / 2 - centreY * viewport.scale };
}
