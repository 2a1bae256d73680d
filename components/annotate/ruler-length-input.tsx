"use client";

import { useId, useState, type KeyboardEvent } from "react";
import { parseRulerLength } from "@/lib/geometry/ruler";

type RulerLengthInputProps = {
  /** "draft": a placed ruler waits for its length; "selected": the selected ruler's length can be changed. */
  mode: "draft" | "selected";
  currentMm: number | null;
  onApply(lengthMm: number): void;
  onCancel(): void;
};

/**
 * The ruler's real length, typed in millimetres ("12.5", "12,5" or "12.5 mm"). Opens focused when
 * a ruler has just been placed, so the inspector can type straight away; Enter applies, Escape
 * cancels the ruler being placed. Mistakes get a message and keep the text.
 */
export function RulerLengthInput({ mode, currentMm, onApply, onCancel }: RulerLengthInputProps) {
  const id = useId();
  const [text, setText] = useState(currentMm === null ? "" : String(currentMm));
  const [error, setError] = useState<string | null>(null);

  function apply() {
    const parsed = parseRulerLength(text);
    if (!parsed.ok) return setError(parsed.message);
    setError(null);
    onApply(parsed.lengthMm);
  }

  function onKeyDown(e: KeyboardEvent<HTMLInputElement>) {
    if (e.key === "Enter") {
      e.preventDefault();
      apply();
    } else if (e.key === "Escape" && mode === "draft") {
      e.preventDefault();
      onCancel();
    }
  }

  return (
    <div className="flex flex-wrap items-end gap-2" data-testid="ruler-length">
      <div>
        <label htmlFor={id} className="field-label">
          {mode === "draft" ? "Ruler length (mm)" : "Selected ruler length (mm)"}
        </label>
        <input
          id={id}
          inputMode="decimal"
          autoComplete="off"
          className="field-input w-32"
          value={text}
          onChange={(e) => setText(e.target.value)}
          onKeyDown={onKeyDown}
          // Placing a ruler is immediately followed by typing its length.
          autoFocus={mode === "draft"}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-error` : undefined}
        />
      </div>
      <button type="button" className="btn-primary min-h-10" onClick={apply}>
        Set length
      </button>
      {mode === "draft" && (
        <button type="button" className="btn-secondary min-h-10" onClick={onCancel}>
          Cancel ruler
        </button>
      )}
      {error && (
        <p id={`${id}-error`} className="field-error w-full" aria-live="polite">
          {error}
        </p>
      )}
    </div>
  );
}
