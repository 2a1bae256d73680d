"use client";

import { useState } from "react";
import { DefectSeverityBadge } from "@/components/lots/badges";
import { useDateTime } from "@/components/ui/time-zone";
import { describeLimits, evaluateChecklistItem, formatReading, suspectReading } from "@/lib/checklist/evaluate";
import type { UnitView } from "@/lib/units/dto";
import type { ChecklistItem } from "@/lib/part-types/schemas";
import type { ChecklistValue } from "@/lib/units/schemas";

type Result = UnitView["results"][number];

/** "3,85" and "3.85" both mean 3.85 (bench keyboards vary). */
export function parseReading(text: string): number | null {
  const cleaned = text.trim().replace(",", ".");
  if (!/^-?\d+(\.\d+)?$/.test(cleaned)) return null;
  return Number(cleaned);
}

function shownValue(item: ChecklistItem, value: ChecklistValue): string {
  if ("pass" in value) return value.pass ? "Pass" : "Fail";
  if ("reading" in value && item.kind === "numeric") return formatReading(value.reading, item.decimals, item.unit);
  if ("choice" in value && item.kind === "choice") return item.options.find((o) => o.value === value.choice)?.label ?? value.choice;
  return "";
}

/**
 * How a failed result reads: a reading is judged against the limits automatically; a Fail button
 * or a failing choice is the inspector's own call and says so.
 */
export function failureText(item: ChecklistItem, result: Pick<Result, "failureReason" | "severityOnFail">): string {
  const adds = `Adds a ${result.severityOnFail} functional defect.`;
  if (item.kind === "pass_fail") return `Failed (marked by the inspector). ${adds}`;
  if (item.kind === "choice") return `Failed — ${result.failureReason} ${adds}`;
  return `Failed automatically — ${result.failureReason} ${adds}`;
}

/** One checklist item: its control, the live check against limits, a note, and the recorded result. */
export function ChecklistItemRow({
  item,
  result,
  disabled,
  saving,
  onRecord,
}: {
  item: ChecklistItem;
  result?: Result;
  disabled: boolean;
  saving: boolean;
  onRecord: (value: ChecklistValue, note: string) => void;
}) {
  const [text, setText] = useState(result && "reading" in result.value ? String(result.value.reading) : "");
  const [note, setNote] = useState(result?.note ?? "");
  const record = (value: ChecklistValue) => onRecord(value, note.trim());
  const noteChanged = result !== undefined && note.trim() !== result.note;
  const dateTime = useDateTime();
  const reading = item.kind === "numeric" ? parseReading(text) : null;
  const hint = item.kind === "numeric" && reading !== null ? evaluateChecklistItem(item, { reading }) : null;
  const suspect = reading !== null ? suspectReading(item, { reading }) : null;
  const inputId = `item-${item.id}`;

  return (
    <li className="space-y-1.5 py-2 text-sm" data-testid={`checklist-item-${item.id}`}>
      <div className="flex flex-wrap items-center gap-x-2 gap-y-0.5">
        <span className="font-medium" id={`${inputId}-label`}>
          {item.label}
        </span>
        <span className="text-xs text-gauge-600">fails as</span>
        <DefectSeverityBadge severity={item.severityOnFail} />
        {item.kind === "numeric" && <span className="text-xs text-gauge-600">limits {describeLimits(item)}</span>}
      </div>
      {item.caution && (
        <p role="note" className="rounded bg-signal-50 px-2 py-1 text-xs text-signal-700">
          {item.caution}
        </p>
      )}
      <div className="flex flex-wrap items-center gap-2">
        {item.kind === "pass_fail" && (
          <div role="group" aria-labelledby={`${inputId}-label`} className="flex gap-2">
            {[true, false].map((pass) => {
              const current = result && "pass" in result.value && result.value.pass === pass;
              return (
                <button
                  key={String(pass)}
                  type="button"
                  aria-pressed={current}
                  disabled={disabled || saving}
                  onClick={() => record({ pass })}
                  className={`${current ? (pass ? "btn-primary" : "btn-danger") : "btn-secondary"} h-8 py-0`}
                >
                  {pass ? "Pass" : "Fail"}
                </button>
              );
            })}
          </div>
        )}
        {item.kind === "numeric" && (
          <form
            className="flex flex-wrap items-center gap-2"
            onSubmit={(e) => {
              e.preventDefault();
              if (reading !== null) record({ reading });
            }}
          >
            <label htmlFor={inputId} className="sr-only">
              {item.label} reading{item.unit ? ` (${item.unit})` : ""}
            </label>
            <input
              id={inputId}
              inputMode="decimal"
              className="field-input h-8 w-28 py-0 font-mono"
              value={text}
              disabled={disabled}
              onChange={(e) => setText(e.target.value)}
              aria-describedby={`${inputId}-hint`}
            />
            <span className="text-sm text-gauge-700">{item.unit}</span>
            <button type="submit" className="btn-secondary h-8 py-0" disabled={disabled || saving || reading === null}>
              Save reading
            </button>
            <span id={`${inputId}-hint`} className="text-xs text-gauge-600">
              {text.trim() === ""
                ? ""
                : reading === null
                  ? "Enter a number."
                  : hint?.passed
                    ? "Within limits."
                    : `Will fail: ${hint?.failureReason}${suspect ? ` Below ${suspect.level}: set it aside as suspect.` : ""}`}
            </span>
          </form>
        )}
        {item.kind === "choice" && (
          <fieldset className="flex flex-wrap gap-3" disabled={disabled || saving}>
            <legend className="sr-only">{item.label}</legend>
            {item.options.map((option) => (
              <label key={option.value} className="flex items-center gap-1.5 text-sm">
                <input type="radio" name={inputId} checked={Boolean(result && "choice" in result.value && result.value.choice === option.value)} onChange={() => record({ choice: option.value })} />
                {option.label}
              </label>
            ))}
          </fieldset>
        )}
      </div>
      <div className="flex flex-wrap items-center gap-2">
        <label htmlFor={`${inputId}-note`} className="text-xs font-medium text-gauge-700">
          Note
        </label>
        <input
          id={`${inputId}-note`}
          className="field-input h-7 min-w-0 flex-1 py-0 text-xs"
          value={note}
          maxLength={500}
          disabled={disabled}
          placeholder={result ? "Add a note to this result" : "Saved with the result"}
          onChange={(e) => setNote(e.target.value)}
          data-testid={`note-${item.id}`}
        />
        {noteChanged && (
          <button type="button" className="btn-secondary h-7 py-0 text-xs" disabled={disabled || saving} onClick={() => record(result.value)}>
            Save note
          </button>
        )}
      </div>
      {result && (
        <p role="status" data-testid={`result-${item.id}`} className={`text-sm ${result.passed ? "text-ok-600" : "font-medium text-fault-700"}`}>
          {result.passed ? (item.kind === "pass_fail" ? "Passed." : `Passed: ${shownValue(item, result.value)}.`) : failureText(item, result)}
          <span className="ml-2 text-xs font-normal text-gauge-600">
            {/* With the date, since a reading from an earlier day must not read as today's. */}
            {result.recordedByName}, {dateTime(result.recordedAt)}
          </span>
          {result.note && (
            <span className="block text-xs font-normal text-gauge-700" data-testid={`saved-note-${item.id}`}>
              Note: {result.note}
            </span>
          )}
        </p>
      )}
    </li>
  );
}
