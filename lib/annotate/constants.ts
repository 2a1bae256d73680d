/**
 * Interaction constants. Those ending in `_PX` are **stage** pixels (what the inspector sees), so
 * the feel is the same at every zoom; convert with stageToImageDistance before comparing with
 * image coordinates. Values are our own choices (common practice for pointer UIs, no source).
 */
/** How close a press must be to a region's painted area to hit it. */
export const HIT_TOLERANCE_PX = 6;
/** How close a press must be to a handle (vertex, corner, radius grip, ruler end). */
export const HANDLE_TOLERANCE_PX = 8;
/** How close to the first vertex a click closes an Outline or Surface. */
export const CLOSE_TOLERANCE_PX = 10;
/** Pointer travel below this is a click, not a drag. */
export const DRAG_THRESHOLD_PX = 3;
/** A freehand stroke adds a vertex each time the pointer has moved this far. */
export const FREEHAND_STEP_PX = 3;
/** Finished freehand shapes are thinned with this Douglas–Peucker tolerance (invisible at the zoom drawn). */
export const SIMPLIFY_TOLERANCE_PX = 0.5;
/** Spot radius when the Spot tool is clicked without dragging. */
export const DEFAULT_SPOT_RADIUS_PX = 8;

/** Smallest spot radius, original px (a 1-pixel-wide dot). */
export const MIN_SPOT_RADIUS = 0.5;
/** Stroke width of new lines, original px. */
export const DEFAULT_LINE_WIDTH = 4;
/** `[` and `]` step the stroke width along this ladder (original px). */
export const LINE_WIDTH_STEPS = [1, 1.5, 2, 3, 4, 6, 8, 12, 16, 24, 32, 48, 64, 96, 128] as const;
/** Arrow keys nudge the selection by this many original px (Shift: ten times as far). */
export const NUDGE_STEP = 1;

/** The next ladder value above (`direction` 1) or below (-1) `value`; stays put at the ends. */
export function stepAlongLadder(value: number, direction: 1 | -1, ladder: readonly number[] = LINE_WIDTH_STEPS): number {
  if (direction > 0) return ladder.find((step) => step > value + 1e-9) ?? Math.max(value, ladder[ladder.length - 1]);
  for (let i = ladder.length - 1; i >= 0; i--) if (ladder[i] < value - 1e-9) return ladder[i];
  return Math.min(value, ladder[0]);
}
