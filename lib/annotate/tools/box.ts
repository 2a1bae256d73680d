/** Box: press, drag to the opposite corner, release. Shift keeps it square; a click adds nothing. */
import type { RectShape } from "@/lib/geometry/shape";
import { imagePoint, type ImagePoint } from "../coords";
import { DRAG_THRESHOLD_PX } from "../constants";
import { addDefectShape } from "../model";
import type { AnnotationState, PointerModifiers } from "../types";
import { clampToImage, hasDefectClass, imagePx, stageDistance, withoutDraft } from "./common";
import type { Tool } from "./types";

function constrain(state: AnnotationState, start: ImagePoint, p: ImagePoint, modifiers: PointerModifiers): ImagePoint {
  if (!modifiers.shift) return p;
  const side = Math.max(Math.abs(p.x - start.x), Math.abs(p.y - start.y));
  return clampToImage(state, imagePoint(start.x + Math.sign(p.x - start.x || 1) * side, start.y + Math.sign(p.y - start.y || 1) * side));
}

/** The rect spanned by two corners, at least one stage pixel across so it stays visible and valid. */
export function rectFromCorners(state: AnnotationState, a: ImagePoint, b: ImagePoint): RectShape {
  const minSize = imagePx(state, 1);
  return {
    kind: "rect",
    x: Math.min(a.x, b.x),
    y: Math.min(a.y, b.y),
    width: Math.max(Math.abs(b.x - a.x), minSize),
    height: Math.max(Math.abs(b.y - a.y), minSize),
  };
}

export const boxTool: Tool = {
  id: "box",
  label: "Box",
  key: "b",
  description: "Drag a rectangle around a defect.",
  shortcuts: [
    { keys: "Shift + drag", action: "Square box" },
    { keys: "Escape", action: "Cancel the box being drawn" },
  ],
  isEnabled: hasDefectClass,
  pointerDown(state, point) {
    const start = clampToImage(state, point);
    return { ...state, draft: { tool: "box", start, current: start } };
  },
  pointerMove(state, point, modifiers) {
    const draft = state.draft;
    if (draft?.tool !== "box") return state;
    return { ...state, draft: { ...draft, current: constrain(state, draft.start, clampToImage(state, point), modifiers) } };
  },
  pointerUp(state, point, modifiers) {
    const draft = state.draft;
    if (draft?.tool !== "box") return state;
    const end = constrain(state, draft.start, clampToImage(state, point), modifiers);
    const cleared = withoutDraft(state);
    if (stageDistance(state, draft.start, end) < DRAG_THRESHOLD_PX) return cleared;
    return addDefectShape(cleared, rectFromCorners(state, draft.start, end));
  },
  keyDown(state, key) {
    return key === "Escape" && state.draft?.tool === "box" ? withoutDraft(state) : state;
  },
};
