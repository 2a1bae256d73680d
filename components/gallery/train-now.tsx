"use client";

import { useMutation, useQuery } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useEffect, useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { apiFetch } from "@/lib/http/client";
import { suggestionKeys } from "@/lib/query-keys/suggestions";
import type { TrainingJobDto } from "@/lib/suggestions/dto";

const POLL_MS = 3000;
const FINISHED = new Set(["completed", "failed", "cancelled"]);

function outcomeText(job: TrainingJobDto): string {
  if (job.state === "failed" || job.state === "cancelled") return "The training did not finish; the model in use is unchanged. Try again later or tell your QC lead.";
  const outcome = job.outcome;
  if (!outcome) return "The training finished.";
  if (!outcome.trained) return `Nothing was trained: ${outcome.reason}`;
  return `Model ${outcome.version} ${outcome.inUse ? "is now in use" : "was kept aside"}. ${outcome.decision}`;
}

/**
 * "Train now": queues a training in the job worker (POST /api/suggestion-models), then follows it
 * until it ends and refreshes the history. Training runs in the background; leaving the page
 * does not stop it.
 */
export function TrainNow() {
  const router = useRouter();
  const [jobId, setJobId] = useState<string | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const start = useMutation({
    mutationFn: () => apiFetch<{ jobId: string | null; message: string }>("/api/suggestion-models", { body: {} }),
    onSuccess: (res) => {
      setMessage(res.message);
      setJobId(res.jobId);
    },
  });
  const job = useQuery({
    queryKey: suggestionKeys.trainingJob(jobId ?? "none"),
    queryFn: () => apiFetch<TrainingJobDto>(`/api/suggestion-models/jobs/${jobId}`),
    enabled: jobId !== null,
    refetchInterval: (query) => (query.state.data && FINISHED.has(query.state.data.state) ? false : POLL_MS),
  });
  const finished = job.data && FINISHED.has(job.data.state) ? job.data : null;
  useEffect(() => {
    if (finished) router.refresh();
  }, [finished, router]);
  const running = start.isPending || (jobId !== null && !finished && !job.isError);
  return (
    <div className="space-y-2" data-testid="train-now">
      <button type="button" className="btn-primary" onClick={() => start.mutate()} disabled={running} data-testid="train-now-button">
        {running ? "Training…" : "Train now"}
      </button>
      <div aria-live="polite" className="space-y-1 text-sm">
        {start.isError && <FormMessage kind="error">The training could not be started: {start.error.message}</FormMessage>}
        {job.isError && <FormMessage kind="error">The training’s progress could not be read: {job.error.message}</FormMessage>}
        {message && !finished && <p className="text-gauge-700">{message}</p>}
        {finished && (
          <p className="text-gauge-800" role="status" data-testid="train-now-outcome">
            {outcomeText(finished)}
          </p>
        )}
      </div>
    </div>
  );
}
