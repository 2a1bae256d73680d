import "server-only";
/**
 * The "measure-unit" queue: measuring a unit in the background when it does not finish within
 * the request's time budget (app/api/units/[id]/measure). The job measures under the latest
 * published rubric at the time it runs and stores the result with the regions versions it read,
 * so a result that arrives after the regions changed is stale and never shown as current.
 *
 * Wiring: the worker (lib/jobs/worker.ts) calls `boss.createQueue(MEASURE_UNIT_QUEUE,
 * measureUnitQueueOptions)` and `boss.work(MEASURE_UNIT_QUEUE, handleMeasureUnitJobs)`.
 */
import type PgBoss from "pg-boss";
import { notifyJobs } from "@/db/jobs";
import { AppError } from "@/lib/errors";
import { DeadlineExceeded } from "@/lib/imaging/deadline";
import { MEASURE_JOB_BUDGET_MS } from "@/lib/grading/schemas";
import { measureAndStore } from "@/lib/grading/unit-grading";
import { JOB_NOTIFY_CHANNEL } from "./queues";
import { queueSender } from "./send-only";

export const MEASURE_UNIT_QUEUE = "measure-unit";

export type MeasureUnitJob = { workspaceId: string; unitId: string; requestedBy: string | null };

/** "stately" + the unit id as singleton key: at most one waiting and one running job per unit. */
export const measureUnitQueueOptions: PgBoss.Queue = {
  name: MEASURE_UNIT_QUEUE,
  policy: "stately",
  retryLimit: 2,
  retryDelay: 5,
  retryBackoff: true,
  // A worker that died mid-measurement: its job is retried after this (MEASURE_JOB_EXPIRE_SECONDS).
  expireInSeconds: Number(process.env.MEASURE_JOB_EXPIRE_SECONDS ?? 600) || 600,
  retentionMinutes: 24 * 60,
};

/** What a finished job tells the Bench: nothing when measured, else the sentence why not. */
export type MeasureUnitOutput = { notMeasured: string } | undefined;

/**
 * Worker side. A unit that cannot be measured (no photos, no published rubric, photos still
 * processing, regions beyond the measuring limits: AppError) or whose measuring ran past its
 * time budget completes the job without retrying — the same input would fail the same way — and
 * the job's output says why (GET …/measure?jobId= shows it); any other error is thrown so
 * pg-boss retries.
 */
export async function handleMeasureUnitJobs(jobs: PgBoss.Job<MeasureUnitJob>[]): Promise<MeasureUnitOutput> {
  let output: MeasureUnitOutput;
  for (const job of jobs) {
    const { workspaceId, unitId, requestedBy } = job.data;
    try {
      await measureAndStore({ id: requestedBy, workspaceId }, unitId);
    } catch (err) {
      const reason =
        err instanceof DeadlineExceeded
          ? `Measuring took longer than ${MEASURE_JOB_BUDGET_MS / 1000} s and was stopped; nothing was stored. Use fewer or simpler regions.`
          : err instanceof AppError
            ? err.message
            : null;
      if (reason === null) throw err;
      console.warn(`measure-unit job ${job.id}: unit ${unitId} was not measured: ${reason}`);
      output = { notMeasured: reason };
    }
  }
  return output;
}

/** A send-only pg-boss on the app's pool (no maintenance or schedules in the web process). */
const sender = () => queueSender(measureUnitQueueOptions);

/** Queues a measurement; null when one for this unit is already waiting (the stately policy). */
export async function enqueueMeasureUnit(job: MeasureUnitJob): Promise<{ jobId: string | null }> {
  const boss = await sender();
  const jobId = await boss.send(MEASURE_UNIT_QUEUE, job, { singletonKey: job.unitId });
  if (jobId) await notifyJobs(JOB_NOTIFY_CHANNEL, MEASURE_UNIT_QUEUE);
  return { jobId };
}

/** The state of a queued measurement (with why it was not measured, if so), or null when pg-boss does not know the id. */
export async function measureJobState(jobId: string): Promise<{ id: string; state: string; data: MeasureUnitJob; notMeasured: string | null } | null> {
  const boss = await sender();
  const job = await boss.getJobById<MeasureUnitJob>(MEASURE_UNIT_QUEUE, jobId, { includeArchive: true });
  if (!job) return null;
  const output = job.output as { notMeasured?: unknown } | null | undefined;
  return { id: job.id, state: job.state, data: job.data, notMeasured: typeof output?.notMeasured === "string" ? output.notMeasured : null };
}
