/**
 * Keyboard input for the canvas. Keys count while focus is inside the canvas's root element
 * (toolbar, stage, region list — also when the list is portalled into a side panel — and any
 * other element the page names in `alsoIn`, e.g. its photo strip) or while nothing is focused (the page body, e.g. right after
 * the page loads), never while another part of the page has focus; key-scope.ts then keeps form
 * fields' own keys away from the canvas. Order: Space (held: pan), the tool registry (tools,
 * classes, undo/redo, `?`), then the view keys (+, −, 0, Shift+0).
 */
import type { Dispatch, RefObject } from "react";
import { useEffect, useRef } from "react";
import { handleKey } from "@/lib/annotate/tools";
import type { AnnotationState } from "@/lib/annotate/types";
import { edit, type CanvasAction } from "./canvas-store";
import { handChanged } from "./hand";
import { canvasTakesKey, describeKeyTarget, keyInputOf } from "./key-scope";
import type { ToolInHand } from "./types";
import { viewCommandForKey, type ViewCommand } from "./view-commands";

type CanvasKeyOptions = {
  rootRef: RefObject<HTMLElement | null>;
  /** Other elements whose keys belong to the canvas (the portalled region list, the photo strip). */
  alsoIn?: readonly (HTMLElement | null)[];
  latestRef: RefObject<AnnotationState>;
  dispatch: Dispatch<CanvasAction>;
  readOnly: boolean;
  onView(command: ViewCommand): void;
  spaceHeldRef: RefObject<boolean>;
  onShowShortcuts(): void;
  /** Told at once, in the key's own event, when the key changes the tool or class in hand (hand.ts says why). */
  onHandChange?: (hand: ToolInHand) => void;
};

function inScope(root: HTMLElement | null, target: EventTarget | null, alsoIn: readonly (HTMLElement | null)[] = []): boolean {
  if (!root || !(target instanceof Node)) return false;
  return root.contains(target) || alsoIn.some((el) => el?.contains(target)) || target === document.body || target === document.documentElement;
}

export function useCanvasKeys(options: CanvasKeyOptions): void {
  // Handlers read the newest options without re-subscribing on every render.
  const optionsRef = useRef(options);
  useEffect(() => {
    optionsRef.current = options;
  });

  useEffect(() => {
    function onKeyDown(e: KeyboardEvent) {
      const { rootRef, alsoIn, latestRef, dispatch, readOnly, onView, spaceHeldRef, onShowShortcuts, onHandChange } = optionsRef.current;
      if (e.defaultPrevented || e.isComposing || !inScope(rootRef.current, e.target, alsoIn)) return;
      if (!canvasTakesKey(describeKeyTarget(e.target), e.key)) return;
      if (e.key === " ") {
        spaceHeldRef.current = true;
        e.preventDefault();
        return;
      }
      const input = keyInputOf(e);
      if (!readOnly) {
        const result = handleKey(latestRef.current, input);
        if (result.handled) e.preventDefault();
        if (result.state !== latestRef.current) {
          dispatch(edit((s) => handleKey(s, input).state));
          const hand = handChanged(latestRef.current, result.state);
          if (hand) onHandChange?.(hand);
        }
        if (result.showShortcuts) onShowShortcuts();
        if (result.handled) return;
      } else if (input.key === "?") {
        e.preventDefault();
        onShowShortcuts();
        return;
      }
      const command = viewCommandForKey({ ...input, code: e.code });
      if (command) {
        e.preventDefault();
        onView(command);
      }
    }
    function onKeyUp(e: KeyboardEvent) {
      if (e.key === " ") optionsRef.current.spaceHeldRef.current = false;
    }
    // A Space released while another window had focus never sends keyup here.
    function onBlur() {
      optionsRef.current.spaceHeldRef.current = false;
    }
    document.addEventListener("keydown", onKeyDown);
    document.addEventListener("keyup", onKeyUp);
    window.addEventListener("blur", onBlur);
    return () => {
      document.removeEventListener("keydown", onKeyDown);
      document.removeEventListener("keyup", onKeyUp);
      window.removeEventListener("blur", onBlur);
    };
  }, []);
}
