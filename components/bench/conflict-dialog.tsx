"use client";

import { useEffect, useMemo, useRef, type KeyboardEvent } from "react";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { mergeRegionSets } from "@/lib/regions/merge";
import type { ServerSet } from "./region-autosaver";

export type ConflictChoice = "merge" | "mine" | "theirs";

const count = (p: RegionSetPayload) => p.regions.length + p.surfaces.length + (p.ruler ? 1 : 0);
const regionsText = (n: number) => `${n} region${n === 1 ? "" : "s"}`;

/**
 * Shown when a save met a newer save from elsewhere (409). Nothing is lost whatever is chosen:
 * a merge keeps both sides' edits; "theirs" puts the other set in place but the person's own stays
 * one Undo away; "mine" saves over theirs only after the person has seen what that replaces.
 * A modal dialog: focus moves in, Tab stays inside; Escape merges nothing and keeps it open.
 */
export function ConflictDialog({
  current,
  base,
  mine,
  onChoose,
}: {
  current: ServerSet;
  base: RegionSetPayload;
  mine: RegionSetPayload;
  onChoose(choice: ConflictChoice, keep: RegionSetPayload): void;
}) {
  const merged = useMemo(() => mergeRegionSets({ base, mine, theirs: current.regions }), [base, mine, current]);
  const dialogRef = useRef<HTMLDivElement>(null);
  const firstRef = useRef<HTMLButtonElement>(null);
  useEffect(() => firstRef.current?.focus(), []);

  function onKeyDown(e: KeyboardEvent<HTMLDivElement>) {
    e.stopPropagation(); // keys here never reach the canvas behind
    if (e.key !== "Tab" || !dialogRef.current) return;
    const buttons = dialogRef.current.querySelectorAll<HTMLElement>("button");
    const [first, last] = [buttons[0], buttons[buttons.length - 1]];
    if (e.shiftKey && document.activeElement === first) {
      e.preventDefault();
      last.focus();
    } else if (!e.shiftKey && document.activeElement === last) {
      e.preventDefault();
      first.focus();
    }
  }

  const who = current.updatedByName ? `${current.updatedByName} (or you, in another tab)` : "Someone (or you, in another tab)";
  return (
    <div className="fixed inset-0 z-50 flex items-center justify-center bg-gauge-950/50 p-4">
      <div
        ref={dialogRef}
        role="alertdialog"
        aria-modal="true"
        aria-labelledby="conflict-title"
        aria-describedby="conflict-text"
        className="card max-h-[85vh] w-full max-w-xl space-y-4 overflow-y-auto p-5"
        onKeyDown={onKeyDown}
        data-testid="conflict-dialog"
      >
        <h2 id="conflict-title" className="text-lg font-semibold">
          These regions were changed elsewhere
        </h2>
        <div id="conflict-text" className="space-y-2 text-sm">
          <p>
            {who} saved this photo&rsquo;s regions while you were editing (now version {current.version}, {regionsText(count(current.regions))}). Your {regionsText(count(mine))} are still here and
            nothing has been lost.
          </p>
          <p>
            Merging keeps both: {merged.takenFromTheirs > 0 ? `${regionsText(merged.takenFromTheirs)} from the other session are taken over` : "nothing of theirs differs from yours"}, the result has{" "}
            {regionsText(count(merged.payload))}.
          </p>
          {merged.conflicts.length > 0 && (
            <ul className="list-disc space-y-0.5 pl-5 text-signal-700" data-testid="conflict-list">
              {merged.conflicts.map((c, i) => (
                <li key={i}>{c}</li>
              ))}
            </ul>
          )}
        </div>
        <div className="flex flex-col gap-2 sm:flex-row sm:flex-wrap">
          <button ref={firstRef} type="button" className="btn-primary" onClick={() => onChoose("merge", merged.payload)} data-testid="conflict-merge">
            Merge both and save
          </button>
          <button type="button" className="btn-secondary" onClick={() => onChoose("theirs", current.regions)} data-testid="conflict-theirs">
            Load theirs (yours stay one Undo away)
          </button>
          <button type="button" className="btn-danger" onClick={() => onChoose("mine", mine)} data-testid="conflict-mine">
            Keep mine and save over theirs
          </button>
        </div>
      </div>
    </div>
  );
}
