import "server-only";
/**
 * Evidence links (issue 17): when a pack's files pass the e-mail size limit, they are stored in the
 * object store and the e-mail carries a link to a public, read-only page that shows that pack and
 * nothing else. Decisions:
 * - The link holds a signed token naming the pack (lib/reports/public-links.ts, purpose
 *   "evidence-pack"), valid EVIDENCE_LINK_DAYS; the lead can withdraw it (revokedAt) at any time.
 * - Every refusal is one plain sentence, the same for a tampered token and an unknown pack.
 * - The files are uploaded before the pack's row is written; if the write fails they are deleted
 *   again, so a refused send leaves no objects behind.
 */
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { findEvidencePackForLink, getEvidencePack, revokeEvidenceLinkRow } from "@/db/queries/evidence";
import type { SessionUser } from "@/lib/auth/require-user";
import { env } from "@/lib/env";
import { AppError, notFound } from "@/lib/errors";
import { evidenceFileKey } from "@/lib/photos/object-keys";
import { judgePublicRecord, refusal, signPublicLink, verifyPublicLink, type PublicLinkRefusal } from "@/lib/reports/public-links";
import { MAX_TOKEN_LENGTH } from "@/lib/signing/signed-token";
import { deleteObject, getObjectStream, objectStore, putObject } from "@/lib/storage/s3";
import type { EvidenceFile } from "./attachments";

/** How long a supplier can open an evidence link (a decision of ours: long enough to answer a claim). */
export const EVIDENCE_LINK_DAYS = 30;

export function evidenceLinkExpiry(from: Date): Date {
  return new Date(from.getTime() + EVIDENCE_LINK_DAYS * 86_400_000);
}

export function evidenceLinkUrl(pack: { id: string; linkExpiresAt: Date }): string {
  const token = signPublicLink("evidence-pack", pack.id, { secret: env().NEXTAUTH_SECRET, expiresAt: pack.linkExpiresAt });
  return `${env().APP_URL.replace(/\/$/, "")}/evidence/${token}`;
}

/** Uploads the files of pack `packId`; on any failure removes what was uploaded and rethrows. */
export async function storeEvidenceFiles(workspaceId: string, packId: string, files: readonly EvidenceFile[]): Promise<void> {
  const store = objectStore();
  try {
    for (const [index, file] of files.entries()) await putObject(store, evidenceFileKey({ workspaceId, packId, index }), file.content, { contentType: file.contentType });
  } catch (err) {
    await removeEvidenceFiles(workspaceId, packId, files.length);
    throw err;
  }
}

/** Best effort (deleting a missing key succeeds): used when the pack's row could not be written. */
export async function removeEvidenceFiles(workspaceId: string, packId: string, count: number): Promise<void> {
  const store = objectStore();
  for (let index = 0; index < count; index++) await deleteObject(store, evidenceFileKey({ workspaceId, packId, index })).catch(() => undefined);
}

export type EvidenceLinkPack = NonNullable<Awaited<ReturnType<typeof findEvidencePackForLink>>>;
export type EvidenceLinkAnswer = { ok: true; pack: EvidenceLinkPack; token: string } | { ok: false; reason: PublicLinkRefusal; message: string };

/** The public page's answer for a token: the pack, or a plain refusal (tampered/unknown, expired, withdrawn). */
export async function openEvidenceLink(token: string, now = new Date()): Promise<EvidenceLinkAnswer> {
  if (token.length > MAX_TOKEN_LENGTH) return refusal("evidence-pack", "invalid");
  const check = verifyPublicLink("evidence-pack", token, { secret: env().NEXTAUTH_SECRET, now });
  const pack = check.ok ? await findEvidencePackForLink({ id: check.id }) : undefined;
  const judged = judgePublicRecord("evidence-pack", check, pack ? { revokedAt: pack.revokedAt } : null);
  if (!judged.ok) return judged;
  return { ok: true, pack: pack!, token };
}

/** One file behind a valid link, streamed from the store; 404 with the page's sentence otherwise. */
export async function evidenceLinkFile(token: string, index: number) {
  const answer = await openEvidenceLink(token);
  if (!answer.ok) throw new AppError("not_found", answer.message);
  const file = answer.pack.attachments[index];
  if (!file) throw new AppError("not_found", "This evidence pack has no such file.");
  const object = await getObjectStream(objectStore(), evidenceFileKey({ workspaceId: answer.pack.workspaceId, packId: answer.pack.id, index }));
  if (!object) throw new AppError("not_found", "This file is no longer available. Ask the sender for a new link.");
  return { file, body: object.body };
}

/** The lead withdraws a pack's evidence link; the page then says so. 404 for another workspace's pack, 409 when there is no live link. */
export async function revokeEvidenceLink(user: SessionUser, packId: string) {
  return transaction(async (tx) => {
    const row = await revokeEvidenceLinkRow(tx, { workspaceId: user.workspaceId, packId, revokedBy: user.id, at: new Date() });
    if (!row) {
      const existing = await getEvidencePack({ workspaceId: user.workspaceId, packId }, tx);
      if (!existing) throw notFound("That evidence pack");
      throw new AppError(
        "conflict",
        existing.delivery === "link" ? "This evidence link is already withdrawn." : "This evidence pack's files were attached to the e-mail; there is no link to withdraw.",
      );
    }
    await logActivity(tx, { workspaceId: user.workspaceId, actorId: user.id, action: "evidence.link_revoked", subjectType: "lot", subjectId: row.lotId, detail: { evidencePackId: row.id } });
    return row;
  });
}
