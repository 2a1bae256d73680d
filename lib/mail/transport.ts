import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { env } from "@/lib/env";

const cache = globalThis as unknown as { __partproofMail?: Transporter };

/** One nodemailer transport, configured by SMTP_* variables (the local inbox by default). */
export function mailTransport(): Transporter {
  if (!cache.__partproofMail) {
    const e = env();
    cache.__partproofMail = nodemailer.createTransport({
      host: e.SMTP_HOST,
      port: e.SMTP_PORT,
      secure: e.SMTP_SECURE,
      // The local inbox speaks plain SMTP on loopback; a real server negotiates TLS as usual.
      ignoreTLS: Boolean(e.MAIL_INBOX_DIR),
      auth: e.SMTP_USER ? { user: e.SMTP_USER, pass: e.SMTP_PASS ?? "" } : undefined,
      connectionTimeout: 10_000,
      greetingTimeout: 10_000,
    });
  }
  return cache.__partproofMail;
}
