"use client";

import { ClassSwatch } from "./class-swatch";
import type { ClassEntry } from "./types";

/**
 * The part type's defect classes as buttons: the class for new regions. Number keys 1–9 do the
 * same and also recolour the selected region; so does a click.
 */
export function DefectClassPicker({ classes, activeDefect, onPick }: { classes: readonly ClassEntry[]; activeDefect: string | null; onPick(key: string): void }) {
  return (
    <div role="group" aria-label="Defect class" className="flex flex-wrap gap-1.5">
      {classes.map((c) => {
        const number = c.index < 9 ? String(c.index + 1) : null;
        return (
          <button
            key={c.key}
            type="button"
            className="btn-secondary min-h-10 gap-1.5 px-2.5 py-1.5 aria-pressed:border-gauge-800 aria-pressed:bg-gauge-800 aria-pressed:text-white"
            aria-pressed={activeDefect === c.key}
            aria-keyshortcuts={number ?? undefined}
            title={`${c.label} (${c.severity})${number ? ` — key ${number}` : ""}`}
            onClick={() => onPick(c.key)}
            data-testid={`defect-class-${c.key}`}
          >
            {number && <kbd className="font-mono text-xs opacity-80">{number}</kbd>}
            <ClassSwatch style={c.style} />
            <span>{c.label}</span>
          </button>
        );
      })}
    </div>
  );
}

/** Show or hide classes on the canvas (a disclosure with one checkbox per class). */
export function ClassVisibility({ classes, hiddenDefects, onToggle }: { classes: readonly ClassEntry[]; hiddenDefects: readonly string[]; onToggle(key: string): void }) {
  const hiddenCount = classes.filter((c) => hiddenDefects.includes(c.key)).length;
  return (
    <details className="relative">
      <summary className="btn-secondary min-h-10 cursor-pointer list-none px-2.5 py-1.5" data-testid="class-visibility">
        Show classes{hiddenCount > 0 ? ` (${hiddenCount} hidden)` : ""}
      </summary>
      <fieldset className="card absolute right-0 z-20 mt-1 min-w-56 space-y-1 p-3">
        <legend className="sr-only">Classes shown on the photo</legend>
        {classes.map((c) => (
          <label key={c.key} className="flex min-h-9 cursor-pointer items-center gap-2 text-sm">
            <input type="checkbox" checked={!hiddenDefects.includes(c.key)} onChange={() => onToggle(c.key)} data-testid={`show-class-${c.key}`} />
            <ClassSwatch style={c.style} />
            {c.label}
          </label>
        ))}
      </fieldset>
    </details>
  );
}
