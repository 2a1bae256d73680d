/**
 * The tool and defect class in the inspector's hand, carried from photo to photo. Each canvas
 * opens with them and reports changes back. Between photos — after a thumbnail click, while the
 * next photo's regions load — no canvas is listening, so a tool key pressed then is applied here,
 * through the same key registry, and the next canvas opens with its result: "click a thumbnail,
 * press B" always ends with Box in hand.
 */
import { useCallback, useEffect, useRef, useState } from "react";
import { canvasTakesKey, describeKeyTarget, keyInputOf } from "@/components/annotate/key-scope";
import type { ToolInHand } from "@/components/annotate/types";
import { createAnnotationState } from "@/lib/annotate/model";
import { activateTool, handleKey, type KeyInput } from "@/lib/annotate/tools";

/** The hand after `input`, as a canvas with these classes would change it; null when the key does not change it. */
export function handAfterKey(hand: ToolInHand, classKeys: readonly string[], input: KeyInput): ToolInHand | null {
  const defect = hand.defect !== null && classKeys.includes(hand.defect) ? hand.defect : null;
  const state = activateTool(createAnnotationState({ image: { width: 1, height: 1 }, allowedDefects: classKeys, startingDefect: defect, idPrefix: "hand" }), hand.tool);
  const next = handleKey(state, input).state;
  return next.activeTool === state.activeTool && next.activeDefect === state.activeDefect ? null : { tool: next.activeTool, defect: next.activeDefect };
}

type Options = {
  /** Where keys count besides an unfocused page (the marking area). */
  area: HTMLElement | null;
  /** The part type's class keys in the canvas's order (bench order). */
  classKeys: readonly string[];
  startingDefect: string | null;
  readOnly: boolean;
};

export function useToolInHand({ area, classKeys, startingDefect, readOnly }: Options) {
  const [hand, setHand] = useState<ToolInHand>({ tool: "select", defect: startingDefect });
  const ref = useRef({ area, classKeys, readOnly, hand });
  useEffect(() => {
    ref.current = { area, classKeys, readOnly, hand };
  });
  useEffect(() => {
    function onKeyDown(e: KeyboardEvent) {
      const { area, classKeys, readOnly, hand } = ref.current;
      // A canvas on the page takes its own keys; this only covers the moment between two.
      if (readOnly || !area || area.querySelector("[data-canvas-stage]")) return;
      const target = e.target;
      const inArea = target === document.body || target === document.documentElement || (target instanceof Node && area.contains(target));
      if (e.defaultPrevented || e.isComposing || !inArea || !canvasTakesKey(describeKeyTarget(target), e.key)) return;
      const next = handAfterKey(hand, classKeys, keyInputOf(e));
      if (!next) return;
      e.preventDefault();
      setHand(next);
    }
    document.addEventListener("keydown", onKeyDown);
    return () => document.removeEventListener("keydown", onKeyDown);
  }, []);
  // A canvas reports a change twice (in the event, then from its effect): the second is a no-op.
  const report = useCallback((next: ToolInHand) => setHand((h) => (h.tool === next.tool && h.defect === next.defect ? h : next)), []);
  return { hand, setHand: report };
}
