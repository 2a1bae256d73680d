import "server-only";
/**
 * Sending jobs from the web app, inside a database transaction: pg-boss inserts the job through
 * the transaction's own connection, so it commits or rolls back with the row it is about.
 */
import PgBoss from "pg-boss";
import type { Database } from "@/db/client";
import { jobDbOnPool, notifyJobs, transactionWithJobDb, type JobDb } from "@/db/jobs";
import { mailDeliveryJob } from "@/lib/mail/deliver";
import type { OutgoingMessage } from "@/lib/mail/send";
import { ensureQueues, JOB_NOTIFY_CHANNEL, MAIL_SEND_QUEUE, PHOTO_PROCESS_QUEUE, type PhotoProcessJob } from "./queues";

const cache = globalThis as unknown as { __partproofSender?: Promise<PgBoss> };

/** A started pg-boss that only sends: no maintenance, no schedules, no workers in this process. */
function sender(): Promise<PgBoss> {
  cache.__partproofSender ??= (async () => {
    const boss = new PgBoss({ db: jobDbOnPool(), supervise: false, schedule: false, migrate: true });
    boss.on("error", (err) => console.error("pg-boss (sender) error", err));
    await boss.start();
    await ensureQueues(boss);
    return boss;
  })().catch((err) => {
    cache.__partproofSender = undefined;
    throw err;
  });
  return cache.__partproofSender;
}

export type JobSender = {
  sendPhotoProcessing: (photoId: string) => Promise<void>;
  sendMailDelivery: (delivery: { emailId: string; message: OutgoingMessage }) => Promise<void>;
};

function jobSenderOn(db: JobDb, boss: PgBoss): JobSender {
  return {
    async sendPhotoProcessing(photoId) {
      const data: PhotoProcessJob = { photoId };
      const id = await boss.send(PHOTO_PROCESS_QUEUE, data, { db });
      if (!id) throw new Error(`pg-boss did not accept a ${PHOTO_PROCESS_QUEUE} job (does the queue exist?)`);
      await notifyJobs(JOB_NOTIFY_CHANNEL, PHOTO_PROCESS_QUEUE, db);
    },
    async sendMailDelivery(delivery) {
      const id = await boss.send(MAIL_SEND_QUEUE, mailDeliveryJob(delivery), { db });
      if (!id) throw new Error(`pg-boss did not accept a ${MAIL_SEND_QUEUE} job (does the queue exist?)`);
    },
  };
}

/** Runs `work` in one transaction whose jobs are sent through the same connection. */
export async function transactionWithJobs<T>(work: (tx: Database, jobs: JobSender) => Promise<T>): Promise<T> {
  const boss = await sender();
  return transactionWithJobDb((tx, db) => work(tx, jobSenderOn(db, boss)));
}
