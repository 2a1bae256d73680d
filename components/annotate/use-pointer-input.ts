/**
 * Pointer input on the stage container (mouse, pen and touch through DOM pointer events; the
 * model does all hit-testing, so Konva's own event system stays off):
 * - left button / pen / one finger: the active tool (moves coalesced, for smooth freehand);
 * - middle button, Space + drag, or any drag when read-only: pan;
 * - two fingers: pinch zoom and pan; a tool press by the first finger is taken back;
 * - wheel: zoom around the pointer (a native non-passive listener, so the page does not scroll).
 */
import type { Dispatch, PointerEvent as ReactPointerEvent, RefObject } from "react";
import { useEffect, useRef, useState } from "react";
import { pan, stagePoint, toImage, type StagePoint } from "@/lib/annotate/coords";
import { setViewport } from "@/lib/annotate/model";
import { pointerDown, pointerMove, pointerUp } from "@/lib/annotate/tools";
import type { AnnotationState, PointerModifiers } from "@/lib/annotate/types";
import { edit, type CanvasAction } from "./canvas-store";
import { nextClick, pinchViewport, wheelViewport, type ClickRecord } from "./gestures";

type Gesture =
  | { kind: "tool"; pointerId: number; clickCount: number }
  | { kind: "pan"; pointerId: number; last: StagePoint }
  | { kind: "pinch"; ids: readonly [number, number] }
  /** A finger left over from a pinch: ignored until every finger is up. */
  | { kind: "ignore" };

type PointerInputOptions = {
  containerRef: RefObject<HTMLDivElement | null>;
  latestRef: RefObject<AnnotationState>;
  dispatch: Dispatch<CanvasAction>;
  readOnly: boolean;
  spaceHeldRef: RefObject<boolean>;
};

function modifiersOf(e: { shiftKey: boolean; altKey: boolean; ctrlKey: boolean; metaKey: boolean }, clickCount: number): PointerModifiers {
  return { shift: e.shiftKey, alt: e.altKey, mod: e.ctrlKey || e.metaKey, clickCount };
}

function stagePointIn(element: HTMLElement, e: { clientX: number; clientY: number }): StagePoint {
  const rect = element.getBoundingClientRect();
  return stagePoint(e.clientX - rect.left, e.clientY - rect.top);
}

export function usePointerInput({ containerRef, latestRef, dispatch, readOnly, spaceHeldRef }: PointerInputOptions) {
  const gesture = useRef<Gesture | null>(null);
  const touches = useRef(new Map<number, StagePoint>());
  const lastClick = useRef<ClickRecord | null>(null);
  const [panning, setPanning] = useState(false);

  useEffect(() => {
    const element = containerRef.current;
    if (!element) return;
    const onWheel = (e: WheelEvent) => {
      e.preventDefault();
      const anchor = stagePointIn(element, e);
      const wheel = { deltaX: e.deltaX, deltaY: e.deltaY, deltaMode: e.deltaMode, ctrlKey: e.ctrlKey };
      dispatch(edit((s) => setViewport(s, wheelViewport(s.viewport, wheel, anchor))));
    };
    element.addEventListener("wheel", onWheel, { passive: false });
    return () => element.removeEventListener("wheel", onWheel);
  }, [containerRef, dispatch]);

  function startPinch() {
    if (gesture.current?.kind === "tool") dispatch({ type: "cancel-press" });
    setPanning(false);
    const [a, b] = [...touches.current.keys()];
    gesture.current = { kind: "pinch", ids: [a, b] };
  }

  function onPointerDown(e: ReactPointerEvent<HTMLDivElement>) {
    const element = e.currentTarget;
    if (document.activeElement !== element) element.focus({ preventScroll: true });
    const p = stagePointIn(element, e);
    if (e.pointerType === "touch") {
      touches.current.set(e.pointerId, p);
      element.setPointerCapture(e.pointerId);
      if (touches.current.size === 2 && gesture.current?.kind !== "ignore") return startPinch();
      if (touches.current.size > 1) return;
    }
    if (gesture.current) return;
    e.preventDefault();
    element.setPointerCapture(e.pointerId);
    if (e.button === 1 || (e.button === 0 && (spaceHeldRef.current || readOnly))) {
      gesture.current = { kind: "pan", pointerId: e.pointerId, last: p };
      setPanning(true);
      return;
    }
    if (e.button !== 0) return; // right button, pen barrel or eraser: nothing to draw
    const click = nextClick(lastClick.current, e.timeStamp, p);
    lastClick.current = click;
    const modifiers = modifiersOf(e, click.count);
    gesture.current = { kind: "tool", pointerId: e.pointerId, clickCount: click.count };
    dispatch({ type: "press", edit: (s) => pointerDown(s, toImage(s.viewport, p), modifiers) });
  }

  function onPointerMove(e: ReactPointerEvent<HTMLDivElement>) {
    const element = e.currentTarget;
    const g = gesture.current;
    const p = stagePointIn(element, e);
    if (e.pointerType === "touch" && touches.current.has(e.pointerId)) {
      const before = touches.current.get(e.pointerId)!;
      touches.current.set(e.pointerId, p);
      if (g?.kind === "pinch" && g.ids.includes(e.pointerId)) {
        const other = touches.current.get(g.ids[0] === e.pointerId ? g.ids[1] : g.ids[0]);
        if (other) dispatch(edit((s) => setViewport(s, pinchViewport({ viewport: s.viewport, a: before, b: other }, p, other))));
        return;
      }
    }
    if (g?.kind === "pan" && g.pointerId === e.pointerId) {
      const dx = p.x - g.last.x;
      const dy = p.y - g.last.y;
      g.last = p;
      dispatch(edit((s) => setViewport(s, pan(s.viewport, dx, dy))));
      return;
    }
    if (g && (g.kind !== "tool" || g.pointerId !== e.pointerId)) return;
    // Hover (no button down) only matters to a drawing in progress, and touch has no hover.
    if (!g && (readOnly || e.pointerType === "touch" || !latestRef.current.draft)) return;
    const events = e.nativeEvent.getCoalescedEvents?.() ?? [];
    const points = events.length > 0 ? events.map((c) => stagePointIn(element, c)) : [p];
    const modifiers = modifiersOf(e, g?.clickCount ?? 1);
    dispatch(edit((s) => points.reduce((acc, q) => pointerMove(acc, toImage(acc.viewport, q), modifiers), s)));
  }

  function endPointer(e: ReactPointerEvent<HTMLDivElement>, cancelled: boolean) {
    touches.current.delete(e.pointerId);
    const g = gesture.current;
    if (!g) return;
    if (g.kind === "pinch" || g.kind === "ignore") {
      if (g.kind === "ignore" || g.ids.includes(e.pointerId)) gesture.current = touches.current.size > 0 ? { kind: "ignore" } : null;
      return;
    }
    if (g.pointerId !== e.pointerId) return;
    gesture.current = null;
    if (g.kind === "pan") return setPanning(false);
    if (cancelled) return dispatch({ type: "cancel-press" });
    const p = stagePointIn(e.currentTarget, e);
    const modifiers = modifiersOf(e, g.clickCount);
    dispatch({ type: "release", edit: (s) => pointerUp(s, toImage(s.viewport, p), modifiers) });
  }

  return {
    panning,
    handlers: {
      onPointerDown,
      onPointerMove,
      onPointerUp: (e: ReactPointerEvent<HTMLDivElement>) => endPointer(e, false),
      onPointerCancel: (e: ReactPointerEvent<HTMLDivElement>) => endPointer(e, true),
      onContextMenu: (e: { preventDefault(): void }) => e.preventDefault(),
    },
  };
}
