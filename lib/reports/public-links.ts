/**
 * The two public, signed-out pages: an evidence pack's link (sent to a supplier when the
 * attachments are too large for an e-mail) and a condition certificate's verification page (the
 * QR code on the certificate). Each URL carries a signed token naming the pack or certificate by
 * id; the page shows that one record and nothing else of the workspace.
 *
 * Decisions:
 * - A token is signed per purpose (an evidence token never opens a certificate page) and expires
 *   (the caller chooses when: days for evidence links, years for certificates).
 * - Revocation is by id: the record's `revokedAt` (read by the caller) refuses every token for it.
 * - Every refusal answers a plain sentence; a tampered, unknown or wrong-purpose token reads the
 *   same, so the page never says whether an id exists.
 */
import { z } from "zod";
import { signToken, verifyToken } from "@/lib/signing/signed-token";

export type PublicLinkPurpose = "evidence-pack" | "certificate";

const claimsSchema = z.object({ id: z.uuid() }).strict();

export function signPublicLink(purpose: PublicLinkPurpose, id: string, { secret, expiresAt }: { secret: string; expiresAt: Date }): string {
  claimsSchema.parse({ id });
  return signToken(`public ${purpose} link`, { id }, { secret, expiresAt });
}

export type PublicLinkRefusal = "invalid" | "expired" | "revoked";
export type PublicLinkCheck = { ok: true; id: string; expiresAt: Date } | { ok: false; reason: PublicLinkRefusal; message: string };

const MESSAGES: Record<PublicLinkPurpose, Record<PublicLinkRefusal, string>> = {
  "evidence-pack": {
    invalid: "This evidence link is not valid. Check that the whole link was copied, or ask the sender for a new one.",
    expired: "This evidence link has expired. Ask the sender for a new one.",
    revoked: "This evidence link was withdrawn by the sender.",
  },
  certificate: {
    invalid: "This certificate code is not valid. Check the code, or scan the QR code on the certificate again.",
    expired: "This certificate's verification link has expired. Ask the seller for a current certificate.",
    revoked: "This certificate was revoked by its issuer and no longer vouches for the part's condition.",
  },
};

export const refusal = (purpose: PublicLinkPurpose, reason: PublicLinkRefusal) => ({ ok: false as const, reason, message: MESSAGES[purpose][reason] });

/** Checks the token alone (signature, purpose, expiry). The caller then looks the id up and calls `judgePublicRecord`. */
export function verifyPublicLink(purpose: PublicLinkPurpose, token: string, { secret, now }: { secret: string; now: Date }): PublicLinkCheck {
  const check = verifyToken(`public ${purpose} link`, token, claimsSchema, { secret, now });
  if (check.ok) return { ok: true, id: check.claims.id, expiresAt: check.expiresAt };
  return refusal(purpose, check.reason === "expired" ? "expired" : "invalid");
}

/** The final answer once the record was read: a missing record reads like a bad token; a revoked one says so. */
export function judgePublicRecord(purpose: PublicLinkPurpose, check: PublicLinkCheck, record: { revokedAt: Date | null } | null): PublicLinkCheck {
  if (!check.ok) return check;
  if (!record) return refusal(purpose, "invalid");
  if (record.revokedAt) return refusal(purpose, "revoked");
  return check;
}
