/**
 * The contract every marking tool implements. Each handler takes the state and one input and
 * returns the next state; returning the very same object means "not mine, nothing changed", which
 * the registry uses to decide whether a key was handled. Pointer positions arrive in image space
 * (the canvas converts with coords.toImage); tools clamp them into the photo themselves.
 */
import type { ImagePoint } from "../coords";
import type { AnnotationState, PointerModifiers, ToolId } from "../types";

export type KeyModifiers = Readonly<{ shift: boolean; alt: boolean; mod: boolean }>;

export type Shortcut = Readonly<{ keys: string; action: string }>;

export type Tool = Readonly<{
  id: ToolId;
  /** The name shown on the toolbar (docs/contracts.md). */
  label: string;
  /** Lower-case letter that switches to the tool. */
  key: string;
  /** One line for the toolbar tooltip and the shortcut sheet. */
  description: string;
  /** Keys the tool reacts to while active, for the `?` sheet. */
  shortcuts: readonly Shortcut[];
  isEnabled(state: AnnotationState): boolean;
  pointerDown(state: AnnotationState, point: ImagePoint, modifiers: PointerModifiers): AnnotationState;
  pointerMove(state: AnnotationState, point: ImagePoint, modifiers: PointerModifiers): AnnotationState;
  pointerUp(state: AnnotationState, point: ImagePoint, modifiers: PointerModifiers): AnnotationState;
  /** `key` is KeyboardEvent.key ("Enter", "Escape", "Backspace", "[", …). */
  keyDown(state: AnnotationState, key: string, modifiers: KeyModifiers): AnnotationState;
}>;
