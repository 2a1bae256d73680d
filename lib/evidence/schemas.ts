import { z } from "zod";
import { CLAIM_STATUSES } from "./claim-status";
import { EVIDENCE_BODY_MAX, EVIDENCE_SUBJECT_MAX, templateProblemMessage } from "./template";

export const CLAIM_NOTE_MAX = 1000;
export const CLAIM_REFERENCE_MAX = 40;

/** What the lead edits before previewing or sending: the subject and body templates, and an optional claim/RMA reference. */
export const evidenceDraftSchema = z
  .object({
    subject: z
      .string({ error: "Write a subject." })
      .trim()
      .min(1, "Write a subject.")
      .max(EVIDENCE_SUBJECT_MAX, `Keep the subject under ${EVIDENCE_SUBJECT_MAX} characters.`)
      .superRefine((v, ctx) => {
        const problem = templateProblemMessage("subject", v);
        if (problem) ctx.addIssue({ code: "custom", message: problem });
      }),
    body: z
      .string({ error: "Write the message." })
      .trim()
      .min(1, "Write the message.")
      .max(EVIDENCE_BODY_MAX, `Keep the message under ${EVIDENCE_BODY_MAX} characters; the attachments carry the detail.`)
      .superRefine((v, ctx) => {
        const problem = templateProblemMessage("body", v);
        if (problem) ctx.addIssue({ code: "custom", message: problem });
      }),
    /** Empty or missing: the app numbers the claim (CLM-<year>-<n>). */
    claimRef: z
      .string()
      .trim()
      .max(CLAIM_REFERENCE_MAX, `Keep the claim reference under ${CLAIM_REFERENCE_MAX} characters.`)
      .regex(/^[A-Za-z0-9][A-Za-z0-9 ._/-]*$|^$/, "A claim reference uses letters, digits, spaces and . _ / - only.")
      .optional(),
  })
  .strict();
export type EvidenceDraft = z.infer<typeof evidenceDraftSchema>;

/** A lead moves a claim to a status, with a note; `version` is the one the form was read at. */
export const claimUpdateSchema = z
  .object({
    status: z.enum(CLAIM_STATUSES, { error: `Choose a claim status: ${CLAIM_STATUSES.join(", ")}.` }),
    note: z.string().trim().max(CLAIM_NOTE_MAX, `Keep the note under ${CLAIM_NOTE_MAX} characters.`).default(""),
    version: z.number({ error: "Send the claim's version as read." }).int().positive(),
  })
  .strict();
