import crypto from "node:crypto";

/** File name under which the local inbox stores a message; the Outbox computes the same name. */
export function inboxFileName(messageId: string): string {
  return crypto.createHash("sha256").update(messageId.trim()).digest("hex").slice(0, 32) + ".eml";
}
