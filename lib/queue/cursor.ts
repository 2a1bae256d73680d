/**
 * Keyset cursors for the queue: the sort key of the last row of a page, base64url JSON. The sort
 * is lot due date, lot received date, lot creation, lot id, sample order, unit id — unique and
 * total, so pages never skip or repeat a unit.
 */
import { z } from "zod";
import { AppError } from "@/lib/errors";

export type QueueKey = { dueOn: string; receivedOn: string; lotCreatedAt: string; lotId: string; sampleIndex: number; id: string };

const keySchema = z
  .object({
    dueOn: z.iso.date(),
    receivedOn: z.iso.date(),
    lotCreatedAt: z.iso.datetime({ offset: true }),
    lotId: z.uuid(),
    sampleIndex: z.number().int().min(0),
    id: z.uuid(),
  })
  .strict();

export function encodeCursor(key: QueueKey): string {
  return Buffer.from(JSON.stringify(key)).toString("base64url");
}

export function decodeCursor(cursor: string): QueueKey {
  try {
    return keySchema.parse(JSON.parse(Buffer.from(cursor, "base64url").toString("utf8")));
  } catch {
    throw new AppError("bad_request", "The page cursor is not valid; start again from the first page.");
  }
}
