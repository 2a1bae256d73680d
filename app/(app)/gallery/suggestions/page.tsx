import type { Metadata } from "next";
import Link from "next/link";
import { SuggestionModelCard } from "@/components/gallery/suggestion-model-card";
import { TrainNow } from "@/components/gallery/train-now";
import { EmptyState } from "@/components/ui/empty-state";
import { listPartTypes } from "@/db/queries/part-types";
import { requirePageUser } from "@/lib/auth/require-user";
import { describeRules } from "@/lib/suggestions/model-figures";
import { suggestionModelHistory } from "@/lib/suggestions/models";

export const metadata: Metadata = { title: "Learned suggestions" };

/**
 * The Gallery's Suggestions panel, for trainers: the workspace's learned-suggestion models, newest
 * first, each with what it learned from and its held-out figures per class, the rules that decide
 * what is suggested and which model is in use, and "Train now".
 */
export default async function SuggestionsPage() {
  const user = await requirePageUser({ permission: "suggestions.manage", from: "/gallery/suggestions" });
  const [history, partTypeRows] = await Promise.all([suggestionModelHistory(user.workspaceId), listPartTypes({ workspaceId: user.workspaceId })]);
  // Class labels as the part types name them (the first part type that has the class).
  const labels: Record<string, string> = {};
  for (const d of partTypeRows.flatMap((p) => p.defectClasses)) if (!Object.hasOwn(labels, d.key)) labels[d.key] = d.label;
  return (
    <div className="max-w-5xl space-y-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm">
            <Link href="/gallery" className="font-medium underline">
              Gallery
            </Link>
          </p>
          <h1 className="page-title">Learned suggestions</h1>
          <p className="max-w-2xl text-gauge-700">
            Partproof learns from this workspace’s own accepted regions (graded units and published gallery items) and from suggestions inspectors dismissed, and proposes regions on the Bench. Each
            model is judged on photos it never learned from.
          </p>
        </div>
        <TrainNow />
      </div>
      {history.models.length === 0 ? (
        <EmptyState title="No model trained yet" testId="suggestion-models-empty">
          Grade units and publish gallery items with marked regions; a training starts on its own once there are {history.rules.firstTrainingRegions} accepted regions, or choose “Train now”.
        </EmptyState>
      ) : (
        <section className="space-y-3" aria-label="Model history" data-testid="suggestion-models">
          {history.models.map((model) => (
            <SuggestionModelCard key={model.id} model={model} labels={labels} timeZone={user.timeZone} />
          ))}
        </section>
      )}
      <section className="card space-y-2 p-4 text-sm text-gauge-800" aria-labelledby="suggestion-rules">
        <h2 id="suggestion-rules" className="text-base font-semibold">
          How models are judged
        </h2>
        <ul className="list-disc space-y-1 pl-5">
          {describeRules(history.rules).map((line) => (
            <li key={line}>{line}</li>
          ))}
        </ul>
        <p className="text-gauge-700">Suggestions are decision aids: the inspector accepts, adjusts or dismisses each one, and never sees them in a calibration attempt or a blind recheck.</p>
      </section>
    </div>
  );
}
