/**
 * Sealed values: a JSON value encrypted and authenticated with AES-256-GCM under a key derived
 * from the app secret for one purpose, as "<iv>.<tag>.<ciphertext>" in base64url. Pure (the
 * secret is an argument). For data that must rest in the database for a while but must not be
 * readable there: a queued e-mail carries a one-time sign-in link, which auth_tokens itself only
 * keeps as a hash.
 *
 * Each purpose has its own key (HMAC of a fixed label, as signed tokens do) and the purpose is
 * also the GCM additional data, so a box sealed for one purpose never opens for another.
 */
import { createCipheriv, createDecipheriv, createHmac, randomBytes } from "node:crypto";

const IV_BYTES = 12;
const TAG_BYTES = 16;

const sealKey = (secret: string, purpose: string) => createHmac("sha256", secret).update(`partproof ${purpose} seal v1`).digest();

export function seal(purpose: string, value: unknown, { secret }: { secret: string }): string {
  const iv = randomBytes(IV_BYTES);
  const cipher = createCipheriv("aes-256-gcm", sealKey(secret, purpose), iv);
  cipher.setAAD(Buffer.from(purpose));
  const ciphertext = Buffer.concat([cipher.update(JSON.stringify(value), "utf8"), cipher.final()]);
  return [iv, cipher.getAuthTag(), ciphertext].map((b) => b.toString("base64url")).join(".");
}

/** The sealed value, or null when the box is malformed, altered, or sealed for another purpose or secret. */
export function open<T = unknown>(purpose: string, box: string, { secret }: { secret: string }): T | null {
  const parts = typeof box === "string" ? box.split(".") : [];
  if (parts.length !== 3) return null;
  const [iv, tag, ciphertext] = parts.map((p) => Buffer.from(p, "base64url"));
  if (iv.length !== IV_BYTES || tag.length !== TAG_BYTES) return null;
  try {
    const decipher = createDecipheriv("aes-256-gcm", sealKey(secret, purpose), iv);
    decipher.setAAD(Buffer.from(purpose));
    decipher.setAuthTag(tag);
    return JSON.parse(Buffer.concat([decipher.update(ciphertext), decipher.final()]).toString("utf8")) as T;
  } catch {
    return null;
  }
}
