"use client";

import { memo } from "react";
import type { ViewCommand } from "./view-commands";

const part = "flex h-8 items-center justify-center px-2 text-sm hover:bg-gauge-700 focus-visible:outline-2 focus-visible:outline-signal-300";

/** Zoom as the canvas reports it: whole per cent, one decimal below 10 %. */
export function zoomText(scale: number): string {
  return `${scale >= 0.1 ? Math.round(scale * 100) : Math.round(scale * 1000) / 10} %`;
}

/**
 * One zoom control over the photo's corner: out, the level, in, and the two fixed views (the
 * whole photo, one photo pixel per screen pixel). Over the stage, so it never takes a row of its own.
 */
export const ZoomControl = memo(function ZoomControl({ zoom, onView }: { zoom: number; onView(command: ViewCommand): void }) {
  return (
    <div role="group" aria-label="Zoom" className="flex items-stretch overflow-hidden rounded-md bg-gauge-900/85 text-white shadow-md" data-testid="zoom-control">
      <button type="button" className={part} onClick={() => onView("zoom-out")} aria-label="Zoom out" aria-keyshortcuts="-" title="Zoom out (−)" data-testid="zoom-out">
        −
      </button>
      <output className="flex w-16 items-center justify-center text-sm tabular-nums" aria-live="off" aria-label="Zoom" data-testid="zoom-level">
        {zoomText(zoom)}
      </output>
      <button type="button" className={part} onClick={() => onView("zoom-in")} aria-label="Zoom in" aria-keyshortcuts="+" title="Zoom in (+)" data-testid="zoom-in">
        +
      </button>
      <span className="my-1.5 w-px bg-gauge-600" aria-hidden="true" />
      <button type="button" className={part} onClick={() => onView("fit")} aria-keyshortcuts="0" title="The whole photo (0)" data-testid="zoom-fit">
        Whole
      </button>
      <button type="button" className={part} onClick={() => onView("one-to-one")} aria-keyshortcuts="Shift+0" title="One photo pixel per screen pixel (Shift+0)" data-testid="zoom-1to1">
        1:1
      </button>
    </div>
  );
});
