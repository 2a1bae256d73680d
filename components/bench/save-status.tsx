"use client";

import { useTimeZone } from "@/components/ui/time-zone";
import { formatTime } from "@/lib/time/format";
import type { SaveStatus } from "./region-autosaver";

type SaveStatusWords = { text: string; detail: string | null; tone: "ok" | "busy" | "warn" | "fault" };

/** What the autosave state means in words ("Unsaved …" whenever the edits are not on the server yet). */
function describeSaveStatus(status: SaveStatus, timeZone: string): SaveStatusWords {
  switch (status.kind) {
    case "saved":
      return {
        text: status.at ? `Saved (version ${status.version}, ${formatTime(status.at, timeZone, { seconds: true })})` : status.version ? `Saved (version ${status.version})` : "No regions saved yet",
        detail: null,
        tone: "ok",
      };
    case "pending":
      return { text: "Unsaved — saving…", detail: null, tone: "busy" };
    case "saving":
      return { text: "Saving…", detail: null, tone: "busy" };
    case "retrying":
      return { text: `Unsaved (retrying in ${Math.round(status.retryInMs / 1000)} s)`, detail: status.message, tone: "warn" };
    case "conflict":
      return { text: "Unsaved: changed elsewhere", detail: null, tone: "fault" };
    case "refused":
      return { text: "Unsaved: not accepted", detail: status.message, tone: "fault" };
  }
}

const TONE = { ok: "text-ok-600", busy: "text-gauge-700", warn: "text-signal-700 font-medium", fault: "text-fault-700 font-medium" } as const;

/**
 * One line of fixed height beside the photo's heading: the short state only, so a state change
 * never wraps the line and moves the canvas under the inspector's pointer. The reason of a failed
 * save is long; `SaveProblem` shows it below the canvas.
 */
export function SaveStatusLine({ status, onRetry }: { status: SaveStatus; onRetry(): void }) {
  const { text, detail, tone } = describeSaveStatus(status, useTimeZone());
  return (
    <div className="flex h-7 min-w-0 shrink-0 items-center gap-2 text-sm whitespace-nowrap" data-testid="save-status" data-state={status.kind}>
      <span role="status" aria-live="polite" className={TONE[tone]} title={detail ?? undefined}>
        {text}
      </span>
      {/* Kept (disabled) while a retry is on its way, so the button does not flicker out from under the pointer. */}
      {(status.kind === "retrying" || status.kind === "refused" || (status.kind === "saving" && (status.attempt ?? 0) > 0)) && (
        <button type="button" className="btn-secondary px-2 py-0.5 text-xs" onClick={onRetry} disabled={status.kind === "saving"}>
          Try again now
        </button>
      )}
    </div>
  );
}

/** Why the last save failed, in full, for the states that have a reason; nothing otherwise. */
export function SaveProblem({ status }: { status: SaveStatus }) {
  const { detail, tone } = describeSaveStatus(status, useTimeZone());
  if (!detail) return null;
  return (
    <p
      className={`rounded-md border px-3 py-2 text-sm ${tone === "fault" ? "border-fault-600 bg-fault-50 text-fault-700" : "border-signal-500 bg-signal-50 text-signal-700"}`}
      data-testid="save-problem"
    >
      Your edits are kept in this tab and have not reached the server: {detail}
    </p>
  );
}
