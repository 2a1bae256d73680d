/**
 * Ruler: two points on a feature of known size, then its length in millimetres. Drag from one
 * end to the other, or click both ends; the draft then waits in phase "length" until the length
 * input calls model.setRulerLength (typed text goes through parseRulerLength first). A photo has
 * one ruler; placing another replaces it (one undo step).
 */
import { DRAG_THRESHOLD_PX } from "../constants";
import { clampToImage, stageDistance, withoutDraft } from "./common";
import type { Tool } from "./types";

export const rulerTool: Tool = {
  id: "ruler",
  label: "Ruler",
  key: "r",
  description: "Mark both ends of something of known length, then type the length in mm.",
  shortcuts: [
    { keys: "Drag, or click both ends", action: "Place the ruler" },
    { keys: "Escape", action: "Cancel the ruler" },
  ],
  isEnabled: () => true,
  pointerDown(state, point) {
    const p = clampToImage(state, point);
    const draft = state.draft;
    if (draft?.tool === "ruler" && draft.phase === "placing" && !draft.pressed) {
      return { ...state, draft: { ...draft, b: p, pressed: true } };
    }
    return { ...state, draft: { tool: "ruler", a: p, b: p, phase: "placing", pressed: true } };
  },
  pointerMove(state, point) {
    const draft = state.draft;
    if (draft?.tool !== "ruler" || draft.phase !== "placing") return state;
    return { ...state, draft: { ...draft, b: clampToImage(state, point) } };
  },
  pointerUp(state, point) {
    const draft = state.draft;
    if (draft?.tool !== "ruler" || draft.phase !== "placing" || !draft.pressed) return state;
    const b = clampToImage(state, point);
    const placed = stageDistance(state, draft.a, b) >= DRAG_THRESHOLD_PX;
    return { ...state, draft: { ...draft, b: placed ? b : draft.a, phase: placed ? "length" : "placing", pressed: false } };
  },
  keyDown(state, key) {
    return key === "Escape" && state.draft?.tool === "ruler" ? withoutDraft(state) : state;
  },
};
