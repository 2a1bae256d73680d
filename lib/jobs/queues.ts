import "server-only";
/**
 * pg-boss 10 on the app's own PostgreSQL (schema "pgboss"). The web app only *sends* jobs, inside
 * the same transaction as the row they are about (so a job never refers to a row that was rolled
 * back, and a committed row always has its job); the worker process (lib/jobs/worker.ts) runs them.
 */
import type PgBoss from "pg-boss";
import { photoSettings } from "@/lib/photos/config";

export const PHOTO_PROCESS_QUEUE = "photo-process";
export const PHOTO_SWEEP_QUEUE = "photo-sweep";
/** Messages the mail server did not take at once (lib/mail/deliver.ts). */
export const MAIL_SEND_QUEUE = "mail-send";
/** Deletes rate-limit events, revoked sessions and spent tokens once they can matter no more. */
export const PRUNE_QUEUE = "auth-prune";
/** NOTIFY channel: the worker wakes at once instead of waiting for its next poll. */
export const JOB_NOTIFY_CHANNEL = "partproof_jobs";

export type PhotoProcessJob = { photoId: string };

/**
 * Queue options, applied on every start (createQueue leaves an existing queue as it was).
 * Backoff in pg-boss 10: the n-th retry waits about retryDelay × 2^n seconds, with jitter.
 */
export function queueOptions(): Record<string, PgBoss.Queue> {
  const s = photoSettings();
  return {
    [PHOTO_PROCESS_QUEUE]: {
      name: PHOTO_PROCESS_QUEUE,
      policy: "standard",
      retryLimit: s.PHOTO_JOB_RETRY_LIMIT,
      retryDelay: s.PHOTO_JOB_RETRY_DELAY_SECONDS,
      retryBackoff: true,
      expireInSeconds: s.PHOTO_JOB_EXPIRE_SECONDS,
      retentionMinutes: 7 * 24 * 60,
    },
    // The sweep is idempotent and runs again on its schedule, so one retry is enough.
    [PHOTO_SWEEP_QUEUE]: { name: PHOTO_SWEEP_QUEUE, policy: "singleton", retryLimit: 1, retryDelay: 60, expireInSeconds: 3600 },
    // About a day of retries with backoff (delay × 2^n): long enough for a mail server's outage.
    [MAIL_SEND_QUEUE]: { name: MAIL_SEND_QUEUE, policy: "standard", retryLimit: 14, retryDelay: mailRetryDelaySeconds(), retryBackoff: true, expireInSeconds: 120, retentionMinutes: 7 * 24 * 60 },
    [PRUNE_QUEUE]: { name: PRUNE_QUEUE, policy: "singleton", retryLimit: 1, retryDelay: 60, expireInSeconds: 600 },
  };
}

function mailRetryDelaySeconds(): number {
  const raw = Number(process.env.MAIL_RETRY_DELAY_SECONDS ?? 10);
  return Number.isInteger(raw) && raw > 0 ? raw : 10;
}

/**
 * Creates missing queues. The worker passes `apply` so its settings win; the web app only makes
 * sure the queue exists (pg-boss 10 silently drops a job sent to a missing queue).
 */
export async function ensureQueues(boss: PgBoss, { apply = false }: { apply?: boolean } = {}): Promise<void> {
  for (const [name, options] of Object.entries(queueOptions())) {
    await boss.createQueue(name, options);
    if (apply) await boss.updateQueue(name, options);
  }
}

/**
 * How often one of the workers (whichever gets there first; pg-boss takes turns through the
 * database) looks for expired jobs of dead workers and puts them back for a retry.
 */
export function maintenanceIntervalSeconds(): number {
  const raw = Number(process.env.JOB_MAINTENANCE_SECONDS ?? 60);
  return Number.isInteger(raw) && raw >= 1 ? raw : 60;
}
