import "server-only";
/**
 * The public verification page's answer (signed out): a certificate found by its QR link's signed
 * token or by its typed short code shows the facts it states and their hash, and nothing else of
 * the workspace. A tampered, unknown or expired token, an unknown code and a revoked certificate
 * each get one plain sentence (public-links.ts), never a hint whether an id exists.
 */
import { findCertificateForVerification } from "@/db/queries/certificates";
import type { StoredCertificateContent } from "@/db/schema";
import { env } from "@/lib/env";
import { judgePublicRecord, refusal, verifyPublicLink } from "@/lib/reports/public-links";
import { parseShortCode } from "@/lib/reports/short-code";
import { MAX_TOKEN_LENGTH } from "@/lib/signing/signed-token";

export type VerificationAnswer = { ok: true; content: StoredCertificateContent; contentHash: string } | { ok: false; reason: "invalid" | "expired" | "revoked"; message: string };

export async function verifyCertificateToken(token: string, now = new Date()): Promise<VerificationAnswer> {
  if (token.length > MAX_TOKEN_LENGTH) return refusal("certificate", "invalid");
  const check = verifyPublicLink("certificate", token, { secret: env().NEXTAUTH_SECRET, now });
  const row = check.ok ? await findCertificateForVerification({ id: check.id }) : null;
  const judged = judgePublicRecord("certificate", check, row ? { revokedAt: row.revokedAt } : null);
  if (!judged.ok) return judged;
  return { ok: true, content: row!.content, contentHash: row!.contentHash };
}

export async function verifyCertificateCode(typed: string): Promise<VerificationAnswer> {
  const code = typed.length <= 40 ? parseShortCode(typed) : null;
  if (!code) return refusal("certificate", "invalid");
  const row = await findCertificateForVerification({ shortCode: code });
  if (!row) return refusal("certificate", "invalid");
  if (row.revokedAt) return refusal("certificate", "revoked");
  return { ok: true, content: row.content, contentHash: row.contentHash };
}
