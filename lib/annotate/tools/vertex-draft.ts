/**
 * Drawing by vertices, shared by Outline, Surface (closed rings) and Line (open polylines):
 * - click to add a vertex; a double-click or Enter finishes; a closed tool also finishes on a
 *   click within CLOSE_TOLERANCE_PX of the first vertex;
 * - press and drag adds freehand vertices every FREEHAND_STEP_PX; a draft that is one single
 *   stroke finishes on release (lasso / traced scratch);
 * - Backspace removes the last vertex, Escape drops the draft.
 * Finished vertex lists lose repeats, are thinned by SIMPLIFY_TOLERANCE_PX and capped at
 * MAX_POINTS_PER_SHAPE.
 */
import { describeShapeProblem } from "@/lib/geometry/degenerate";
import { MAX_POINTS_PER_SHAPE } from "@/lib/geometry/limits";
import { dedupeConsecutive, distinctPointsUpTo } from "@/lib/geometry/points";
import type { Point, Shape } from "@/lib/geometry/shape";
import { simplifyPolyline, simplifyRing, simplifyToLimit } from "@/lib/geometry/simplify";
import { toShapePoint, type ImagePoint } from "../coords";
import { CLOSE_TOLERANCE_PX, FREEHAND_STEP_PX, SIMPLIFY_TOLERANCE_PX } from "../constants";
import type { AnnotationState, Draft } from "../types";
import { clampToImage, imagePx, stageDistance, withoutDraft } from "./common";
import type { KeyModifiers, Shortcut, Tool } from "./types";

type VertexToolId = "outline" | "surface" | "line";
type VertexDraft = Extract<Draft, { tool: VertexToolId }>;

export type VertexToolSpec = {
  id: VertexToolId;
  label: string;
  key: string;
  description: string;
  closed: boolean;
  isEnabled(state: AnnotationState): boolean;
  /** Builds the finished shape from the cleaned vertices. */
  shapeFrom(state: AnnotationState, points: Point[]): Shape;
  /** Adds the shape as a region; returns the state unchanged if refused. */
  commit(state: AnnotationState, shape: Shape): AnnotationState;
  /** Extra keys (Line's width keys); return the state unchanged when not handled. */
  extraKey?(state: AnnotationState, key: string, modifiers: KeyModifiers): AnnotationState;
  extraShortcuts?: readonly Shortcut[];
};

function draftOf(state: AnnotationState, id: VertexToolId): VertexDraft | null {
  const draft = state.draft;
  return draft && draft.tool === id ? (draft as VertexDraft) : null;
}

/** The vertices a finished draft would become (repeats removed, thinned, capped). */
export function cleanVertices(state: AnnotationState, points: readonly ImagePoint[], closed: boolean): Point[] {
  let cleaned = dedupeConsecutive(points.map(toShapePoint), closed);
  const tolerance = imagePx(state, SIMPLIFY_TOLERANCE_PX);
  cleaned = closed ? simplifyRing(cleaned, tolerance) : simplifyPolyline(cleaned, tolerance);
  cleaned = simplifyToLimit(cleaned, MAX_POINTS_PER_SHAPE, { closed, startTolerance: tolerance * 2 });
  // An open path back and forth between two points is just the segment between them.
  if (!closed && cleaned.length > 2 && distinctPointsUpTo(cleaned, 3) === 2) {
    const other = cleaned.find((p) => p[0] !== cleaned[0][0] || p[1] !== cleaned[0][1])!;
    cleaned = [cleaned[0], other];
  }
  return cleaned;
}

/** Why the draft cannot be finished yet (for a hint line), or null when Enter would finish it. */
export function vertexDraftProblem(state: AnnotationState, spec: VertexToolSpec): string | null {
  const draft = draftOf(state, spec.id);
  if (!draft) return null;
  return describeShapeProblem(spec.shapeFrom(state, cleanVertices(state, draft.points, spec.closed)));
}

function finish(state: AnnotationState, spec: VertexToolSpec, draft: VertexDraft): AnnotationState {
  const shape = spec.shapeFrom(state, cleanVertices(state, draft.points, spec.closed));
  if (describeShapeProblem(shape)) return state;
  const cleared = withoutDraft(state);
  const committed = spec.commit(cleared, shape);
  return committed === cleared ? state : committed;
}

function removeLastVertex(state: AnnotationState, draft: VertexDraft): AnnotationState {
  if (draft.points.length <= 1) return withoutDraft(state);
  return { ...state, draft: { ...draft, points: draft.points.slice(0, -1) } };
}

export function createVertexTool(spec: VertexToolSpec): Tool {
  const minVertices = spec.closed ? 3 : 2;
  return {
    id: spec.id,
    label: spec.label,
    key: spec.key,
    description: spec.description,
    shortcuts: [
      { keys: "Click", action: "Add a vertex" },
      { keys: "Drag", action: "Draw freehand" },
      ...(spec.closed ? [{ keys: "Click the first vertex", action: "Close the outline" }] : []),
      { keys: "Double-click or Enter", action: spec.closed ? "Close the outline" : "Finish the line" },
      { keys: "Backspace", action: "Remove the last vertex" },
      { keys: "Escape", action: "Cancel the drawing" },
      ...(spec.extraShortcuts ?? []),
    ],
    isEnabled: spec.isEnabled,
    pointerDown(state, point, modifiers) {
      const p = clampToImage(state, point);
      const draft = draftOf(state, spec.id);
      if (!draft) {
        return { ...state, draft: { tool: spec.id, points: [p], hover: p, pressed: true, freehand: true } };
      }
      const nearFirst = spec.closed && draft.points.length >= minVertices && stageDistance(state, p, draft.points[0]) <= CLOSE_TOLERANCE_PX;
      if (modifiers.clickCount >= 2 || nearFirst) {
        const finished = finish(state, spec, draft);
        if (finished !== state) return finished;
      }
      return { ...state, draft: { ...draft, points: [...draft.points, p], hover: p, pressed: true, freehand: false } };
    },
    pointerMove(state, point) {
      const draft = draftOf(state, spec.id);
      if (!draft) return state;
      const p = clampToImage(state, point);
      const last = draft.points[draft.points.length - 1];
      const points = draft.pressed && stageDistance(state, p, last) >= FREEHAND_STEP_PX ? [...draft.points, p] : draft.points;
      return { ...state, draft: { ...draft, points, hover: p } };
    },
    pointerUp(state) {
      const draft = draftOf(state, spec.id);
      if (!draft) return state;
      if (draft.freehand && draft.points.length >= minVertices) {
        const finished = finish(state, spec, draft);
        // A stroke that collapses to nothing usable is dropped rather than left half-drawn.
        return finished === state ? withoutDraft(state) : finished;
      }
      return { ...state, draft: { ...draft, pressed: false, freehand: false } };
    },
    keyDown(state, key, modifiers) {
      const draft = draftOf(state, spec.id);
      const extra = spec.extraKey?.(state, key, modifiers);
      if (extra && extra !== state) return extra;
      if (!draft) return state;
      if (key === "Enter") return finish(state, spec, draft);
      if (key === "Escape") return withoutDraft(state);
      if (key === "Backspace") return removeLastVertex(state, draft);
      return state;
    },
  };
}
