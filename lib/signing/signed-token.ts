/**
 * Signed, expiring tokens: a base64url JSON payload and its HMAC-SHA-256, "<payload>.<mac>".
 * Pure (the secret and the clock are arguments). Used by the photo upload tickets and by the
 * public links of evidence packs and condition certificates.
 *
 * Decisions:
 * - Each purpose signs with its own key derived from the app secret (HMAC of a fixed label), so a
 *   token made for one purpose never verifies for another, and the app secret itself signs only
 *   sessions.
 * - The MAC covers the payload text exactly as sent, and the MAC text is compared as a whole
 *   (constant time): a re-encoded payload or a non-canonical base64url MAC is refused too.
 * - The payload carries `v` (format version) and `exp` (seconds since the epoch); a token is
 *   expired from its `exp` second on. Claims are checked with the caller's zod schema after the
 *   MAC, so a forged payload is never parsed further than JSON.
 * - Refusals are one of three plain reasons; callers turn them into words for people.
 */
import { createHmac, timingSafeEqual } from "node:crypto";
import type { z } from "zod";

/** Longer tokens are refused before any work (a link or a form field never needs more). */
export const MAX_TOKEN_LENGTH = 4096;

export type TokenRefusal = "malformed" | "signature" | "expired";
export type TokenCheck<T> = { ok: true; claims: T; expiresAt: Date } | { ok: false; reason: TokenRefusal };

const purposeKey = (secret: string, purpose: string) => createHmac("sha256", secret).update(`partproof ${purpose} v1`).digest();
const mac = (key: Buffer, body: string) => createHmac("sha256", key).update(body).digest("base64url");

/** Signs `claims` (a JSON object without `v`/`exp`) for `purpose` until `expiresAt`. */
export function signToken(purpose: string, claims: Record<string, unknown>, { secret, expiresAt }: { secret: string; expiresAt: Date }): string {
  if ("v" in claims || "exp" in claims) throw new Error("Claims may not use the reserved names v and exp");
  const exp = Math.floor(expiresAt.getTime() / 1000);
  if (!Number.isFinite(exp)) throw new Error("A token needs a valid expiry date");
  const body = Buffer.from(JSON.stringify({ v: 1, ...claims, exp })).toString("base64url");
  return `${body}.${mac(purposeKey(secret, purpose), body)}`;
}

/** Checks the MAC, the expiry and then the claims against `schema` (which sees the claims without `v`/`exp`). */
export function verifyToken<T>(purpose: string, token: string, schema: z.ZodType<T>, { secret, now }: { secret: string; now: Date }): TokenCheck<T> {
  if (typeof token !== "string" || token.length > MAX_TOKEN_LENGTH) return { ok: false, reason: "malformed" };
  const parts = token.split(".");
  if (parts.length !== 2 || !parts[0] || !parts[1]) return { ok: false, reason: "malformed" };
  const [body, signature] = parts;
  const expected = Buffer.from(mac(purposeKey(secret, purpose), body));
  const given = Buffer.from(signature);
  if (expected.length !== given.length || !timingSafeEqual(expected, given)) return { ok: false, reason: "signature" };

  let decoded: unknown;
  try {
    decoded = JSON.parse(Buffer.from(body, "base64url").toString("utf8"));
  } catch {
    return { ok: false, reason: "malformed" };
  }
  if (typeof decoded !== "object" || decoded === null || Array.isArray(decoded)) return { ok: false, reason: "malformed" };
  const { v, exp, ...claims } = decoded as Record<string, unknown>;
  if (v !== 1 || typeof exp !== "number" || !Number.isInteger(exp)) return { ok: false, reason: "malformed" };
  if (exp * 1000 <= now.getTime()) return { ok: false, reason: "expired" };
  const parsed = schema.safeParse(claims);
  if (!parsed.success) return { ok: false, reason: "malformed" };
  return { ok: true, claims: parsed.data, expiresAt: new Date(exp * 1000) };
}
