import { z } from "zod";

export const REVOKE_REASON_MAX = 500;

/** Revoking says why (kept with the certificate and in the activity log). */
export const revokeCertificateSchema = z
  .object({
    reason: z
      .string({ error: "Say why the certificate is revoked." })
      .trim()
      .min(3, "Say why the certificate is revoked (a few words at least).")
      .max(REVOKE_REASON_MAX, `Keep the reason under ${REVOKE_REASON_MAX} characters.`),
  })
  .strict();

/** Issuing takes nothing from the request: the certificate states the unit as it stands. */
export const issueCertificateSchema = z.object({}).strict();
