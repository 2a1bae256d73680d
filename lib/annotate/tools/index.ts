/**
 * The tool registry and the keyboard map of the Bench canvas. The canvas forwards pointer events
 * (converted to image space) to `pointerDown/Move/Up` and key presses to `handleKey`; it should
 * not forward keys typed into form fields (the ruler length input, the grade form).
 *
 * Keys, in the order they are tried:
 * 1. Ctrl/Cmd+Z undo (while drawing vertices: remove the last one), Shift+Ctrl/Cmd+Z and
 *    Ctrl/Cmd+Y redo;
 * 2. the active tool's own keys (Enter, Escape, Backspace, Delete, [ ], arrows);
 * 3. 1–9: defect class n of the part type, also given to the selected region;
 * 4. a tool letter switches tools; `?` asks for the shortcut sheet.
 * Other Ctrl/Cmd/Alt combinations are left to the browser.
 */
import type { ImagePoint } from "../coords";
import { cancelBatch, redo, undo } from "../history";
import { chooseDefectByIndex } from "../model";
import type { AnnotationState, PointerModifiers, ToolId } from "../types";
import { boxTool } from "./box";
import { vertexDraftProblem, type VertexToolSpec } from "./vertex-draft";
import { lineSpec, lineTool } from "./line";
import { outlineSpec, outlineTool } from "./outline";
import { rulerTool } from "./ruler";
import { selectTool } from "./select";
import { spotTool } from "./spot";
import { surfaceSpec, surfaceTool } from "./surface";
import type { KeyModifiers, Shortcut, Tool } from "./types";

export type { KeyModifiers, Shortcut, Tool } from "./types";

/** Toolbar order. */
export const TOOLS: readonly Tool[] = [selectTool, boxTool, outlineTool, lineTool, spotTool, surfaceTool, rulerTool];

export const TOOLS_BY_ID: Readonly<Record<ToolId, Tool>> = Object.fromEntries(TOOLS.map((t) => [t.id, t])) as Record<ToolId, Tool>;

const TOOL_BY_KEY: ReadonlyMap<string, Tool> = new Map(TOOLS.map((t) => [t.key, t]));

export function activeTool(state: AnnotationState): Tool {
  return TOOLS_BY_ID[state.activeTool];
}

/**
 * Switches tools. Drops an unfinished drawing and drag; picking a drawing tool clears the
 * selection (number keys then only choose the class for the next region). Refused when the tool
 * is not enabled (drawing defects needs a class).
 */
export function activateTool(state: AnnotationState, id: ToolId): AnnotationState {
  const tool = TOOLS_BY_ID[id];
  if (!tool || id === state.activeTool || !tool.isEnabled(state)) return state;
  const base = cancelBatch(state);
  return { ...base, activeTool: id, draft: null, drag: null, selectedId: id === "select" ? base.selectedId : null };
}

export function pointerDown(state: AnnotationState, p: ImagePoint, modifiers: PointerModifiers): AnnotationState {
  return activeTool(state).pointerDown(state, p, modifiers);
}

export function pointerMove(state: AnnotationState, p: ImagePoint, modifiers: PointerModifiers): AnnotationState {
  return activeTool(state).pointerMove(state, p, modifiers);
}

export function pointerUp(state: AnnotationState, p: ImagePoint, modifiers: PointerModifiers): AnnotationState {
  return activeTool(state).pointerUp(state, p, modifiers);
}

const VERTEX_SPECS: Partial<Record<ToolId, VertexToolSpec>> = { outline: outlineSpec, surface: surfaceSpec, line: lineSpec };

/**
 * A hint for the status line about the drawing in progress: why it cannot be finished yet, or
 * what it waits for; null when there is nothing to say.
 */
export function draftHint(state: AnnotationState): string | null {
  const draft = state.draft;
  if (!draft) return null;
  if (draft.tool === "ruler") return draft.phase === "length" ? "Type the ruler's length in mm." : "Click or drag to the ruler's other end.";
  const spec = VERTEX_SPECS[draft.tool];
  return spec ? vertexDraftProblem(state, spec) : null;
}

export type KeyInput = KeyModifiers & { key: string };

/** `handled` tells the canvas to preventDefault; `showShortcuts` asks it to open the `?` sheet. */
export type KeyResult = { state: AnnotationState; handled: boolean; showShortcuts?: true };

function hasVertexDraft(state: AnnotationState): boolean {
  const draft = state.draft;
  return !!draft && (draft.tool === "outline" || draft.tool === "surface" || draft.tool === "line") && draft.points.length > 1;
}

export function handleKey(state: AnnotationState, input: KeyInput): KeyResult {
  const key = input.key.length === 1 ? input.key.toLowerCase() : input.key;
  if (input.mod && !input.alt && (key === "z" || key === "y")) {
    if (key === "y" || input.shift) return { state: redo(state), handled: true };
    const next = hasVertexDraft(state) ? activeTool(state).keyDown(state, "Backspace", input) : undo(state);
    return { state: next, handled: true };
  }
  if (input.mod || input.alt) return { state, handled: false };
  const byTool = activeTool(state).keyDown(state, input.key, input);
  if (byTool !== state) return { state: byTool, handled: true };
  if (/^[1-9]$/.test(key)) {
    return { state: chooseDefectByIndex(state, Number(key) - 1), handled: true };
  }
  const tool = TOOL_BY_KEY.get(key);
  if (tool) return { state: activateTool(state, tool.id), handled: true };
  if (input.key === "?") return { state, handled: true, showShortcuts: true };
  return { state, handled: false };
}

export type ShortcutGroup = { title: string; shortcuts: readonly Shortcut[] };

/** Everything the `?` sheet lists: global keys, tool letters, then each tool's own keys. */
export function shortcutSheet(): ShortcutGroup[] {
  return [
    {
      title: "Everywhere",
      shortcuts: [
        { keys: "Ctrl/Cmd + Z", action: "Undo (while drawing: remove the last vertex)" },
        { keys: "Shift + Ctrl/Cmd + Z or Ctrl/Cmd + Y", action: "Redo" },
        { keys: "1 – 9", action: "Choose the defect class; also changes the selected region's class" },
        { keys: "?", action: "Show this list" },
      ],
    },
    { title: "Tools", shortcuts: TOOLS.map((t) => ({ keys: t.key.toUpperCase(), action: `${t.label}: ${t.description}` })) },
    ...TOOLS.map((t) => ({ title: t.label, shortcuts: t.shortcuts })),
  ];
}
