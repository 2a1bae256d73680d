/**
 * Select: pick a region, drag it, drag its handles (box corners and edges, polygon and line
 * vertices, the spot's radius grip, ruler ends). A Surface moves only once it is selected. Alt+click on a vertex deletes it; a double-click
 * on an edge of the selected Outline/Line/Surface inserts a vertex there. Every drag is one undo
 * step from press to release, and a drag that would leave the region invalid snaps back.
 */
import { distance } from "@/lib/geometry/points";
import type { Point } from "@/lib/geometry/shape";
import { imagePoint, toShapePoint, type ImagePoint } from "../coords";
import { DRAG_THRESHOLD_PX, HANDLE_TOLERANCE_PX, HIT_TOLERANCE_PX, NUDGE_STEP, stepAlongLadder } from "../constants";
import { beginBatch, cancelBatch } from "../history";
import { hitTestEdge, hitTestHandle, hitTestRegions, isRegionVisible } from "../hit-test";
import * as model from "../model";
import * as edits from "../shape-edits";
import type { AnnotationState, Drag, PointerModifiers, Region } from "../types";
import { clampToImage, imagePx, stageDistance } from "./common";
import type { Tool } from "./types";

const ARROWS: Record<string, [number, number]> = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, -1], ArrowDown: [0, 1] };

function startDrag(state: AnnotationState, region: Region, origin: ImagePoint, target: Drag["target"]): AnnotationState {
  const selected = model.selectRegion(state, region.id);
  return beginBatch({ ...selected, drag: { regionId: region.id, origin, original: region, target } });
}

/** The dragged region for the pointer at `p`, always computed from the press-time original. */
function draggedRegion(state: AnnotationState, drag: Drag, p: Point, modifiers: PointerModifiers): Region | null {
  const { original, target } = drag;
  const image = state.image;
  if (target.kind === "body") {
    let dx = p[0] - drag.origin.x;
    let dy = p[1] - drag.origin.y;
    if (modifiers.shift) [dx, dy] = Math.abs(dx) >= Math.abs(dy) ? [dx, 0] : [0, dy];
    return edits.translateRegion(original, dx, dy, image);
  }
  if (original.role === "ruler") {
    return target.kind === "ruler-end" ? { ...original, ruler: { ...original.ruler, [target.end]: p } } : null;
  }
  const shape = original.shape;
  let next = null;
  if (target.kind === "rect" && shape.kind === "rect") next = edits.resizeRect(shape, target.corner, p, imagePx(state, 1), image);
  if (target.kind === "vertex") next = edits.moveVertex(shape, target.index, p);
  if (target.kind === "radius" && shape.kind === "spot") next = edits.withSpotRadius(shape, distance([shape.x, shape.y], p), image);
  if (!next) return null;
  if (original.role === "surface") return next.kind === "polygon" ? { ...original, shape: next } : null;
  return { ...original, shape: next };
}

function dragTo(state: AnnotationState, point: ImagePoint, modifiers: PointerModifiers): AnnotationState {
  const drag = state.drag;
  if (!drag) return state;
  const p = clampToImage(state, point);
  // Below the threshold the region stays where it was, so a click never nudges it.
  const region = stageDistance(state, drag.origin, p) < DRAG_THRESHOLD_PX ? drag.original : draggedRegion(state, drag, toShapePoint(p), modifiers);
  return region ? model.replaceRegion(state, region) : state;
}

function pressOnSelection(state: AnnotationState, region: Region, p: ImagePoint, modifiers: PointerModifiers): AnnotationState | null {
  const at = toShapePoint(p);
  const handle = hitTestHandle(region, at, imagePx(state, HANDLE_TOLERANCE_PX));
  if (handle) {
    if (modifiers.alt && handle.kind === "vertex") return model.deleteRegionVertex(state, region.id, handle.index);
    return startDrag(state, region, p, handle);
  }
  if (modifiers.clickCount >= 2) {
    const edge = hitTestEdge(region, at, imagePx(state, HIT_TOLERANCE_PX));
    if (edge) return model.insertRegionVertex(state, region.id, edge.segmentIndex, imagePoint(edge.point[0], edge.point[1]));
  }
  return null;
}

function scaleSelected(state: AnnotationState, direction: 1 | -1): AnnotationState {
  const region = model.selectedRegion(state);
  if (region?.role !== "defect") return state;
  if (region.shape.kind === "line") return model.setLineWidth(state, region.id, stepAlongLadder(region.shape.width, direction));
  if (region.shape.kind === "spot") return model.setSpotRadius(state, region.id, region.shape.radius * (direction > 0 ? 1.25 : 0.8));
  return state;
}

export const selectTool: Tool = {
  id: "select",
  label: "Select",
  key: "s",
  description: "Pick, move and reshape regions.",
  shortcuts: [
    { keys: "Drag a region", action: "Move it (Shift: along one axis); a Surface must be selected first" },
    { keys: "Drag a handle", action: "Resize or move a vertex" },
    { keys: "Alt + click a vertex", action: "Delete the vertex" },
    { keys: "Double-click an edge", action: "Insert a vertex" },
    { keys: "Arrow keys", action: "Nudge 1 px (Shift: 10 px)" },
    { keys: "[ / ]", action: "Thinner / wider line, smaller / larger spot" },
    { keys: "Delete or Backspace", action: "Delete the region" },
    { keys: "Escape", action: "Clear the selection" },
  ],
  isEnabled: () => true,
  pointerDown(state, point, modifiers) {
    const p = clampToImage(state, point);
    const selected = model.selectedRegion(state);
    if (selected && isRegionVisible(state, selected)) {
      const handled = pressOnSelection(state, selected, p, modifiers);
      if (handled) return handled;
    }
    const id = hitTestRegions(state, toShapePoint(p), imagePx(state, HIT_TOLERANCE_PX));
    const region = model.regionById(state, id);
    if (!region) return model.selectRegion(state, null);
    // The Surface lies under everything: a press on it only selects it, so a drag meant for
    // something else (or made with the wrong tool) never carries the whole part away.
    if (region.role === "surface" && region.id !== state.selectedId) return model.selectRegion(state, region.id);
    return startDrag(state, region, p, { kind: "body" });
  },
  pointerMove: dragTo,
  pointerUp(state, point, modifiers) {
    return state.drag ? model.finishDrag(dragTo(state, point, modifiers)) : state;
  },
  keyDown(state, key, modifiers) {
    if (key === "Escape") return state.drag ? cancelBatch(state) : model.selectRegion(state, null);
    const id = state.selectedId;
    if (id === null || state.drag) return state;
    if (key === "Delete" || key === "Backspace") return model.deleteRegion(state, id);
    if (key === "[" || key === "]") return scaleSelected(state, key === "]" ? 1 : -1);
    const arrow = ARROWS[key];
    if (arrow) {
      const step = NUDGE_STEP * (modifiers.shift ? 10 : 1);
      return model.moveRegion(state, id, arrow[0] * step, arrow[1] * step);
    }
    return state;
  },
};
