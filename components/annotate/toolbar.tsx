"use client";

import { memo } from "react";
import { LINE_WIDTH_STEPS } from "@/lib/annotate/constants";
import { TOOLS } from "@/lib/annotate/tools";
import type { ToolId } from "@/lib/annotate/types";
import { ClassVisibility, DefectClassPicker } from "./defect-class-picker";
import type { ClassEntry, HistoryAvailability, ToolbarActions } from "./types";

export type ToolbarProps = {
  activeTool: ToolId;
  enabledTools: ReadonlySet<ToolId>;
  classes: readonly ClassEntry[];
  activeDefect: string | null;
  hiddenDefects: readonly string[];
  /** Width shown in the line width control, original px. */
  lineWidth: number;
  /** Whether the width control changes the selected line or the width of lines drawn next. */
  lineWidthTarget: "selection" | "new";
  /** Stage px per original px. */
  zoom: number;
  history: HistoryAvailability;
  readOnly: boolean;
  actions: ToolbarActions;
};

const button = "btn-secondary min-h-10 px-2.5 py-1.5";
const pressed = "aria-pressed:border-gauge-800 aria-pressed:bg-gauge-800 aria-pressed:text-white";

function ToolButtons({ activeTool, enabledTools, onTool }: { activeTool: ToolId; enabledTools: ReadonlySet<ToolId>; onTool(id: ToolId): void }) {
  return (
    <div role="group" aria-label="Marking tools" className="flex flex-wrap gap-1.5">
      {TOOLS.map((tool) => {
        const enabled = enabledTools.has(tool.id);
        return (
          <button
            key={tool.id}
            type="button"
            className={`${button} ${pressed}`}
            aria-pressed={activeTool === tool.id}
            aria-keyshortcuts={tool.key.toUpperCase()}
            disabled={!enabled}
            title={enabled ? `${tool.description} (key ${tool.key.toUpperCase()})` : "Choose a defect class first."}
            onClick={() => onTool(tool.id)}
            data-testid={`tool-${tool.id}`}
          >
            {tool.label}
            <kbd className="font-mono text-xs opacity-70">{tool.key.toUpperCase()}</kbd>
          </button>
        );
      })}
    </div>
  );
}

function LineWidthControl({ value, target, onChange }: { value: number; target: "selection" | "new"; onChange(width: number): void }) {
  const steps: number[] = LINE_WIDTH_STEPS.includes(value as (typeof LINE_WIDTH_STEPS)[number]) ? [...LINE_WIDTH_STEPS] : [...LINE_WIDTH_STEPS, value].sort((a, b) => a - b);
  return (
    <label className="flex items-center gap-2 text-sm">
      <span>{target === "selection" ? "Selected line width" : "Line width"}</span>
      <select className="field-input min-h-10 w-24 py-1.5" value={value} onChange={(e) => onChange(Number(e.target.value))} aria-keyshortcuts="[ ]" data-testid="line-width">
        {steps.map((w) => (
          <option key={w} value={w}>
            {Math.round(w * 100) / 100} px
          </option>
        ))}
      </select>
    </label>
  );
}

function ViewButtons({ zoom, actions }: { zoom: number; actions: ToolbarActions }) {
  return (
    <div role="group" aria-label="Zoom" className="flex items-center gap-1.5">
      <button type="button" className={button} onClick={() => actions.view("fit")} aria-keyshortcuts="0" title="Fit the photo to the view (0)" data-testid="zoom-fit">
        Fit
      </button>
      <button type="button" className={button} onClick={() => actions.view("one-to-one")} aria-keyshortcuts="Shift+0" title="One photo pixel per screen pixel (Shift+0)" data-testid="zoom-1to1">
        1:1
      </button>
      <button type="button" className={button} onClick={() => actions.view("zoom-out")} aria-label="Zoom out" aria-keyshortcuts="-" data-testid="zoom-out">
        −
      </button>
      <output className="w-14 text-center text-sm tabular-nums" aria-live="off" aria-label="Zoom" data-testid="zoom-level">
        {zoom >= 0.1 ? Math.round(zoom * 100) : Math.round(zoom * 1000) / 10} %
      </output>
      <button type="button" className={button} onClick={() => actions.view("zoom-in")} aria-label="Zoom in" aria-keyshortcuts="+" data-testid="zoom-in">
        +
      </button>
    </div>
  );
}

/** Tools, classes, line width, zoom, undo/redo and class visibility: every canvas action by button. */
export const Toolbar = memo(function Toolbar(props: ToolbarProps) {
  const { activeTool, enabledTools, classes, activeDefect, hiddenDefects, lineWidth, lineWidthTarget, zoom, history, readOnly, actions } = props;
  return (
    <div className="space-y-2" data-testid="annotation-toolbar">
      <div role="toolbar" aria-label="Annotation" className="flex flex-wrap items-center gap-x-4 gap-y-2">
        {!readOnly && <ToolButtons activeTool={activeTool} enabledTools={enabledTools} onTool={actions.tool} />}
        {!readOnly && (
          <div role="group" aria-label="History" className="flex gap-1.5">
            <button type="button" className={button} onClick={actions.undo} disabled={!history.canUndo} aria-keyshortcuts="Control+Z Meta+Z" data-testid="undo">
              Undo
            </button>
            <button type="button" className={button} onClick={actions.redo} disabled={!history.canRedo} aria-keyshortcuts="Shift+Control+Z Shift+Meta+Z" data-testid="redo">
              Redo
            </button>
          </div>
        )}
        <ViewButtons zoom={zoom} actions={actions} />
        {!readOnly && <LineWidthControl value={lineWidth} target={lineWidthTarget} onChange={actions.lineWidth} />}
        <ClassVisibility classes={classes} hiddenDefects={hiddenDefects} onToggle={actions.toggleHidden} />
        <button type="button" className={button} onClick={actions.showShortcuts} aria-keyshortcuts="?" data-testid="show-shortcuts">
          Shortcuts <kbd className="font-mono text-xs opacity-70">?</kbd>
        </button>
      </div>
      {!readOnly && <DefectClassPicker classes={classes} activeDefect={activeDefect} onPick={actions.defect} />}
    </div>
  );
});
