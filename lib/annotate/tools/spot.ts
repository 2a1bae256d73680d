/**
 * Spot: a disc for dead pixels and dust. Press on the centre and drag out the radius; a click
 * without dragging gives DEFAULT_SPOT_RADIUS_PX on screen, so the mark matches what the inspector
 * sees at the current zoom (at 400 % that is 2 original pixels).
 */
import { DEFAULT_SPOT_RADIUS_PX, DRAG_THRESHOLD_PX } from "../constants";
import { addDefectShape } from "../model";
import { clampToImage, hasDefectClass, imagePx, stageDistance, withoutDraft } from "./common";
import type { Tool } from "./types";
import { withSpotRadius } from "../shape-edits";

export const spotTool: Tool = {
  id: "spot",
  label: "Spot",
  key: "p",
  description: "Click a dead pixel or dust speck, or drag out a larger radius.",
  shortcuts: [
    { keys: "Click", action: "Spot of the default size" },
    { keys: "Drag", action: "Spot with the dragged radius" },
    { keys: "Escape", action: "Cancel the spot being drawn" },
  ],
  isEnabled: hasDefectClass,
  pointerDown(state, point) {
    const centre = clampToImage(state, point);
    return { ...state, draft: { tool: "spot", centre, radius: imagePx(state, DEFAULT_SPOT_RADIUS_PX), dragged: false } };
  },
  pointerMove(state, point) {
    const draft = state.draft;
    if (draft?.tool !== "spot") return state;
    const p = clampToImage(state, point);
    if (!draft.dragged && stageDistance(state, draft.centre, p) < DRAG_THRESHOLD_PX) return state;
    return { ...state, draft: { ...draft, dragged: true, radius: Math.hypot(p.x - draft.centre.x, p.y - draft.centre.y) } };
  },
  pointerUp(state, point, modifiers) {
    const moved = spotTool.pointerMove(state, point, modifiers);
    const draft = moved.draft;
    if (draft?.tool !== "spot") return state;
    const shape = withSpotRadius({ kind: "spot", x: draft.centre.x, y: draft.centre.y, radius: draft.radius }, draft.radius, state.image);
    return addDefectShape(withoutDraft(state), shape);
  },
  keyDown(state, key) {
    return key === "Escape" && state.draft?.tool === "spot" ? withoutDraft(state) : state;
  },
};
