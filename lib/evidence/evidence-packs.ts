import "server-only";
/**
 * Evidence packs (issue 17, step 3): a lead prepares the e-mail to a supplier about a decided lot
 * from an editable template, previews it with its attachments, and sends it; sending opens a
 * claim. Decisions:
 * - Only a lot the supplier must hear about: decided and rejected, or decided with a disposition
 *   of return to vendor, sort or downgrade. An open lot, or one accepted to stock, is a 409 and
 *   nothing is stored or sent.
 * - The e-mail always goes through the mail queue (a job in the same transaction as the pack, the
 *   claim and the outgoing_emails row, lib/jobs/send.ts): the worker delivers it and retries with
 *   backoff, so the lead's request never waits on the mail server, and a failure shows with its
 *   reason on the lot, the supplier page and the Outbox.
 * - The files are rendered before the transaction (PDF and photos take a while), then the lot is
 *   locked and checked again, so a lot reopened in between sends nothing. The text is filled in
 *   after them: whether they go attached or by link decides what it says about them.
 * - The claim reference is the lead's, or CLM-<year>-<n> numbered per workspace (one more than the
 *   highest such number, typed ones included); a reference the lead typed that is in use is a
 *   409 (case-insensitive). A numbered one taken by a pack sent at the same moment is numbered
 *   again (up to three tries), since the lead never chose it.
 */
import { randomUUID } from "node:crypto";
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import {
  type EvidencePackRow,
  getClaim,
  insertQueuedEvidenceEmail,
  getLotSupplierContact,
  insertClaim,
  lastClaimNumber,
  insertEvidencePack,
  listLotEvidencePacks,
  listSupplierEvidencePacks,
  updateClaimRow,
} from "@/db/queries/evidence";
import { getSupplier } from "@/db/queries/suppliers";
import { getLot, lockLot } from "@/db/queries/lots";
import type { Lot } from "@/db/schema";
import type { ClaimStatus } from "@/lib/evidence/claim-status";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import { transactionWithJobs } from "@/lib/jobs/send";
import { loadLotReport } from "@/lib/reports/lot-report-load";
import { formatInstant } from "@/lib/reports/format";
import { DEFAULT_EVIDENCE_LIMIT_BYTES, evidenceFiles, totalBytes, type EvidenceFile } from "./attachments";
import { evidenceLinkExpiry, evidenceLinkUrl, removeEvidenceFiles, storeEvidenceFiles } from "./evidence-link";
import type { EvidenceDraft } from "./schemas";
import { EVIDENCE_BODY_MAX, EVIDENCE_SUBJECT_MAX, evidenceText, evidenceValues, fillTemplate, type FilesDelivery } from "./template";

const CLAIMABLE_DISPOSITIONS = new Set(["return_to_vendor", "sort", "downgrade"]);

/** Why the supplier cannot be sent evidence about this lot, or null when it can. */
export function evidenceRefusal(lot: Pick<Lot, "status" | "verdict" | "disposition">): string | null {
  if (lot.status !== "decided" || !lot.verdict) return "This lot is not decided yet: decide it (verdict and disposition) before sending the supplier evidence.";
  if (lot.verdict === "reject" || (lot.disposition && CLAIMABLE_DISPOSITIONS.has(lot.disposition))) return null;
  return "This lot was accepted to stock: there is nothing to claim from the supplier.";
}

export function evidenceLimitBytes(): number {
  const raw = Number(process.env.EVIDENCE_ATTACHMENT_LIMIT_BYTES ?? DEFAULT_EVIDENCE_LIMIT_BYTES);
  return Number.isInteger(raw) && raw > 0 ? raw : DEFAULT_EVIDENCE_LIMIT_BYTES;
}

const claimPrefix = (at: Date) => `CLM-${at.getUTCFullYear()}-`;

async function nextClaimReference(workspaceId: string, at: Date): Promise<string> {
  const prefix = claimPrefix(at);
  const n = await transaction((tx) => lastClaimNumber(tx, { workspaceId, prefix }));
  return `${prefix}${String(n + 1).padStart(4, "0")}`;
}

export type PreparedEvidence = {
  to: string;
  supplierId: string;
  subject: string;
  text: string;
  claimRef: string;
  files: EvidenceFile[];
  totalBytes: number;
  delivery: "attached" | "link";
  /** Set when the files go by link: when the link stops opening. */
  linkExpiresAt: Date | null;
};

/** What the preview shows where the link will be: its address names the pack, which exists only once sent. */
export const PREVIEW_LINK_URL = "[the evidence link, made when you send]";

/**
 * Renders the files, then fills the template: `{{files}}` depends on whether they fit in an
 * e-mail (nothing stored). `linkUrl` gives the link's address for its expiry. 404 for another
 * workspace's lot, 409 for a lot not to claim on, 400 for a text too long once filled in.
 */
export async function prepareEvidence(user: SessionUser, lotId: string, draft: EvidenceDraft, linkUrl: (expiresAt: Date) => string): Promise<PreparedEvidence> {
  const row = await getLot({ workspaceId: user.workspaceId, lotId });
  if (!row) throw notFound("That lot");
  const refusal = evidenceRefusal(row.lot);
  if (refusal) throw new AppError("conflict", refusal);
  const contact = await getLotSupplierContact({ workspaceId: user.workspaceId, lotId });
  if (!contact) throw notFound("That lot");
  const claimRef = draft.claimRef || (await nextClaimReference(user.workspaceId, new Date()));
  const report = await loadLotReport({ workspaceId: user.workspaceId, name: user.name, roles: user.roles }, lotId);
  const files = await evidenceFiles(report, { timeZone: user.timeZone });
  const total = totalBytes(files);
  const linkExpiresAt = total > evidenceLimitBytes() ? evidenceLinkExpiry(new Date()) : null;
  const delivery: FilesDelivery = linkExpiresAt
    ? { kind: "link", url: linkUrl(linkExpiresAt), files: files.length, totalBytes: total, expiresAt: formatInstant(linkExpiresAt, user.timeZone) }
    : { kind: "attached" };
  const values = evidenceValues(report, claimRef, delivery);
  const subject = fillTemplate(draft.subject, values).replace(/\s+/g, " ").trim();
  const text = evidenceText(draft.body, values, delivery);
  if (subject.length > EVIDENCE_SUBJECT_MAX)
    throw new AppError("bad_request", `Filled in, the subject is ${subject.length} characters; keep it under ${EVIDENCE_SUBJECT_MAX}.`, { fieldErrors: { subject: "Too long once filled in." } });
  if (text.length > EVIDENCE_BODY_MAX)
    throw new AppError("bad_request", `Filled in, the message is ${text.length} characters; keep it under ${EVIDENCE_BODY_MAX}.`, { fieldErrors: { body: "Too long once filled in." } });
  return { to: contact.contactEmail, supplierId: contact.supplierId, subject, text, claimRef, files, totalBytes: total, delivery: delivery.kind, linkExpiresAt };
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
const htmlOf = (text: string) =>
  `<!doctype html><html><body style="font-family:sans-serif;color:#1f2933">${text
    .split(/\n{2,}/)
    .map((p) => `<p>${escapeHtml(p).replace(/\n/g, "<br>")}</p>`)
    .join("")}</body></html>`;

const NUMBERING_TRIES = 3;
const CLAIM_REF_TAKEN = "Already used.";

/** Stores the pack, its claim and the queued e-mail with its delivery job, all or nothing. */
export async function sendEvidence(user: SessionUser, lotId: string, draft: EvidenceDraft) {
  for (let attempt = 1; ; attempt++) {
    try {
      return await sendOnce(user, lotId, draft);
    } catch (err) {
      const numberTaken = err instanceof AppError && err.fieldErrors?.claimRef === CLAIM_REF_TAKEN;
      if (draft.claimRef || !numberTaken || attempt >= NUMBERING_TRIES) throw err;
    }
  }
}

async function sendOnce(user: SessionUser, lotId: string, draft: EvidenceDraft) {
  const packId = randomUUID();
  const prepared = await prepareEvidence(user, lotId, draft, (linkExpiresAt) => evidenceLinkUrl({ id: packId, linkExpiresAt }));
  const byLink = prepared.delivery === "link";
  if (byLink) await storeEvidenceFiles(user.workspaceId, packId, prepared.files);
  try {
    return await storePack(user, lotId, packId, prepared);
  } catch (err) {
    if (byLink) await removeEvidenceFiles(user.workspaceId, packId, prepared.files.length);
    throw err;
  }
}

async function storePack(user: SessionUser, lotId: string, packId: string, prepared: PreparedEvidence) {
  return transactionWithJobs(async (tx, jobs) => {
    const lot = await lockLot(tx, { workspaceId: user.workspaceId, lotId });
    if (!lot) throw notFound("That lot");
    const refusal = evidenceRefusal(lot);
    if (refusal) throw new AppError("conflict", refusal);
    const email = await insertQueuedEvidenceEmail(tx, { workspaceId: user.workspaceId, toAddress: prepared.to, subject: prepared.subject });
    const pack = await insertEvidencePack(tx, {
      id: packId,
      workspaceId: user.workspaceId,
      lotId,
      supplierId: prepared.supplierId,
      emailId: email.id,
      toAddress: prepared.to,
      subject: prepared.subject,
      body: prepared.text,
      attachments: prepared.files.map(({ filename, contentType, bytes }) => ({ filename, contentType, bytes })),
      delivery: prepared.delivery,
      linkExpiresAt: prepared.linkExpiresAt,
      createdBy: user.id,
    });
    const claim = await insertClaim(tx, { workspaceId: user.workspaceId, evidencePackId: pack.id, supplierId: prepared.supplierId, lotId, reference: prepared.claimRef, updatedBy: user.id });
    if (!claim)
      throw new AppError("conflict", `Claim reference ${prepared.claimRef} is already used in this workspace; type another or leave it empty to have one numbered.`, {
        fieldErrors: { claimRef: CLAIM_REF_TAKEN },
      });
    await logActivity(tx, {
      workspaceId: user.workspaceId,
      actorId: user.id,
      action: "evidence.sent",
      subjectType: "lot",
      subjectId: lotId,
      detail: { evidencePackId: pack.id, claimId: claim.id, claimRef: claim.reference, to: prepared.to, bytes: prepared.totalBytes, delivery: prepared.delivery },
    });
    await jobs.sendMailDelivery({
      emailId: email.id,
      message: {
        workspaceId: user.workspaceId,
        kind: "supplier_evidence",
        to: prepared.to,
        subject: prepared.subject,
        text: prepared.text,
        html: htmlOf(prepared.text),
        // Behind a link the files stay in the store; the message carries the link instead.
        attachments: prepared.delivery === "link" ? [] : prepared.files.map((f) => ({ filename: f.filename, content: f.content, contentType: f.contentType })),
      },
    });
    return { pack, claim, email };
  });
}

/** Each pack sent by link with the address its e-mail carried (for the lead to copy or check). */
const withLinks = (packs: EvidencePackRow[]) => packs.map((p) => ({ ...p, linkUrl: p.linkExpiresAt ? evidenceLinkUrl({ id: p.id, linkExpiresAt: p.linkExpiresAt }) : null }));

export async function listEvidenceOfLot(user: SessionUser, lotId: string) {
  const row = await getLot({ workspaceId: user.workspaceId, lotId });
  if (!row) throw notFound("That lot");
  return { packs: withLinks(await listLotEvidencePacks({ workspaceId: user.workspaceId, lotId })), refusal: evidenceRefusal(row.lot) };
}

export async function listEvidenceOfSupplier(user: SessionUser, supplierId: string) {
  if (!(await getSupplier({ workspaceId: user.workspaceId, supplierId }))) throw notFound("That supplier");
  return withLinks(await listSupplierEvidencePacks({ workspaceId: user.workspaceId, supplierId }));
}

export async function updateClaim(user: SessionUser, claimId: string, update: { status: ClaimStatus; note: string; version: number }) {
  return transaction(async (tx) => {
    const row = await updateClaimRow(tx, { workspaceId: user.workspaceId, claimId, ...update, updatedBy: user.id, at: new Date() });
    if (!row) {
      const existing = await getClaim({ workspaceId: user.workspaceId, claimId }, tx);
      if (!existing) throw notFound("That claim");
      throw new AppError("conflict", "Someone changed this claim since you opened it; reload to see its current status.");
    }
    await logActivity(tx, {
      workspaceId: user.workspaceId,
      actorId: user.id,
      action: "claim.updated",
      subjectType: "lot",
      subjectId: row.lotId,
      detail: { claimId, status: update.status, note: update.note },
    });
    return row;
  });
}
