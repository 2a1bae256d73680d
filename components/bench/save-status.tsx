"use client";

import type { SaveStatus } from "./region-autosaver";

const time = (ms: number) => new Date(ms).toLocaleTimeString([], { hour: "2-digit", minute: "2-digit", second: "2-digit" });

/** What the autosave state means in words; "unsaved" whenever the edits are not on the server yet. */
export function describeSaveStatus(status: SaveStatus): { text: string; tone: "ok" | "busy" | "warn" | "fault"; unsaved: boolean } {
  switch (status.kind) {
    case "saved":
      return { text: status.at ? `Saved (version ${status.version}, ${time(status.at)})` : status.version ? `Saved (version ${status.version})` : "No regions saved yet", tone: "ok", unsaved: false };
    case "pending":
      return { text: "Unsaved changes — saving…", tone: "busy", unsaved: true };
    case "saving":
      return { text: "Saving…", tone: "busy", unsaved: true };
    case "retrying":
      return { text: `Unsaved (retrying in ${Math.round(status.retryInMs / 1000)} s): ${status.message}`, tone: "warn", unsaved: true };
    case "conflict":
      return { text: "Unsaved: these regions were changed elsewhere — choose how to continue.", tone: "fault", unsaved: true };
    case "refused":
      return { text: `Unsaved: ${status.message}`, tone: "fault", unsaved: true };
  }
}

const TONE = { ok: "text-ok-600", busy: "text-gauge-700", warn: "text-signal-700 font-medium", fault: "text-fault-700 font-medium" } as const;

export function SaveStatusLine({ status, onRetry }: { status: SaveStatus; onRetry(): void }) {
  const { text, tone } = describeSaveStatus(status);
  return (
    <div className="flex flex-wrap items-center gap-2 text-sm" data-testid="save-status" data-state={status.kind}>
      <span role="status" aria-live="polite" className={TONE[tone]}>
        {text}
      </span>
      {(status.kind === "retrying" || status.kind === "refused") && (
        <button type="button" className="btn-secondary px-2 py-1 text-xs" onClick={onRetry}>
          Try again now
        </button>
      )}
    </div>
  );
}
