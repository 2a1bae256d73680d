/**
 * Zoom commands shared by the toolbar buttons and the keyboard. These keys are tried only after
 * the tool registry left a key unhandled (1–9 pick classes there, so the view keys avoid them).
 */
import { fitToView, oneToOne, stagePoint, zoomAround, type Size, type Viewport } from "@/lib/annotate/coords";
import type { Shortcut } from "@/lib/annotate/tools";

export type ViewCommand = "zoom-in" | "zoom-out" | "fit" | "one-to-one";

/** One button press or key press zooms by this factor (common practice, our own choice). */
export const ZOOM_STEP = 1.25;

export type ViewKeyInput = Readonly<{ key: string; code?: string; shift: boolean; alt: boolean; mod: boolean }>;

export function viewCommandForKey(input: ViewKeyInput): ViewCommand | null {
  if (input.mod || input.alt) return null;
  // Shift+0 reads the physical key: its character differs by keyboard layout (")" or "=").
  if (input.shift && input.code === "Digit0") return "one-to-one";
  if (input.key === "+" || input.key === "=") return "zoom-in";
  if (input.key === "-" || input.key === "_") return "zoom-out";
  if (input.key === "0" && !input.shift) return "fit";
  return null;
}

/** The viewport after a command; zooming by buttons or keys is around the stage centre. */
export function applyViewCommand(viewport: Viewport, command: ViewCommand, image: Size, stage: Size): Viewport {
  const centre = stagePoint(stage.width / 2, stage.height / 2);
  switch (command) {
    case "zoom-in":
      return zoomAround(viewport, centre, ZOOM_STEP);
    case "zoom-out":
      return zoomAround(viewport, centre, 1 / ZOOM_STEP);
    case "fit":
      return fitToView(image, stage);
    case "one-to-one":
      return oneToOne(viewport, centre);
  }
}

/** For the `?` sheet, next to the registry's own list. */
export const VIEW_SHORTCUTS: readonly Shortcut[] = [
  { keys: "Mouse wheel", action: "Zoom around the pointer" },
  { keys: "Space + drag, or middle-button drag", action: "Pan" },
  { keys: "Two fingers", action: "Pinch to zoom, drag to pan (touch)" },
  { keys: "+ / −", action: "Zoom in / out" },
  { keys: "0", action: "Fit the photo to the view" },
  { keys: "Shift + 0", action: "One photo pixel per screen pixel (1:1)" },
];
