/**
 * What the hint over the photo says: the drawing in progress first (why it cannot finish yet, or
 * what it waits for), then the photo's own state, then what the tool in hand does and the keys
 * that matter now. One line, read where the inspector is already looking. Pure.
 */
import { draftHint, TOOLS_BY_ID } from "@/lib/annotate/tools";
import type { AnnotationState } from "@/lib/annotate/types";
import { RULER_STYLE, SURFACE_STYLE, UNKNOWN_DEFECT_STYLE, type RegionStyle } from "@/lib/annotate/defect-styles";

export type ImageStatus = "loading" | "ready" | "failed";

/** Keys worth a reminder with each tool, beyond what its description already says (the `?` sheet has them all). */
const TOOL_KEYS: Record<AnnotationState["activeTool"], string> = {
  select: "Del removes · arrows nudge · Esc clears",
  box: "Shift squares it · Esc cancels",
  outline: "Backspace drops a point · Esc cancels",
  line: "Backspace drops a point · Esc cancels",
  spot: "Esc cancels",
  surface: "Enter or double-click closes · Backspace drops a point · Esc cancels",
  ruler: "Esc cancels",
};

export function canvasHint(state: AnnotationState, imageStatus: ImageStatus, readOnly: boolean): string {
  if (imageStatus === "failed") return "The photo could not be loaded. Check the connection and reload the page; the regions are kept.";
  const hint = draftHint(state);
  if (hint) return hint;
  if (imageStatus === "loading") return "Loading the photo…";
  if (readOnly) return "View only. Drag to pan, scroll or pinch to zoom. ? lists the keys.";
  if (state.activeDefect === null && state.activeTool !== "surface" && state.activeTool !== "ruler") {
    return state.allowedDefects.length === 0
      ? "This part type has no defect classes: only Surface and Ruler can be drawn."
      : "Choose a defect class to draw with: every class here is critical, so none is chosen for you.";
  }
  const tool = TOOLS_BY_ID[state.activeTool];
  return `${tool.description} ${TOOL_KEYS[state.activeTool]} · ? all keys`;
}

/** Style of what the draft will become: the active class, or the Surface / Ruler style. */
export function draftStyleOf(state: AnnotationState, styles: ReadonlyMap<string, RegionStyle>): RegionStyle {
  if (state.activeTool === "surface") return SURFACE_STYLE;
  if (state.activeTool === "ruler") return RULER_STYLE;
  return (state.activeDefect && styles.get(state.activeDefect)) || UNKNOWN_DEFECT_STYLE;
}
