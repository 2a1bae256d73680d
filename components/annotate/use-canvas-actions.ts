/**
 * The canvas's commands for buttons, the region list and the imperative handle. Each one is an
 * edit of the pure model run through the store; undo, redo and cancel go through the key
 * registry so a button does exactly what its key does (Undo while drawing removes the last vertex).
 */
import { useMemo, type Dispatch, type RefObject } from "react";
import { fitToView, type Size, type Viewport } from "@/lib/annotate/coords";
import * as model from "@/lib/annotate/model";
import { regionBounds } from "@/lib/annotate/shape-edits";
import { activateTool, handleKey, type KeyInput } from "@/lib/annotate/tools";
import type { AnnotationState, RegionId } from "@/lib/annotate/types";
import { edit, type CanvasAction, type Edit } from "./canvas-store";
import { revealBounds } from "./gestures";
import { handChanged } from "./hand";
import type { ToolbarActions, ToolInHand } from "./types";
import { applyViewCommand, type ViewCommand } from "./view-commands";

type CanvasActionOptions = {
  dispatch: Dispatch<CanvasAction>;
  stageSize: Size | null;
  /** The last fitted viewport: while the view is still exactly that, a resize fits again. */
  fittedRef: RefObject<Viewport | null>;
  image: Size;
  onShowShortcuts(): void;
  focusStage(): void;
  /** The committed state, to tell the page about a new tool or class in the click's own event. */
  latestRef: RefObject<AnnotationState>;
  onHandChange?: (hand: ToolInHand) => void;
};

export type CanvasActions = ToolbarActions & {
  select(id: RegionId): void;
  remove(id: RegionId): void;
};

/** Picks a region: the Select tool, its class shown again if hidden, and the region in view. */
function pickRegion(state: AnnotationState, id: RegionId, stageSize: Size | null): AnnotationState {
  let next = activateTool(state, "select");
  const region = model.regionById(next, id);
  if (!region) return state;
  if (region.role === "defect" && next.hiddenDefects.includes(region.defect)) next = model.toggleDefectHidden(next, region.defect);
  next = model.selectRegion(next, id);
  return stageSize ? model.setViewport(next, revealBounds(next.viewport, regionBounds(region), stageSize)) : next;
}

/** Width control: the selected line's width, or the width of lines drawn next. */
function applyLineWidth(state: AnnotationState, width: number): AnnotationState {
  const selected = model.selectedRegion(state);
  if (selected?.role === "defect" && selected.shape.kind === "line") return model.setLineWidth(state, selected.id, width);
  return model.setDefaultLineWidth(state, width);
}

export function useCanvasActions({ dispatch, stageSize, fittedRef, image, onShowShortcuts, focusStage, latestRef, onHandChange }: CanvasActionOptions): CanvasActions {
  return useMemo(() => {
    const run = (change: Edit) => dispatch(edit(change));
    // Commands that may change the tool or class in hand also say so at once (hand.ts).
    const runInHand = (change: Edit) => {
      run(change);
      const hand = handChanged(latestRef.current, change(latestRef.current));
      if (hand) onHandChange?.(hand);
    };
    const key = (input: Pick<KeyInput, "key"> & Partial<KeyInput>) => run((s) => handleKey(s, { shift: false, alt: false, mod: false, ...input }).state);
    const view = (command: ViewCommand) => {
      if (!stageSize) return;
      if (command === "fit") {
        const fit = fitToView(image, stageSize);
        fittedRef.current = fit;
        return run((s) => model.setViewport(s, fit));
      }
      run((s) => model.setViewport(s, applyViewCommand(s.viewport, command, s.image, stageSize)));
    };
    return {
      tool: (id) => runInHand((s) => activateTool(s, id)),
      // Same as the number keys: also gives the selected region that class.
      defect: (defectKey) => runInHand((s) => model.chooseDefectByIndex(s, s.allowedDefects.indexOf(defectKey))),
      toggleHidden: (defectKey) => run((s) => model.toggleDefectHidden(s, defectKey)),
      lineWidth: (width) => run((s) => applyLineWidth(s, width)),
      view,
      undo: () => key({ key: "z", mod: true }),
      redo: () => key({ key: "z", mod: true, shift: true }),
      rulerLength: (lengthMm) => {
        run((s) => model.setRulerLength(s, lengthMm));
        focusStage();
      },
      cancelRuler: () => {
        key({ key: "Escape" });
        focusStage();
      },
      showShortcuts: onShowShortcuts,
      select: (id) => runInHand((s) => pickRegion(s, id, stageSize)),
      remove: (id) => run((s) => model.deleteRegion(s, id)),
    };
  }, [dispatch, stageSize, fittedRef, image, onShowShortcuts, focusStage, latestRef, onHandChange]);
}
