/**
 * Upload tickets: what the server promised when it handed out a presigned PUT URL (which unit,
 * which view, which photo id), signed with HMAC-SHA-256 so finalise can trust it without a
 * database row for uploads that may never happen. Pure: the secret and the clock are arguments.
 */
import { createHmac, timingSafeEqual } from "node:crypto";
import { z } from "zod";

const payloadSchema = z
  .object({
    v: z.literal(1),
    workspaceId: z.uuid(),
    unitId: z.uuid(),
    photoId: z.uuid(),
    viewKey: z.string().min(1).max(64),
    fileName: z.string().max(200),
    uploaderId: z.uuid(),
    /** The length the presigned PUT was signed for; finalise refuses anything else. */
    bytes: z.number().int().positive().optional(),
    /** Expiry, seconds since the epoch. */
    exp: z.number().int().positive(),
  })
  .strict();

export type UploadTicket = Omit<z.infer<typeof payloadSchema>, "v" | "exp">;

/** Derived, so the session secret itself never signs anything but sessions. */
const ticketKey = (secret: string) => createHmac("sha256", secret).update("partproof photo upload ticket v1").digest();

const mac = (secret: string, body: string) => createHmac("sha256", ticketKey(secret)).update(body).digest("base64url");

export function signUploadTicket(ticket: UploadTicket, { secret, expiresAt }: { secret: string; expiresAt: Date }): string {
  const payload = { v: 1 as const, ...ticket, exp: Math.floor(expiresAt.getTime() / 1000) };
  const body = Buffer.from(JSON.stringify(payload)).toString("base64url");
  return `${body}.${mac(secret, body)}`;
}

export type TicketCheck = { ok: true; ticket: UploadTicket } | { ok: false; reason: "malformed" | "signature" | "expired" };

export function verifyUploadTicket(token: string, { secret, now }: { secret: string; now: Date }): TicketCheck {
  const parts = token.split(".");
  if (parts.length !== 2 || !parts[0] || !parts[1]) return { ok: false, reason: "malformed" };
  const [body, signature] = parts;
  const expected = Buffer.from(mac(secret, body));
  const given = Buffer.from(signature);
  if (expected.length !== given.length || !timingSafeEqual(expected, given)) return { ok: false, reason: "signature" };
  let decoded: unknown;
  try {
    decoded = JSON.parse(Buffer.from(body, "base64url").toString("utf8"));
  } catch {
    return { ok: false, reason: "malformed" };
  }
  const parsed = payloadSchema.safeParse(decoded);
  if (!parsed.success) return { ok: false, reason: "malformed" };
  if (parsed.data.exp * 1000 <= now.getTime()) return { ok: false, reason: "expired" };
  const { v: _v, exp: _exp, ...ticket } = parsed.data;
  return { ok: true, ticket };
}
