/**
 * Which key presses the canvas may take. The canvas listens on its own root element (toolbar,
 * stage and region list), never on the whole page, and even there it leaves alone:
 * - anything typed into a form field (inputs that take text, textareas, selects, contenteditable),
 *   so the ruler length input and the grade form keep their own keys, Ctrl+Z included;
 * - Enter and Space on buttons, links, checkboxes and radios (they activate the control);
 * - arrow keys on radios and sliders (they move the control's value).
 * Pure: it reads a small description of the target, built in the browser by `describeKeyTarget`.
 */
import type { KeyInput } from "@/lib/annotate/tools";

export type KeyTarget = Readonly<{
  tagName: string;
  /** An input's `type` attribute (lower case), if any. */
  type?: string | null;
  isContentEditable?: boolean;
  role?: string | null;
}>;

/** Input types that do not take typed text (everything else, including unknown types, does). */
const NON_TEXT_INPUTS = new Set(["checkbox", "radio", "button", "submit", "reset", "range", "color", "file", "image"]);
const TEXT_ROLES = new Set(["textbox", "searchbox", "combobox", "spinbutton"]);
const ACTIVATED_BY_ENTER_OR_SPACE = new Set(["BUTTON", "A", "SUMMARY"]);
const ARROW_KEYS = new Set(["ArrowUp", "ArrowDown", "ArrowLeft", "ArrowRight"]);

export function isTypingTarget(target: KeyTarget): boolean {
  const tag = target.tagName.toUpperCase();
  if (target.isContentEditable) return true;
  if (target.role && TEXT_ROLES.has(target.role)) return true;
  if (tag === "TEXTAREA" || tag === "SELECT") return true;
  return tag === "INPUT" && !NON_TEXT_INPUTS.has((target.type ?? "text").toLowerCase());
}

/** Whether the canvas should handle `key` pressed with focus on `target` (null: nothing focused). */
export function canvasTakesKey(target: KeyTarget | null, key: string): boolean {
  if (!target) return true;
  if (isTypingTarget(target)) return false;
  const tag = target.tagName.toUpperCase();
  const type = (target.type ?? "").toLowerCase();
  const isToggle = tag === "INPUT" && (type === "checkbox" || type === "radio" || type === "button" || type === "submit" || type === "reset");
  const isButtonLike = ACTIVATED_BY_ENTER_OR_SPACE.has(tag) || isToggle || target.role === "button" || target.role === "checkbox";
  if (isButtonLike && (key === "Enter" || key === " ")) return false;
  const movesWithArrows = (tag === "INPUT" && (type === "radio" || type === "range")) || target.role === "radio" || target.role === "slider";
  return !(movesWithArrows && ARROW_KEYS.has(key));
}

/** The registry's key input from a DOM keyboard event (Cmd counts as Ctrl, for macOS). */
export function keyInputOf(event: Readonly<{ key: string; shiftKey: boolean; altKey: boolean; ctrlKey: boolean; metaKey: boolean }>): KeyInput {
  return { key: event.key, shift: event.shiftKey, alt: event.altKey, mod: event.ctrlKey || event.metaKey };
}

/** Browser side: the KeyTarget of a focused element. */
export function describeKeyTarget(element: EventTarget | null): KeyTarget | null {
  if (!element || !(element instanceof Element)) return null;
  return {
    tagName: element.tagName,
    type: element.getAttribute("type"),
    isContentEditable: element instanceof HTMLElement ? element.isContentEditable : false,
    role: element.getAttribute("role"),
  };
}
