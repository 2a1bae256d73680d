/**
 * Keyset cursors for the queue: the sort key of a page's last row (for the page after it) or first
 * row (for the page before it), base64url JSON. The sort
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

/**
 * The key a cursor holds, or null when it is not one of ours. Decoded with atob (the key is ASCII)
 * so the browser reads a Queue link's cursor exactly as the server does.
 */
export function readCursor(cursor: string): QueueKey | null {
  try {
    const base64 = cursor.replace(/-/g, "+").replace(/_/g, "/");
    const parsed = keySchema.safeParse(JSON.parse(atob(base64 + "=".repeat((4 - (base64.length % 4)) % 4))));
    return parsed.success ? parsed.data : null;
  } catch {
    return null;
  }
}

export function decodeCursor(cursor: string): QueueKey {
  const key = readCursor(cursor);
  if (!key) throw new AppError("bad_request", "The page cursor is not valid; start again from the first page.");
  return key;
}
