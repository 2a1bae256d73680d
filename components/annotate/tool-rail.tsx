"use client";

import { memo } from "react";
import { TOOLS } from "@/lib/annotate/tools";
import type { ToolId } from "@/lib/annotate/types";
import { ClassSwatch } from "./class-swatch";
import { LineWidthControl } from "./line-width-control";
import { Glyph } from "./tool-glyphs";
import type { ClassEntry, HistoryAvailability, ToolbarActions } from "./types";

type ToolRailProps = {
  activeTool: ToolId;
  /** Width shown in the line width picker, original px, and whether it is the selected line's. */
  lineWidth: { value: number; target: "selection" | "new" };
  enabledTools: ReadonlySet<ToolId>;
  classes: readonly ClassEntry[];
  hiddenDefects: readonly string[];
  history: HistoryAvailability;
  readOnly: boolean;
  actions: ToolbarActions;
};

const railButton =
  "relative flex h-8 w-10 shrink-0 items-center lg:h-9 justify-center rounded-md text-gauge-100 hover:bg-gauge-700 disabled:cursor-not-allowed disabled:opacity-35 disabled:hover:bg-transparent aria-pressed:bg-signal-300 aria-pressed:text-gauge-950 focus-visible:outline-2 focus-visible:outline-signal-300";

/** The key that does the same, in the button's corner: the hint sits where the hand already is. */
function KeyBadge({ label }: { label: string }) {
  return <kbd className="pointer-events-none absolute right-0.5 bottom-0 font-mono text-[10px] leading-none opacity-75">{label}</kbd>;
}

/** Shows or hides classes on the photo: a fold-out beside the rail with one checkbox per class. */
function ClassVisibility({ classes, hiddenDefects, onToggle }: { classes: readonly ClassEntry[]; hiddenDefects: readonly string[]; onToggle(key: string): void }) {
  const hiddenCount = classes.filter((c) => hiddenDefects.includes(c.key)).length;
  return (
    <details className="relative">
      <summary
        className={`${railButton} cursor-pointer list-none`}
        title="Show or hide classes on the photo"
        aria-label={`Shown classes${hiddenCount ? ` (${hiddenCount} hidden)` : ""}`}
        data-testid="class-visibility"
      >
        <Glyph name="eye" />
        {hiddenCount > 0 && <span className="absolute top-0.5 right-0.5 rounded bg-signal-300 px-1 text-[10px] font-semibold text-gauge-950">{hiddenCount}</span>}
      </summary>
      <fieldset className="card absolute bottom-0 left-full z-30 ml-2 max-h-[70vh] min-w-56 space-y-1 overflow-y-auto p-3 text-gauge-900">
        <legend className="sr-only">Classes shown on the photo</legend>
        {classes.map((c) => (
          <label key={c.key} className="flex min-h-9 cursor-pointer items-center gap-2 text-sm">
            <input type="checkbox" checked={!hiddenDefects.includes(c.key)} onChange={() => onToggle(c.key)} data-testid={`show-class-${c.key}`} />
            <ClassSwatch style={c.style} size="sm" />
            {c.label}
          </label>
        ))}
      </fieldset>
    </details>
  );
}

/**
 * The marking tools as a dark vertical rail beside the photo, each with its own glyph and its
 * key in the corner; then undo/redo, class visibility and the key sheet. Every button does
 * exactly what its key does (through `actions`).
 */
export const ToolRail = memo(function ToolRail({ activeTool, lineWidth, enabledTools, classes, hiddenDefects, history, readOnly, actions }: ToolRailProps) {
  return (
    <div role="toolbar" aria-orientation="vertical" aria-label="Marking tools" className="flex h-full w-12 flex-col items-center gap-0.5 rounded-lg bg-gauge-900 py-1" data-testid="tool-rail">
      {!readOnly &&
        TOOLS.map((tool) => {
          const enabled = enabledTools.has(tool.id);
          const key = tool.key.toUpperCase();
          return (
            <button
              key={tool.id}
              type="button"
              className={railButton}
              aria-pressed={activeTool === tool.id}
              aria-label={tool.label}
              aria-keyshortcuts={key}
              disabled={!enabled}
              title={enabled ? `${tool.label} (${key}): ${tool.description}` : `${tool.label}: choose a defect class first.`}
              onClick={() => actions.tool(tool.id)}
              data-testid={`tool-${tool.id}`}
            >
              <Glyph name={tool.id} />
              <KeyBadge label={key} />
            </button>
          );
        })}
      {!readOnly && (
        <div className="my-0.5 flex flex-col items-center gap-0.5 border-t border-gauge-700 pt-1">
          <button
            type="button"
            className={railButton}
            onClick={actions.undo}
            disabled={!history.canUndo}
            aria-label="Undo"
            aria-keyshortcuts="Control+Z Meta+Z"
            title="Undo (Ctrl+Z)"
            data-testid="undo"
          >
            <Glyph name="undo" />
          </button>
          <button
            type="button"
            className={railButton}
            onClick={actions.redo}
            disabled={!history.canRedo}
            aria-label="Redo"
            aria-keyshortcuts="Shift+Control+Z Shift+Meta+Z"
            title="Redo (Shift+Ctrl+Z)"
            data-testid="redo"
          >
            <Glyph name="redo" />
          </button>
          <LineWidthControl value={lineWidth.value} target={lineWidth.target} onChange={actions.lineWidth} />
        </div>
      )}
      <div className="mt-auto flex flex-col items-center gap-0.5">
        <ClassVisibility classes={classes} hiddenDefects={hiddenDefects} onToggle={actions.toggleHidden} />
        <button type="button" className={railButton} onClick={actions.showShortcuts} aria-label="Keyboard shortcuts" aria-keyshortcuts="?" title="All keys (?)" data-testid="show-shortcuts">
          <Glyph name="keys" />
          <KeyBadge label="?" />
        </button>
      </div>
    </div>
  );
});
