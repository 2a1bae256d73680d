/**
 * Photo intake settings, from the environment with defaults that suit a desk of a few benches.
 * Validated once, so a typo fails at start-up rather than in the middle of an upload.
 */
import { z } from "zod";

const int = (fallback: number, min: number) => z.coerce.number().int().min(min).default(fallback);

const schema = z
  .object({
    /** How long the browser's presigned PUT URL stays valid. */
    PHOTO_UPLOAD_URL_MINUTES: int(15, 1),
    /** Upload intents (presigned URLs) one person may ask for per minute. */
    PHOTO_UPLOAD_INTENTS_PER_MINUTE: int(60, 1),
    /** How long finalise accepts an upload ticket (covers a slow upload plus retries during an outage). */
    PHOTO_TICKET_HOURS: int(2, 1),
    /** Objects with no row are deleted by the sweep once they are older than this. */
    PHOTO_ORPHAN_GRACE_HOURS: int(24, 1),
    /** Failure notices of refused files (whose bytes are already gone) are removed after this. */
    PHOTO_FAILED_RETENTION_HOURS: int(24, 0),
    /** A photo queued or processing this long without any progress lost its job (e.g. a worker crash): marked failed, Retry offered. */
    PHOTO_STALLED_HOURS: int(3, 1),
    /** How long finalise waits for the worker's verdict before answering 202 "still processing". */
    PHOTO_FINALISE_WAIT_MS: int(20_000, 0),
    /** Photos the worker processes at the same time. */
    PHOTO_WORKER_CONCURRENCY: int(2, 1),
    /** Processing retries after the first attempt, and the base delay of the exponential backoff. */
    PHOTO_JOB_RETRY_LIMIT: int(10, 0),
    PHOTO_JOB_RETRY_DELAY_SECONDS: int(5, 1),
    /**
     * A photo job still running after this long is taken for lost (its worker died) and retried.
     * A 40 MB, 50 MP photo takes seconds, so five minutes means the worker is gone.
     */
    PHOTO_JOB_EXPIRE_SECONDS: int(300, 5),
    /** When the orphan sweep runs (cron, UTC). */
    PHOTO_SWEEP_CRON: z.string().default("17 * * * *"),
  })
  .refine((s) => s.PHOTO_ORPHAN_GRACE_HOURS > s.PHOTO_TICKET_HOURS, {
    // A staging object younger than a ticket's life may still be finalised; it must not be swept.
    message: "PHOTO_ORPHAN_GRACE_HOURS must be longer than PHOTO_TICKET_HOURS",
  });

export type PhotoSettings = z.infer<typeof schema>;

let cached: PhotoSettings | undefined;

export function photoSettings(): PhotoSettings {
  if (cached) return cached;
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".") || "photo settings"}: ${i.message}`);
    throw new Error(`Photo settings are invalid:\n${lines.join("\n")}`);
  }
  cached = parsed.data;
  return cached;
}
