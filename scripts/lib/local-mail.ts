/**
 * A local SMTP inbox: accepts every message on 127.0.0.1 and stores it as an .eml file named
 * after its Message-ID, so the Outbox page can show exactly what was delivered.
 */
import crypto from "node:crypto";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { SMTPServer } from "smtp-server";
import { inboxFileName } from "../../lib/mail/inbox-file";
import { isPortFree, portTakenMessage } from "./ports";

export const INBOX_BANNER = "Partproof local inbox";

function messageIdOf(raw: Buffer): string | null {
  const head = raw
    .subarray(0, Math.min(raw.length, 64 * 1024))
    .toString("utf8")
    .split(/\r?\n\r?\n/)[0];
  const match = head.match(/^message-id:\s*(.+)$/im);
  return match ? match[1].trim() : null;
}

export function looksLikeInbox(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ host: "127.0.0.1", port });
    socket.setTimeout(1500);
    socket.once("data", (d) => {
      resolve(d.toString().includes(INBOX_BANNER));
      socket.end("QUIT\r\n");
    });
    socket.once("error", () => resolve(false));
    socket.once("timeout", () => {
      socket.destroy();
      resolve(false);
    });
  });
}

export type LocalMailHandle = { close: () => Promise<void>; reused: boolean };

export async function startLocalMail(opts: { port: number; inboxDir: string }, portEnvVar = "LOCAL_SMTP_PORT"): Promise<LocalMailHandle> {
  if (!(await isPortFree(opts.port))) {
    if (await looksLikeInbox(opts.port)) return { reused: true, close: async () => {} };
    throw new Error(portTakenMessage(opts.port, "the local mail inbox", portEnvVar));
  }
  fs.mkdirSync(opts.inboxDir, { recursive: true });
  const server = new SMTPServer({
    banner: INBOX_BANNER,
    authOptional: true,
    // smtp-server's bundled certificate has expired; the inbox is loopback-only plain SMTP.
    disabledCommands: ["STARTTLS", "AUTH"],
    size: 30 * 1024 * 1024,
    logger: false,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("end", () => {
        const raw = Buffer.concat(chunks);
        const id = messageIdOf(raw) ?? `<no-id-${Date.now()}-${crypto.randomUUID()}>`;
        const file = path.join(opts.inboxDir, inboxFileName(id));
        fs.writeFile(file, raw, (err) => callback(err ?? null));
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port, "127.0.0.1", () => resolve());
  });
  return { reused: false, close: () => new Promise<void>((r) => server.close(() => r())) };
}
