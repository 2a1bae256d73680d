import { useEffect, useRef } from "react";
import { canRedo, canUndo } from "@/lib/annotate/history";
import { toRegionSetPayload } from "@/lib/annotate/serialise";
import type { AnnotationState } from "@/lib/annotate/types";
import type { RegionSetPayload } from "@/lib/geometry/validate";

export type HistoryAvailability = { canUndo: boolean; canRedo: boolean };

/**
 * Reports committed edits: `onChange` gets the region-set payload whenever the regions differ
 * from the last reported ones and no drag is open (a drag reports once, on release; a cancelled
 * drag restores the very same array and reports nothing). Undo and redo are edits too.
 * `onHistoryChange` hears when undo/redo become available or unavailable.
 */
export function useCommittedChanges(
  state: AnnotationState,
  onChange: ((payload: RegionSetPayload) => void) | undefined,
  onHistoryChange: ((availability: HistoryAvailability) => void) | undefined,
): HistoryAvailability {
  const reported = useRef(state.regions);
  const callbacks = useRef({ onChange, onHistoryChange });
  useEffect(() => {
    callbacks.current = { onChange, onHistoryChange };
  });
  useEffect(() => {
    if (state.history.pending || state.regions === reported.current) return;
    reported.current = state.regions;
    callbacks.current.onChange?.(toRegionSetPayload(state));
  }, [state]);
  // A drawing in progress can be undone (Ctrl/Cmd+Z drops its last vertex or the drawing).
  const undoable = canUndo(state) || state.draft !== null;
  const redoable = canRedo(state);
  useEffect(() => {
    callbacks.current.onHistoryChange?.({ canUndo: undoable, canRedo: redoable });
  }, [undoable, redoable]);
  return { canUndo: undoable, canRedo: redoable };
}
