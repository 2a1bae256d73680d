import "server-only";
/**
 * A started pg-boss that only sends (no maintenance, no schedules, no workers) on the app's pool,
 * one per queue and process, making sure its queue exists first (pg-boss 10 silently drops a job
 * sent to a missing queue). The queues of background work the web app asks for use it.
 */
import PgBoss from "pg-boss";
import { jobDbOnPool } from "@/db/jobs";

const cache = globalThis as unknown as { __partproofQueueSenders?: Map<string, Promise<PgBoss>> };

export function queueSender(queue: PgBoss.Queue): Promise<PgBoss> {
  const senders = (cache.__partproofQueueSenders ??= new Map());
  let sender = senders.get(queue.name);
  if (!sender) {
    sender = (async () => {
      const boss = new PgBoss({ db: jobDbOnPool(), supervise: false, schedule: false, migrate: true });
      boss.on("error", (err) => console.error(`pg-boss (${queue.name} sender) error`, err));
      await boss.start();
      await boss.createQueue(queue.name, queue);
      return boss;
    })().catch((err) => {
      senders.delete(queue.name);
      throw err;
    });
    senders.set(queue.name, sender);
  }
  return sender;
}
