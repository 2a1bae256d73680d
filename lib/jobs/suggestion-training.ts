import "server-only";
/**
 * The "suggestion-training" queue: training a workspace's learned-suggestion model in the job
 * worker (never in the web process; the CPU work runs in the worker's compute thread).
 * - "stately" with the workspace id as singleton key: per workspace at most one training runs
 *   and one waits; asking again while one waits changes nothing.
 * - Started on demand by a trainer (POST /api/suggestion-models) and by the check below, which
 *   the worker runs on SUGGESTION_CHECK_CRON, for every workspace `trainingDue` (training-set.ts).
 */
import type PgBoss from "pg-boss";
import { notifyJobs } from "@/db/jobs";
import { acceptedRegionTotals } from "@/db/queries/suggestions";
import { trainWorkspaceModel, type TrainingOutcome } from "@/lib/suggestions/training";
import { ACCEPTED_UNIT_STATUSES, trainingDue } from "@/lib/suggestions/training-set";
import { JOB_NOTIFY_CHANNEL } from "./queues";
import { queueSender } from "./send-only";

export const SUGGESTION_TRAINING_QUEUE = "suggestion-training";
export const SUGGESTION_CHECK_QUEUE = "suggestion-training-check";
export const SUGGESTION_CHECK_CRON = process.env.SUGGESTION_CHECK_CRON ?? "*/15 * * * *";

export type SuggestionTrainingJob = { workspaceId: string; requestedBy: string | null };

export const suggestionTrainingQueueOptions: PgBoss.Queue = {
  name: SUGGESTION_TRAINING_QUEUE,
  policy: "stately",
  // A failure that is not about the data (store down, worker stopped) is tried once more.
  retryLimit: 1,
  retryDelay: 60,
  expireInSeconds: 30 * 60,
  retentionMinutes: 7 * 24 * 60,
};
export const suggestionCheckQueueOptions: PgBoss.Queue = { name: SUGGESTION_CHECK_QUEUE, policy: "singleton", retryLimit: 0, expireInSeconds: 300 };

export async function handleSuggestionTrainingJobs(jobs: PgBoss.Job<SuggestionTrainingJob>[]): Promise<TrainingOutcome | undefined> {
  let outcome: TrainingOutcome | undefined;
  for (const job of jobs) {
    const started = performance.now();
    outcome = await trainWorkspaceModel(job.data.workspaceId, job.data.requestedBy);
    const took = `${((performance.now() - started) / 1000).toFixed(1)} s`;
    console.log(
      `suggestion-training ${job.id} (workspace ${job.data.workspaceId}, ${took}): ${outcome.trained ? `version ${outcome.version}, ${outcome.decision}` : `not trained: ${outcome.reason}`}`,
    );
  }
  return outcome;
}

const sender = () => queueSender(suggestionTrainingQueueOptions);

/** Queues a training; jobId null when one for this workspace is already waiting. */
export async function enqueueSuggestionTraining(job: SuggestionTrainingJob, boss?: PgBoss): Promise<{ jobId: string | null }> {
  const jobId = await (boss ?? (await sender())).send(SUGGESTION_TRAINING_QUEUE, job, { singletonKey: job.workspaceId });
  if (jobId) await notifyJobs(JOB_NOTIFY_CHANNEL, SUGGESTION_TRAINING_QUEUE);
  return { jobId };
}

/** The worker's scheduled check: queues a training for every workspace that is due. */
export async function queueDueTrainings(boss: PgBoss): Promise<{ queued: number }> {
  let queued = 0;
  for (const { workspaceId, accepted, lastTrainedOn } of await acceptedRegionTotals(ACCEPTED_UNIT_STATUSES)) {
    if (!trainingDue(accepted, lastTrainedOn)) continue;
    const { jobId } = await enqueueSuggestionTraining({ workspaceId, requestedBy: null }, boss);
    if (jobId) queued++;
  }
  return { queued };
}

/** A queued training's state and outcome, or null when pg-boss does not know the id. */
export async function suggestionTrainingState(jobId: string) {
  const boss = await sender();
  const job = await boss.getJobById<SuggestionTrainingJob>(SUGGESTION_TRAINING_QUEUE, jobId, { includeArchive: true });
  if (!job) return null;
  return { id: job.id, state: job.state, data: job.data, outcome: (job.output ?? null) as TrainingOutcome | null };
}
