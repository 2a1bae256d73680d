"use client";

import { memo } from "react";
import type { ToolId } from "@/lib/annotate/types";
import { ClassSwatch } from "./class-swatch";
import { RulerLengthInput } from "./ruler-length-input";
import { Glyph } from "./tool-glyphs";
import type { ClassEntry, ToolbarActions } from "./types";
import { ZoomControl } from "./zoom-control";

type RulerPrompt = { id: string; mode: "draft" | "selected"; lengthMm: number | null } | null;

type StageOverlaysProps = {
  statusId: string;
  /** The tool in hand and its class (null class: Surface, Ruler, Select or none chosen). */
  tool: { id: ToolId; label: string } | null;
  entry: ClassEntry | null;
  hint: string;
  zoom: number;
  zonesWaiting: boolean;
  ruler: RulerPrompt;
  actions: ToolbarActions;
};

/**
 * Everything drawn over the photo rather than around it, so opening or changing any of it never
 * moves the photo under the pointer: the hint line (tool in hand, class, what the keys do), the
 * ruler's length prompt, the zones notice and the zoom control.
 */
export const StageOverlays = memo(function StageOverlays({ statusId, tool, entry, hint, zoom, zonesWaiting, ruler, actions }: StageOverlaysProps) {
  return (
    <>
      <div className="pointer-events-none absolute top-2 left-2 flex max-w-[calc(100%-1rem)] items-center gap-2 rounded-md bg-gauge-950/80 px-2 py-1 text-xs text-white" data-testid="canvas-hint">
        {tool && (
          <span className="flex shrink-0 items-center gap-1 font-semibold" data-testid="tool-in-hand">
            <Glyph name={tool.id} className="h-4 w-4" />
            {tool.label}
            {entry && (
              <>
                <span aria-hidden="true">·</span>
                <ClassSwatch style={entry.style} size="sm" />
                {entry.label}
              </>
            )}
          </span>
        )}
        <span id={statusId} className="min-w-0 truncate" aria-live="polite" data-testid="annotation-status">
          {hint}
        </span>
      </div>
      {ruler && (
        <div className="card absolute top-11 left-2 z-10 max-w-[calc(100%-1rem)] p-3 shadow-md">
          <RulerLengthInput key={ruler.id} mode={ruler.mode} currentMm={ruler.lengthMm} onApply={actions.rulerLength} onCancel={actions.cancelRuler} />
        </div>
      )}
      {zonesWaiting && (
        <p className="pointer-events-none absolute bottom-2 left-2 rounded bg-gauge-950/75 px-2 py-1 text-xs text-white" data-testid="zones-waiting">
          Zones: no Surface yet — trace the part with Surface to place them.
        </p>
      )}
      <div className="absolute right-2 bottom-2">
        <ZoomControl zoom={zoom} onView={actions.view} />
      </div>
    </>
  );
});
