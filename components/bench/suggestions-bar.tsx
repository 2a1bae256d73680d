"use client";

import { useMutation } from "@tanstack/react-query";
import { useState } from "react";
import type { GhostShape } from "@/components/annotate/types";
import { FormMessage } from "@/components/ui/form-field";
import type { SuggestionKind } from "@/lib/regions/schemas";
import { describeAddOutcome, type AddOutcome } from "@/lib/annotate/bulk-edits";
import { decisionRequests, isLearned } from "./learned-decisions";
import { recordSuggestionDecisions, requestLearnedSuggestions, requestSuggestions } from "./regions-api";

type AcceptOutcome = Pick<AddOutcome, "ids" | "skipped">;

const SHOWN = 8;

/**
 * "Suggest Surface", "Suggest defects" (learned from the workspace's own accepted regions) and, on
 * screen views of display parts, "Find pixel faults". Suggestions are ghosts on the canvas until
 * the inspector accepts them (each becomes a region, one Undo step) or dismisses them; they are
 * never saved on their own. What is done with a learned ghost is recorded (dismissed ones teach
 * the next training "no defect").
 */
export function SuggestionsBar({
  photoId,
  screenView,
  ghosts,
  onGhosts,
  onAccept,
}: {
  photoId: string;
  screenView: boolean;
  ghosts: readonly GhostShape[];
  onGhosts(ghosts: GhostShape[]): void;
  onAccept(ghosts: readonly GhostShape[]): AcceptOutcome | undefined;
}) {
  const [note, setNote] = useState<string | null>(null);
  const [accepted, setAccepted] = useState<string | null>(null);
  const suggest = useMutation({
    mutationFn: (kind: SuggestionKind) => requestSuggestions(photoId, kind),
    onSuccess: (res) => {
      setNote(res.note);
      setAccepted(null);
      // Learned ghosts stay beside the new ones: they go only when accepted or dismissed (and recorded).
      onGhosts([...ghosts.filter(isLearned), ...res.ghosts.map((g) => ({ ...g, id: `${res.kind}-${Date.now().toString(36)}-${g.id}` }))]);
    },
    onError: () => setNote(null),
  });
  const learn = useMutation({
    mutationFn: () => requestLearnedSuggestions(photoId),
    onSuccess: (res) => {
      setNote(res.note);
      setAccepted(null);
      const modelId = res.modelId;
      const found: GhostShape[] = modelId
        ? res.ghosts.map((g) => ({ id: `${g.id}-${Date.now().toString(36)}`, role: "defect", defect: g.defect, shape: g.shape, label: `${g.label} (learned)`, learned: { modelId, score: g.score } }))
        : [];
      onGhosts([...ghosts.filter((g) => !isLearned(g)), ...found]);
    },
    onError: () => setNote(null),
  });
  const record = useMutation({
    mutationFn: async ({ list, decision }: { list: readonly GhostShape[]; decision: "accepted" | "dismissed" }) => {
      for (const request of decisionRequests(list, decision)) await recordSuggestionDecisions(photoId, request);
    },
  });
  const accept = (list: readonly GhostShape[]) => {
    const outcome = onAccept(list);
    // Say what became of them when several were accepted at once, or when one was left out.
    setAccepted(outcome && (list.length > 1 || outcome.ids.length < list.length) ? describeAddOutcome(outcome, list.length) : null);
    onGhosts(ghosts.filter((g) => !list.includes(g)));
    if (outcome && list.some(isLearned)) record.mutate({ list, decision: "accepted" });
  };
  const dismiss = (list: readonly GhostShape[]) => {
    onGhosts(ghosts.filter((g) => !list.includes(g)));
    if (list.some(isLearned)) record.mutate({ list, decision: "dismissed" });
  };
  const busy = suggest.isPending || learn.isPending;
  return (
    <section className="space-y-2 rounded-lg border border-dashed border-gauge-300 bg-white p-3" aria-label="Suggestions" data-testid="suggestions-bar">
      <div className="flex flex-wrap items-center gap-2">
        <span className="text-sm font-medium">Suggestions</span>
        <button type="button" className="btn-secondary px-2.5 py-1.5" onClick={() => suggest.mutate("surface")} disabled={busy} data-testid="suggest-surface">
          Suggest Surface
        </button>
        <button
          type="button"
          className="btn-secondary px-2.5 py-1.5"
          onClick={() => learn.mutate()}
          disabled={busy}
          data-testid="suggest-learned"
          title="Defects the workspace's own accepted regions taught the model"
        >
          Suggest defects
        </button>
        {screenView && (
          <button type="button" className="btn-secondary px-2.5 py-1.5" onClick={() => suggest.mutate("pixel-candidates")} disabled={busy} data-testid="suggest-pixels">
            Find pixel faults
          </button>
        )}
        {busy && (
          <span className="text-sm text-gauge-700" role="status">
            Looking…
          </span>
        )}
        {ghosts.length > 0 && (
          <>
            <button type="button" className="btn-primary px-2.5 py-1.5" onClick={() => accept(ghosts)} data-testid="accept-all-suggestions">
              Accept {ghosts.length === 1 ? "it" : `all ${ghosts.length}`}
            </button>
            <button type="button" className="btn-secondary px-2.5 py-1.5" onClick={() => dismiss(ghosts)} data-testid="dismiss-all-suggestions">
              Dismiss {ghosts.length === 1 ? "it" : "all"}
            </button>
          </>
        )}
      </div>
      {suggest.isError && <FormMessage kind="error">{suggest.error.message}</FormMessage>}
      {learn.isError && <FormMessage kind="error">{learn.error.message}</FormMessage>}
      {record.isError && <FormMessage kind="error">Your choice on a learned suggestion was not recorded: {record.error.message}</FormMessage>}
      {accepted && (
        <p className="text-xs text-gauge-800" role="status" data-testid="suggestions-accepted">
          {accepted}
        </p>
      )}
      {note && (
        <p className="text-xs text-gauge-700" data-testid="suggestion-note">
          {note} Suggestions are dashed until accepted and are never saved on their own.
        </p>
      )}
      {ghosts.length > 0 && (
        <ul className="flex flex-wrap gap-2" aria-label="Suggested shapes">
          {ghosts.slice(0, SHOWN).map((ghost) => (
            <li key={ghost.id} className="flex items-center gap-1 rounded-md border border-gauge-200 px-2 py-1 text-xs" data-testid="suggestion-item" data-learned={isLearned(ghost) || undefined}>
              <span>{ghost.label}</span>
              <button type="button" className="rounded px-1.5 py-0.5 font-medium text-gauge-800 hover:bg-gauge-100" onClick={() => accept([ghost])} aria-label={`Accept ${ghost.label}`}>
                Accept
              </button>
              <button type="button" className="rounded px-1.5 py-0.5 text-gauge-700 hover:bg-gauge-100" onClick={() => dismiss([ghost])} aria-label={`Dismiss ${ghost.label}`}>
                Dismiss
              </button>
            </li>
          ))}
          {ghosts.length > SHOWN && <li className="self-center text-xs text-gauge-700">and {ghosts.length - SHOWN} more (accept or dismiss all)</li>}
        </ul>
      )}
    </section>
  );
}
