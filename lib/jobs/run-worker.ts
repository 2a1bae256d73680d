import "server-only";
/**
 * What the worker process runs: pg-boss workers for photo processing (several at once, each
 * with retries and exponential backoff from the queue options), mail the server did not take at
 * once, and the scheduled orphan sweep and account-record pruning.
 * A NOTIFY from finalise wakes the photo workers at once; polling every two seconds is the
 * fallback when the notification is missed.
 */
import PgBoss from "pg-boss";
import { z } from "zod";
import { closeDb } from "@/db/client";
import { listenForJobs } from "@/db/jobs";
import { configureSharpForWorker } from "@/lib/imaging/normalize";
import { photoSettings } from "@/lib/photos/config";
import { processPhoto } from "@/lib/photos/process";
import { sweepOrphans } from "@/lib/photos/sweep";
import { ObjectStoreUnavailableError } from "@/lib/storage/s3";
import { handleMeasureUnitJobs, MEASURE_UNIT_QUEUE, measureUnitQueueOptions, type MeasureUnitJob } from "./measure-unit";
import { retryQueuedMail, type MailDeliveryJob } from "@/lib/mail/deliver";
import { pruneAccountRecords } from "@/lib/rate-limit/prune";
import {
  handleSuggestionTrainingJobs,
  queueDueTrainings,
  SUGGESTION_CHECK_CRON,
  SUGGESTION_CHECK_QUEUE,
  SUGGESTION_TRAINING_QUEUE,
  suggestionCheckQueueOptions,
  suggestionTrainingQueueOptions,
  type SuggestionTrainingJob,
} from "./suggestion-training";
import { ensureQueues, JOB_NOTIFY_CHANNEL, MAIL_SEND_QUEUE, maintenanceIntervalSeconds, PHOTO_PROCESS_QUEUE, PHOTO_SWEEP_QUEUE, PRUNE_QUEUE, type PhotoProcessJob } from "./queues";

const jobDataSchema = z.object({ photoId: z.uuid() });

async function handlePhotoJob([job]: PgBoss.JobWithMetadata<PhotoProcessJob>[]) {
  const { photoId } = jobDataSchema.parse(job.data);
  const started = performance.now();
  const isLastAttempt = job.retryCount >= job.retryLimit;
  try {
    const outcome = await processPhoto(photoId, { isLastAttempt });
    console.log(`photo ${photoId}: ${outcome} in ${(performance.now() - started).toFixed(0)} ms (attempt ${job.retryCount + 1})`);
    return { outcome };
  } catch (err) {
    const next = isLastAttempt ? "no retries left" : `retry ${job.retryCount + 1} of ${job.retryLimit} follows`;
    const cause =
      err instanceof ObjectStoreUnavailableError ? `photo store unreachable (${(err.cause as Error | undefined)?.message ?? "no answer"})` : err instanceof Error ? err.message : String(err);
    console.error(`photo ${photoId}: attempt ${job.retryCount + 1} failed (${next}): ${cause}`);
    throw err;
  }
}

async function handleMailJob([job]: PgBoss.JobWithMetadata<MailDeliveryJob>[]) {
  const outcome = await retryQueuedMail(job.data, { isLastAttempt: job.retryCount >= job.retryLimit });
  console.log(`mail ${job.data.emailId}: ${outcome} (attempt ${job.retryCount + 1})`);
}

async function handlePrune() {
  const report = await pruneAccountRecords();
  console.log(
    `account records pruned: ${report.rateLimitCounters} rate-limit counters, ${report.revokedSessions} revoked sessions, ${report.authTokens} tokens, ${report.signUpRequests} sign-up requests`,
  );
  return report;
}

async function handleSweep() {
  const report = await sweepOrphans();
  console.log(
    `orphan sweep: ${report.scanned} objects scanned, ${report.deleted.length} deleted, ${report.blocked.length} kept by the deletion gate, ${report.noticesRemoved} old failure notices removed, ${report.stalledMarked} stalled photos marked failed`,
  );
  return { deleted: report.deleted.length, blocked: report.blocked.length, noticesRemoved: report.noticesRemoved, stalledMarked: report.stalledMarked };
}

export async function runWorker(): Promise<void> {
  const connectionString = process.env.DATABASE_URL;
  if (!connectionString) throw new Error("DATABASE_URL is not set; start the worker with `npm start` or see .env.example.");
  const settings = photoSettings();
  configureSharpForWorker();

  const boss = new PgBoss({ connectionString, max: 4, application_name: "partproof-worker", maintenanceIntervalSeconds: maintenanceIntervalSeconds() });
  boss.on("error", (err) => console.error("pg-boss error:", err.message));
  await boss.start();
  await ensureQueues(boss, { apply: true });

  const photoWorkers: string[] = [];
  for (let i = 0; i < settings.PHOTO_WORKER_CONCURRENCY; i++) {
    photoWorkers.push(await boss.work<PhotoProcessJob>(PHOTO_PROCESS_QUEUE, { includeMetadata: true, batchSize: 1, pollingIntervalSeconds: 2 }, handlePhotoJob));
  }
  await boss.work(PHOTO_SWEEP_QUEUE, { pollingIntervalSeconds: 30 }, handleSweep);
  // Measurements the Bench could not finish inside its request (lib/grading, lib/jobs/measure-unit.ts).
  await boss.createQueue(MEASURE_UNIT_QUEUE, measureUnitQueueOptions);
  await boss.updateQueue(MEASURE_UNIT_QUEUE, measureUnitQueueOptions);
  const measureWorker = await boss.work<MeasureUnitJob>(MEASURE_UNIT_QUEUE, { batchSize: 1, pollingIntervalSeconds: 2 }, handleMeasureUnitJobs);
  // Learned-suggestion training (lib/jobs/suggestion-training.ts): one job at a time in this process.
  for (const options of [suggestionTrainingQueueOptions, suggestionCheckQueueOptions]) {
    await boss.createQueue(options.name, options);
    await boss.updateQueue(options.name, options);
  }
  const trainingWorker = await boss.work<SuggestionTrainingJob>(SUGGESTION_TRAINING_QUEUE, { batchSize: 1, pollingIntervalSeconds: 5 }, handleSuggestionTrainingJobs);
  await boss.work(SUGGESTION_CHECK_QUEUE, { pollingIntervalSeconds: 30 }, () => queueDueTrainings(boss));
  await boss.schedule(SUGGESTION_CHECK_QUEUE, SUGGESTION_CHECK_CRON, {}, { tz: "UTC" });
  await boss.schedule(PHOTO_SWEEP_QUEUE, settings.PHOTO_SWEEP_CRON, {}, { tz: "UTC" });
  await boss.work<MailDeliveryJob>(MAIL_SEND_QUEUE, { includeMetadata: true, batchSize: 1, pollingIntervalSeconds: 2 }, handleMailJob);
  await boss.work(PRUNE_QUEUE, { pollingIntervalSeconds: 30 }, handlePrune);
  await boss.schedule(PRUNE_QUEUE, "41 * * * *", {}, { tz: "UTC" });
  const stopListening = listenForJobs(connectionString, JOB_NOTIFY_CHANNEL, (queue) => {
    if (queue === PHOTO_PROCESS_QUEUE) photoWorkers.forEach((id) => boss.notifyWorker(id));
    if (queue === MEASURE_UNIT_QUEUE) boss.notifyWorker(measureWorker);
    if (queue === SUGGESTION_TRAINING_QUEUE) boss.notifyWorker(trainingWorker);
  });

  console.log(
    `Worker ready: ${photoWorkers.length} photo workers, 1 measurement worker, 1 suggestion-training worker (check "${SUGGESTION_CHECK_CRON}"), up to ${settings.PHOTO_JOB_RETRY_LIMIT} retries with backoff from ${settings.PHOTO_JOB_RETRY_DELAY_SECONDS} s, orphan sweep "${settings.PHOTO_SWEEP_CRON}" (UTC), MALLOC_ARENA_MAX=${process.env.MALLOC_ARENA_MAX ?? "unset"}.`,
  );

  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    // Graceful: jobs in hand finish (or fail back to the queue) before the process ends.
    await boss.stop({ graceful: true, wait: true, timeout: 20_000 }).catch((err) => console.error("pg-boss stop:", err));
    await stopListening();
    await closeDb();
    process.exit(0);
  };
  process.on("SIGTERM", () => void stop());
  process.on("SIGINT", () => void stop());
}
