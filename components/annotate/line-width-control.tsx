"use client";

import { LINE_WIDTH_STEPS } from "@/lib/annotate/constants";

/** Width of the selected line, or of lines drawn next (`[` and `]` step it too): a narrow picker for the tool rail. */
export function LineWidthControl({ value, target, onChange }: { value: number; target: "selection" | "new"; onChange(width: number): void }) {
  const steps: number[] = LINE_WIDTH_STEPS.includes(value as (typeof LINE_WIDTH_STEPS)[number]) ? [...LINE_WIDTH_STEPS] : [...LINE_WIDTH_STEPS, value].sort((a, b) => a - b);
  const label = target === "selection" ? "Width of the selected line, px" : "Width of new lines, px";
  return (
    <label className="flex flex-col items-center gap-0.5 text-[10px] text-gauge-300" title={`${label} ([ and ])`}>
      <span aria-hidden="true">{target === "selection" ? "sel. w" : "width"}</span>
      <select
        className="w-11 rounded border border-gauge-600 bg-gauge-800 px-0.5 py-0.5 text-center text-xs text-white focus-visible:outline-2 focus-visible:outline-signal-300"
        value={value}
        onChange={(e) => onChange(Number(e.target.value))}
        aria-label={label}
        aria-keyshortcuts="[ ]"
        data-testid="line-width"
      >
        {steps.map((w) => (
          <option key={w} value={w}>
            {Math.round(w * 100) / 100}
          </option>
        ))}
      </select>
    </label>
  );
}
