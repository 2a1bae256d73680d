/** Small helpers the tools share: clamping pointer input and converting stage-pixel tolerances. */
import { clampPoint } from "@/lib/geometry/clamp";
import { fromShapePoint, stageToImageDistance, toShapePoint, type ImagePoint } from "../coords";
import type { AnnotationState } from "../types";

/** The pointer position moved into the photo (pressing beside the photo marks its edge). */
export function clampToImage(state: AnnotationState, p: ImagePoint): ImagePoint {
  return fromShapePoint(clampPoint(toShapePoint(p), state.image));
}

/** A stage-pixel length (tolerance, threshold) in image pixels at the current zoom. */
export function imagePx(state: AnnotationState, stagePixels: number): number {
  return stageToImageDistance(state.viewport, stagePixels);
}

/** Distance between two image points as it looks on screen. */
export function stageDistance(state: AnnotationState, a: ImagePoint, b: ImagePoint): number {
  return Math.hypot(b.x - a.x, b.y - a.y) * state.viewport.scale;
}

/** Drawing tools need a defect class to give the new region. */
export function hasDefectClass(state: AnnotationState): boolean {
  return state.activeDefect !== null;
}

export function withoutDraft(state: AnnotationState): AnnotationState {
  return state.draft ? { ...state, draft: null } : state;
}
