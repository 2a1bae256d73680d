/**
 * The canvas's state holder: the pure AnnotationState plus the state as it was when the current
 * press began, so a press can be taken back when it turns out not to be one (a second finger
 * lands and the touch becomes a pinch, or the browser cancels the pointer). Every change is an
 * `Edit` over the model (lib/annotate), run inside the reducer, so events never read stale state.
 */
import { useLayoutEffect, useReducer, useRef } from "react";
import type { AnnotationState } from "@/lib/annotate/types";

export type Edit = (state: AnnotationState) => AnnotationState;

export type CanvasStore = Readonly<{ state: AnnotationState; pressBase: AnnotationState | null }>;

export type CanvasAction =
  | Readonly<{ type: "edit"; edit: Edit }>
  /** A pointer press that starts a gesture: remembered until "release" or "cancel-press". */
  | Readonly<{ type: "press"; edit: Edit }>
  | Readonly<{ type: "release"; edit: Edit }>
  /** Back to before the press (its draft, vertex or drag undone), keeping the current view. */
  | Readonly<{ type: "cancel-press" }>;

export function canvasReducer(store: CanvasStore, action: CanvasAction): CanvasStore {
  switch (action.type) {
    case "edit": {
      const state = action.edit(store.state);
      return state === store.state ? store : { ...store, state };
    }
    case "press":
      return { state: action.edit(store.state), pressBase: store.state };
    case "release":
      return { state: action.edit(store.state), pressBase: null };
    case "cancel-press":
      if (!store.pressBase) return store;
      return { state: { ...store.pressBase, viewport: store.state.viewport }, pressBase: null };
  }
}

export function edit(change: Edit): CanvasAction {
  return { type: "edit", edit: change };
}

/**
 * useReducer over canvasReducer, plus a ref to the latest committed state for event handlers
 * that need to know something before they dispatch (whether a key is handled, for instance).
 */
export function useCanvasStore(init: () => AnnotationState) {
  const [store, dispatch] = useReducer(canvasReducer, undefined, () => ({ state: init(), pressBase: null }));
  const latestRef = useRef(store.state);
  useLayoutEffect(() => {
    latestRef.current = store.state;
  });
  return { state: store.state, dispatch, latestRef };
}
