/**
 * Test drivers for the annotation model: a fresh state and pointer/key sequences in image space,
 * run through the real tool registry (no mocks).
 */
import { imagePoint } from "@/lib/annotate/coords";
import { createAnnotationState, type CreateAnnotationOptions } from "@/lib/annotate/model";
import { activateTool, handleKey, pointerDown, pointerMove, pointerUp, type KeyInput } from "@/lib/annotate/tools";
import { NO_MODIFIERS, type AnnotationState, type PointerModifiers, type ToolId } from "@/lib/annotate/types";

export const DEFECTS = ["scratch", "crack", "dent", "dead-pixel"] as const;

export function makeState(overrides: Partial<CreateAnnotationOptions> = {}): AnnotationState {
  return createAnnotationState({ image: { width: 1000, height: 800 }, allowedDefects: DEFECTS, idPrefix: "t", ...overrides });
}

export function withTool(state: AnnotationState, tool: ToolId): AnnotationState {
  return activateTool(state, tool);
}

export type Step =
  | readonly ["down" | "move" | "up", number, number, Partial<PointerModifiers>?]
  | readonly ["click", number, number, Partial<PointerModifiers>?]
  | readonly ["dblclick", number, number]
  | readonly ["key", string, Partial<KeyInput>?];

/** Runs a sequence: "click" is down + up at one spot; "dblclick" is two clicks, the second with clickCount 2. */
export function drive(state: AnnotationState, steps: readonly Step[]): AnnotationState {
  let s = state;
  for (const step of steps) {
    if (step[0] === "key") {
      s = handleKey(s, { key: step[1], shift: false, alt: false, mod: false, ...step[2] }).state;
      continue;
    }
    const [kind, x, y] = step;
    const p = imagePoint(x, y);
    const m = { ...NO_MODIFIERS, ...(kind === "dblclick" ? {} : step[3]) };
    if (kind === "down") s = pointerDown(s, p, m);
    else if (kind === "move") s = pointerMove(s, p, m);
    else if (kind === "up") s = pointerUp(s, p, m);
    else if (kind === "click") s = pointerUp(pointerDown(s, p, m), p, m);
    else {
      s = pointerUp(pointerDown(s, p, m), p, m);
      const second = { ...m, clickCount: 2 };
      s = pointerUp(pointerDown(s, p, second), p, second);
    }
  }
  return s;
}

/** A drag from (x1, y1) to (x2, y2) in `steps` moves. */
export function dragSteps(x1: number, y1: number, x2: number, y2: number, steps = 5, modifiers: Partial<PointerModifiers> = {}): Step[] {
  const moves: Step[] = [];
  for (let i = 1; i <= steps; i++) moves.push(["move", x1 + ((x2 - x1) * i) / steps, y1 + ((y2 - y1) * i) / steps, modifiers]);
  return [["down", x1, y1, modifiers], ...moves, ["up", x2, y2, modifiers]];
}

export function only<T>(items: readonly T[]): T {
  if (items.length !== 1) throw new Error(`expected exactly one item, got ${items.length}`);
  return items[0];
}
