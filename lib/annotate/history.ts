/**
 * Undo/redo over the document part of the state (regions and the selection that went with them).
 * Tool, class, visibility and viewport changes are not edits and never enter history.
 *
 * - `applyEdit` records one step per call, except inside a batch.
 * - A drag opens a batch with `beginBatch` on press, changes the regions as often as it likes,
 *   and `commitBatch` on release records it as one step (nothing when it changed nothing);
 *   `cancelBatch` puts the press-time regions back.
 * - `undo`/`redo` are Ctrl/Cmd+Z and Shift+Ctrl/Cmd+Z (the key mapping is in tools/index.ts).
 */
import type { AnnotationState, History, Region, RegionId, Snapshot } from "./types";

export const DEFAULT_HISTORY_LIMIT = 200;

export function emptyHistory(limit = DEFAULT_HISTORY_LIMIT): History {
  return { past: [], future: [], pending: null, limit };
}

export function snapshotOf(state: AnnotationState): Snapshot {
  return { regions: state.regions, selectedId: state.selectedId };
}

function pushPast(history: History, snapshot: Snapshot): History {
  const past = [...history.past, snapshot];
  return { ...history, past: past.length > history.limit ? past.slice(past.length - history.limit) : past, future: [] };
}

/** Keeps a restored selection only if its region exists in the restored regions. */
function restore(state: AnnotationState, snapshot: Snapshot, history: History): AnnotationState {
  const selectedId = snapshot.selectedId !== null && snapshot.regions.some((r) => r.id === snapshot.selectedId) ? snapshot.selectedId : null;
  return { ...state, regions: snapshot.regions, selectedId, history, draft: null, drag: null };
}

/**
 * The one way regions change. Returns `state` itself when nothing changed, so callers and React
 * can tell a no-op by reference.
 */
export function applyEdit(state: AnnotationState, regions: readonly Region[], selectedId: RegionId | null = state.selectedId): AnnotationState {
  if (regions === state.regions && selectedId === state.selectedId) return state;
  const history = state.history.pending ? state.history : pushPast(state.history, snapshotOf(state));
  return { ...state, regions, selectedId, history };
}

export function beginBatch(state: AnnotationState): AnnotationState {
  if (state.history.pending) return state;
  return { ...state, history: { ...state.history, pending: snapshotOf(state) } };
}

/** Same regions in the same order (by reference: edits always make new region objects). */
function sameRegions(a: readonly Region[], b: readonly Region[]): boolean {
  return a === b || (a.length === b.length && a.every((region, i) => region === b[i]));
}

export function commitBatch(state: AnnotationState): AnnotationState {
  const { pending } = state.history;
  if (!pending) return state;
  const cleared = { ...state.history, pending: null };
  // A drag that ends where it started (or never passed the threshold) leaves no undo step.
  const history = sameRegions(pending.regions, state.regions) ? cleared : pushPast(cleared, pending);
  return { ...state, history, drag: null };
}

export function cancelBatch(state: AnnotationState): AnnotationState {
  const { pending } = state.history;
  if (!pending) return state;
  return restore(state, pending, { ...state.history, pending: null });
}

export function canUndo(state: AnnotationState): boolean {
  return state.history.past.length > 0 || state.history.pending !== null;
}

export function canRedo(state: AnnotationState): boolean {
  return state.history.future.length > 0 && state.history.pending === null;
}

/**
 * Steps back one edit. An unfinished drag is cancelled instead, and an unfinished drawing is
 * dropped instead (neither is in history yet).
 */
export function undo(state: AnnotationState): AnnotationState {
  if (state.history.pending) return cancelBatch(state);
  if (state.draft) return { ...state, draft: null };
  const { past, future } = state.history;
  if (past.length === 0) return state;
  const previous = past[past.length - 1];
  return restore(state, previous, { ...state.history, past: past.slice(0, -1), future: [snapshotOf(state), ...future] });
}

export function redo(state: AnnotationState): AnnotationState {
  if (state.history.pending || state.draft) return state;
  const { past, future } = state.history;
  if (future.length === 0) return state;
  const [next, ...rest] = future;
  return restore(state, next, { ...state.history, past: [...past, snapshotOf(state)], future: rest });
}
