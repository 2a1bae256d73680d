/**
 * The annotation state and its edits. Every function is pure: it returns a new state, or the
 * same state object when the edit does not apply (unknown id, wrong kind, a result that would be
 * degenerate). Region changes go through history.applyEdit, so each one is a single undo step, or
 * part of one drag while a batch is open.
 */
import { clampPoint, clampShapeToImage, maxLineWidthFor, type ImageSize } from "@/lib/geometry/clamp";
import type { RulerMark } from "@/lib/geometry/ruler";
import type { PolygonShape, Shape } from "@/lib/geometry/shape";
import { IDENTITY_VIEWPORT, toShapePoint, type ImagePoint, type Viewport } from "./coords";
import { DEFAULT_LINE_WIDTH } from "./constants";
import { applyEdit, cancelBatch, commitBatch, DEFAULT_HISTORY_LIMIT, emptyHistory } from "./history";
import * as edits from "./shape-edits";
import type { AnnotationState, RectHandle, Region, RegionId } from "./types";

export type CreateAnnotationOptions = {
  image: ImageSize;
  allowedDefects: readonly string[];
  /** The class new regions get at first (default: the first allowed; null: none until one is chosen). */
  startingDefect?: string | null;
  /** Start of every new region id in this session, e.g. 8 random hex digits; ids stay unique across sessions. */
  idPrefix: string;
  /** Regions loaded from the server (already validated when they were saved). */
  regions?: readonly Region[];
  viewport?: Viewport;
  lineWidth?: number;
  historyLimit?: number;
};

export function createAnnotationState(options: CreateAnnotationOptions): AnnotationState {
  const { image, allowedDefects, idPrefix, regions = [] } = options;
  if (!(image.width > 0 && image.height > 0 && Number.isFinite(image.width) && Number.isFinite(image.height))) {
    throw new RangeError(`The photo size must be positive, got ${image.width} × ${image.height}`);
  }
  if (!/^[A-Za-z0-9_]{1,40}$/.test(idPrefix)) throw new RangeError(`The id prefix must be 1–40 letters, digits or _, got “${idPrefix}”`);
  const ids = new Set(regions.map((r) => r.id));
  if (ids.size !== regions.length) throw new RangeError("Two loaded regions share an id");
  const starting = options.startingDefect === undefined ? (allowedDefects[0] ?? null) : options.startingDefect;
  if (starting !== null && !allowedDefects.includes(starting)) throw new RangeError(`The starting class “${starting}” is not an allowed class`);
  return {
    image,
    allowedDefects,
    regions,
    selectedId: null,
    activeTool: "select",
    activeDefect: starting,
    hiddenDefects: [],
    draft: null,
    drag: null,
    viewport: options.viewport ?? IDENTITY_VIEWPORT,
    lineWidth: options.lineWidth ?? DEFAULT_LINE_WIDTH,
    history: emptyHistory(options.historyLimit ?? DEFAULT_HISTORY_LIMIT),
    idPrefix,
    nextIdNumber: 1,
  };
}

export function regionById(state: AnnotationState, id: RegionId | null): Region | undefined {
  return id === null ? undefined : state.regions.find((r) => r.id === id);
}

export function selectedRegion(state: AnnotationState): Region | undefined {
  return regionById(state, state.selectedId);
}

/** A fresh region id of this session (the counter never goes back). */
export function allocateId(state: AnnotationState): { id: RegionId; state: AnnotationState } {
  return { id: `${state.idPrefix}-${state.nextIdNumber}`, state: { ...state, nextIdNumber: state.nextIdNumber + 1 } };
}

/**
 * Swaps one region for `next` (same id). Outside a drag an invalid result is refused; during a
 * drag it is allowed for the moment and finishDrag decides on release.
 */
export function replaceRegion(state: AnnotationState, next: Region): AnnotationState {
  const index = state.regions.findIndex((r) => r.id === next.id);
  if (index < 0 || state.regions[index] === next) return state;
  if (!state.history.pending && edits.regionProblem(next, state.image)) return state;
  return applyEdit(
    state,
    state.regions.map((r, i) => (i === index ? next : r)),
  );
}

/** Applies `change` to a region's shape; a surface stays a polygon. */
function updateShape(state: AnnotationState, id: RegionId, change: (shape: Shape) => Shape | null): AnnotationState {
  const region = regionById(state, id);
  if (!region || region.role === "ruler") return state;
  const shape = change(region.shape);
  if (!shape || shape === region.shape) return state;
  if (region.role === "surface") return shape.kind === "polygon" ? replaceRegion(state, { ...region, shape }) : state;
  return replaceRegion(state, { ...region, shape });
}

/** Drawing order by role: surfaces underneath, defects above them, the ruler on top. */
const LAYER: Record<Region["role"], number> = { surface: 0, defect: 1, ruler: 2 };

/**
 * `regions` with `region` after the last one of its layer or a lower one. The stored set keeps
 * surfaces, defects and the ruler apart in that order (lib/regions/payload.ts), so adding in the
 * same order means the list looks the same before and after a reload.
 */
function insertInDrawingOrder(regions: readonly Region[], region: Region): Region[] {
  let at = regions.length;
  while (at > 0 && LAYER[regions[at - 1].role] > LAYER[region.role]) at--;
  return [...regions.slice(0, at), region, ...regions.slice(at)];
}

/** Adds a region with its own id (e.g. pasted); refused if the id is taken or the region is invalid. */
export function addRegion(state: AnnotationState, region: Region): AnnotationState {
  if (regionById(state, region.id) || edits.regionProblem(region, state.image)) return state;
  const hiddenDefects = region.role === "defect" ? state.hiddenDefects.filter((d) => d !== region.defect) : state.hiddenDefects;
  return applyEdit({ ...state, hiddenDefects }, insertInDrawingOrder(state.regions, region));
}

/** A new defect region of the active class (a drawn class is made visible again if hidden). */
export function addDefectShape(state: AnnotationState, shape: Shape): AnnotationState {
  if (state.activeDefect === null) return state;
  const { id, state: next } = allocateId(state);
  const added = addRegion(next, { id, role: "defect", defect: state.activeDefect, shape: clampShapeToImage(shape, state.image) });
  return added === next ? state : added;
}

export function addSurface(state: AnnotationState, shape: PolygonShape): AnnotationState {
  const { id, state: next } = allocateId(state);
  const added = addRegion(next, { id, role: "surface", shape: clampShapeToImage(shape, state.image) as PolygonShape });
  return added === next ? state : added;
}

/** Places the photo's ruler, replacing an earlier one in the same undo step. */
export function placeRuler(state: AnnotationState, ruler: RulerMark): AnnotationState {
  const { id, state: next } = allocateId(state);
  const region: Region = { id, role: "ruler", ruler: { ...ruler, a: clampPoint(ruler.a, state.image), b: clampPoint(ruler.b, state.image) } };
  if (edits.regionProblem(region, state.image)) return state;
  return applyEdit(next, [...next.regions.filter((r) => r.role !== "ruler"), region]);
}

export function moveRegion(state: AnnotationState, id: RegionId, dx: number, dy: number): AnnotationState {
  const region = regionById(state, id);
  return region ? replaceRegion(state, edits.translateRegion(region, dx, dy, state.image)) : state;
}

export function resizeRegionRect(state: AnnotationState, id: RegionId, handle: RectHandle, to: ImagePoint, minSize: number): AnnotationState {
  const target = clampPoint(toShapePoint(to), state.image);
  return updateShape(state, id, (shape) => (shape.kind === "rect" ? edits.resizeRect(shape, handle, target, minSize, state.image) : null));
}

export function setSpotRadius(state: AnnotationState, id: RegionId, radius: number): AnnotationState {
  return updateShape(state, id, (shape) => (shape.kind === "spot" && Number.isFinite(radius) ? edits.withSpotRadius(shape, radius, state.image) : null));
}

export function setLineWidth(state: AnnotationState, id: RegionId, width: number): AnnotationState {
  return updateShape(state, id, (shape) => (shape.kind === "line" && Number.isFinite(width) ? edits.withLineWidth(shape, width, state.image) : null));
}

export function moveRegionVertex(state: AnnotationState, id: RegionId, index: number, to: ImagePoint): AnnotationState {
  return updateShape(state, id, (shape) => edits.moveVertex(shape, index, clampPoint(toShapePoint(to), state.image)));
}

export function insertRegionVertex(state: AnnotationState, id: RegionId, segmentIndex: number, at: ImagePoint): AnnotationState {
  return updateShape(state, id, (shape) => edits.insertVertex(shape, segmentIndex, clampPoint(toShapePoint(at), state.image)));
}

/** Refused when the polygon would drop below 3 vertices (a line below 2) or become degenerate. */
export function deleteRegionVertex(state: AnnotationState, id: RegionId, index: number): AnnotationState {
  return updateShape(state, id, (shape) => edits.deleteVertex(shape, index));
}

export function moveRulerEnd(state: AnnotationState, id: RegionId, end: "a" | "b", to: ImagePoint): AnnotationState {
  const region = regionById(state, id);
  if (region?.role !== "ruler") return state;
  return replaceRegion(state, { ...region, ruler: { ...region.ruler, [end]: clampPoint(toShapePoint(to), state.image) } });
}

export function deleteRegion(state: AnnotationState, id: RegionId): AnnotationState {
  if (!regionById(state, id)) return state;
  return applyEdit(
    state,
    state.regions.filter((r) => r.id !== id),
    state.selectedId === id ? null : state.selectedId,
  );
}

export function setRegionDefect(state: AnnotationState, id: RegionId, defect: string): AnnotationState {
  const region = regionById(state, id);
  if (region?.role !== "defect" || region.defect === defect || !state.allowedDefects.includes(defect)) return state;
  return replaceRegion(state, { ...region, defect });
}

/**
 * Gives the ruler its length: completes a ruler draft waiting for it, or, with no such draft,
 * changes the selected ruler's length. Refused for lengths that are not above 0 (use
 * parseRulerLength from lib/geometry/ruler.ts to turn typed text into a message first).
 */
export function setRulerLength(state: AnnotationState, lengthMm: number): AnnotationState {
  if (!(lengthMm > 0) || !Number.isFinite(lengthMm)) return state;
  const draft = state.draft;
  if (draft?.tool === "ruler" && draft.phase === "length") {
    const placed = placeRuler({ ...state, draft: null }, { a: toShapePoint(draft.a), b: toShapePoint(draft.b), lengthMm });
    return placed.regions === state.regions ? state : placed;
  }
  const region = selectedRegion(state);
  if (region?.role !== "ruler" || region.ruler.lengthMm === lengthMm) return state;
  return replaceRegion(state, { ...region, ruler: { ...region.ruler, lengthMm } });
}

/**
 * Number key n picks allowedDefects[n − 1] as the active class and, when a defect region is
 * selected, gives it that class (one undo step).
 */
export function chooseDefectByIndex(state: AnnotationState, index: number): AnnotationState {
  const defect = state.allowedDefects[index];
  if (defect === undefined) return state;
  const chosen = state.activeDefect === defect ? state : { ...state, activeDefect: defect };
  return state.selectedId === null ? chosen : setRegionDefect(chosen, state.selectedId, defect);
}

export function setActiveDefect(state: AnnotationState, defect: string): AnnotationState {
  return state.allowedDefects.includes(defect) && state.activeDefect !== defect ? { ...state, activeDefect: defect } : state;
}

export function selectRegion(state: AnnotationState, id: RegionId | null): AnnotationState {
  if (id === state.selectedId || (id !== null && !regionById(state, id))) return state;
  return { ...state, selectedId: id };
}

/** Hides or shows one class; hiding the selected region's class drops the selection. */
export function toggleDefectHidden(state: AnnotationState, defect: string): AnnotationState {
  if (state.hiddenDefects.includes(defect)) return { ...state, hiddenDefects: state.hiddenDefects.filter((d) => d !== defect) };
  const selected = selectedRegion(state);
  const selectedId = selected?.role === "defect" && selected.defect === defect ? null : state.selectedId;
  return { ...state, hiddenDefects: [...state.hiddenDefects, defect], selectedId };
}

export function setViewport(state: AnnotationState, viewport: Viewport): AnnotationState {
  const usable = viewport.scale > 0 && Number.isFinite(viewport.scale) && Number.isFinite(viewport.offsetX) && Number.isFinite(viewport.offsetY);
  return usable ? { ...state, viewport } : state;
}

/** Stroke width for lines drawn from now on (not an edit; see setLineWidth for a region's). */
export function setDefaultLineWidth(state: AnnotationState, width: number): AnnotationState {
  if (!(width > 0) || !Number.isFinite(width)) return state;
  return { ...state, lineWidth: Math.min(width, maxLineWidthFor(state.image)) };
}

/** Ends a drag: one undo step if the region is still valid, otherwise the drag is undone. */
export function finishDrag(state: AnnotationState): AnnotationState {
  const dragged = state.drag ? regionById(state, state.drag.regionId) : undefined;
  if (dragged && edits.regionProblem(dragged, state.image)) return cancelBatch(state);
  return commitBatch({ ...state, drag: null });
}
