/** Reads messages the local test inbox received (the .eml files smtp-server stored). */
import fs from "node:fs";
import path from "node:path";
import { simpleParser } from "mailparser";

const inboxDir = () => {
  const dir = process.env.MAIL_INBOX_DIR;
  if (!dir) throw new Error("MAIL_INBOX_DIR is not set; run the tests through `npm test`.");
  return dir;
};

export async function messagesTo(address: string) {
  const dir = inboxDir();
  if (!fs.existsSync(dir)) return [];
  const found = [];
  for (const file of fs.readdirSync(dir)) {
    const full = path.join(dir, file);
    const parsed = await simpleParser(fs.readFileSync(full));
    const to = Array.isArray(parsed.to) ? parsed.to.map((t) => t.text).join(",") : (parsed.to?.text ?? "");
    // The Date header has one-second resolution; the file's write time orders messages sent in the same second.
    if (to.toLowerCase().includes(address.toLowerCase())) found.push({ subject: parsed.subject ?? "", text: parsed.text ?? "", receivedMs: fs.statSync(full).mtimeMs });
  }
  return found.sort((a, b) => a.receivedMs - b.receivedMs);
}

/** The set-password link in the newest message to the address (waits briefly for delivery). */
export async function latestLinkTo(address: string, timeoutMs = 5000): Promise<string> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const messages = await messagesTo(address);
    const last = messages.at(-1);
    const match = last?.text.match(/https?:\/\/\S+\/set-password\?token=[A-Za-z0-9_%-]+/);
    if (match) return match[0];
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`No set-password link reached ${address}`);
}

export function tokenFromLink(link: string): string {
  return new URL(link).searchParams.get("token") ?? "";
}

/** Waits until at least `count` messages reached the address; returns the newest link. */
export async function linkInMessage(address: string, count: number, timeoutMs = 5000): Promise<string> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const messages = await messagesTo(address);
    if (messages.length >= count) {
      const match = messages[messages.length - 1].text.match(/https?:\/\/\S+\/set-password\?token=[A-Za-z0-9_%-]+/);
      if (match) return match[0];
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`Fewer than ${count} messages with a link reached ${address}`);
}
