import "server-only";
import fs from "node:fs/promises";
import path from "node:path";
import { simpleParser } from "mailparser";
import { inboxFileName } from "./inbox-file";

export type DeliveredMessage = {
  from: string;
  to: string;
  subject: string;
  date: string | null;
  text: string;
  html: string | null;
  attachments: { filename: string; contentType: string; size: number }[];
  rawSize: number;
};

/** Reads what the local inbox received for a Message-ID, or null when it never arrived. */
export async function readDeliveredMessage(inboxDir: string, messageId: string): Promise<DeliveredMessage | null> {
  let raw: Buffer;
  try {
    raw = await fs.readFile(path.join(inboxDir, inboxFileName(messageId)));
  } catch {
    return null;
  }
  const parsed = await simpleParser(raw);
  const addressText = (a: typeof parsed.to) => (Array.isArray(a) ? a.map((x) => x.text).join(", ") : (a?.text ?? ""));
  return {
    from: parsed.from?.text ?? "",
    to: addressText(parsed.to),
    subject: parsed.subject ?? "",
    date: parsed.date ? parsed.date.toISOString() : null,
    text: parsed.text ?? "",
    html: typeof parsed.html === "string" ? parsed.html : null,
    attachments: parsed.attachments.map((a) => ({ filename: a.filename ?? "attachment", contentType: a.contentType, size: a.size })),
    rawSize: raw.length,
  };
}
