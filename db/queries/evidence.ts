import "server-only";
import { and, desc, eq, isNull, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { claims, evidencePacks, lots, outgoingEmails, suppliers, users, workspaces, type NewEvidencePack } from "@/db/schema";
import type { ClaimStatus } from "@/lib/evidence/claim-status";

/** The supplier's contact for a lot's evidence (scoped to the workspace). */
export async function getLotSupplierContact({ workspaceId, lotId }: { workspaceId: string; lotId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ supplierId: suppliers.id, name: suppliers.name, contactName: suppliers.contactName, contactEmail: suppliers.contactEmail })
    .from(lots)
    .innerJoin(suppliers, eq(suppliers.id, lots.supplierId))
    .where(and(eq(lots.workspaceId, workspaceId), eq(lots.id, lotId)))
    .limit(1);
  return row;
}

/** The Outbox row of an evidence e-mail, queued for the worker (no attempt made yet). */
export async function insertQueuedEvidenceEmail(tx: DbOrTx, { workspaceId, toAddress, subject }: { workspaceId: string; toAddress: string; subject: string }) {
  const [row] = await tx.insert(outgoingEmails).values({ workspaceId, kind: "supplier_evidence", toAddress, subject, status: "queued", attempts: 0 }).returning();
  return row;
}

export async function insertEvidencePack(tx: DbOrTx, row: NewEvidencePack) {
  const [inserted] = await tx.insert(evidencePacks).values(row).returning();
  return inserted;
}

/** Inserts a claim; undefined when its reference is taken in the workspace (case-insensitive). */
export async function insertClaim(tx: DbOrTx, row: { workspaceId: string; evidencePackId: string; supplierId: string; lotId: string; reference: string; updatedBy: string }) {
  const [inserted] = await tx.insert(claims).values(row).onConflictDoNothing().returning();
  return inserted;
}

/**
 * The highest number among the workspace's claim references of the form `<prefix><digits>`
 * (case-insensitive, as references are unique), 0 when there is none. The largest, not a count:
 * a reference a lead typed in that form would otherwise be handed out again.
 */
export async function lastClaimNumber(tx: DbOrTx, { workspaceId, prefix }: { workspaceId: string; prefix: string }) {
  const pattern = `^${prefix.toUpperCase().replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}([0-9]{1,9})$`;
  const [row] = await tx
    .select({ n: sql<number>`coalesce(max(substring(upper(${claims.reference}) FROM ${pattern})::int), 0)::int` })
    .from(claims)
    .where(and(eq(claims.workspaceId, workspaceId), sql`upper(${claims.reference}) ~ ${pattern}`));
  return row?.n ?? 0;
}

const packColumns = {
  id: evidencePacks.id,
  lotId: evidencePacks.lotId,
  supplierId: evidencePacks.supplierId,
  toAddress: evidencePacks.toAddress,
  subject: evidencePacks.subject,
  attachments: evidencePacks.attachments,
  delivery: evidencePacks.delivery,
  linkExpiresAt: evidencePacks.linkExpiresAt,
  revokedAt: evidencePacks.revokedAt,
  createdAt: evidencePacks.createdAt,
  createdByName: users.name,
  emailId: outgoingEmails.id,
  emailStatus: outgoingEmails.status,
  emailError: outgoingEmails.error,
  emailAttempts: outgoingEmails.attempts,
  emailUpdatedAt: outgoingEmails.updatedAt,
  claimId: claims.id,
  claimReference: claims.reference,
  claimStatus: claims.status,
  claimNote: claims.note,
  claimVersion: claims.version,
  claimUpdatedAt: claims.updatedAt,
  purchaseRef: lots.purchaseRef,
};

function packQuery(tx: DbOrTx) {
  return tx
    .select(packColumns)
    .from(evidencePacks)
    .innerJoin(outgoingEmails, eq(outgoingEmails.id, evidencePacks.emailId))
    .innerJoin(claims, eq(claims.evidencePackId, evidencePacks.id))
    .innerJoin(lots, eq(lots.id, evidencePacks.lotId))
    .innerJoin(users, eq(users.id, evidencePacks.createdBy));
}

export type EvidencePackRow = Awaited<ReturnType<typeof listLotEvidencePacks>>[number];

export function listLotEvidencePacks({ workspaceId, lotId }: { workspaceId: string; lotId: string }, tx: DbOrTx = db()) {
  return packQuery(tx)
    .where(and(eq(evidencePacks.workspaceId, workspaceId), eq(evidencePacks.lotId, lotId)))
    .orderBy(desc(evidencePacks.createdAt));
}

export function listSupplierEvidencePacks({ workspaceId, supplierId }: { workspaceId: string; supplierId: string }, tx: DbOrTx = db()) {
  return packQuery(tx)
    .where(and(eq(evidencePacks.workspaceId, workspaceId), eq(evidencePacks.supplierId, supplierId)))
    .orderBy(desc(evidencePacks.createdAt));
}

/** Moves a claim to a status when the caller read its current version; undefined otherwise. */
export async function updateClaimRow(
  tx: DbOrTx,
  { workspaceId, claimId, status, note, version, updatedBy, at }: { workspaceId: string; claimId: string; status: ClaimStatus; note: string; version: number; updatedBy: string; at: Date },
) {
  const [row] = await tx
    .update(claims)
    .set({ status, note, version: sql`${claims.version} + 1`, updatedBy, updatedAt: at })
    .where(and(eq(claims.workspaceId, workspaceId), eq(claims.id, claimId), eq(claims.version, version)))
    .returning();
  return row;
}

export async function getClaim({ workspaceId, claimId }: { workspaceId: string; claimId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(claims)
    .where(and(eq(claims.workspaceId, workspaceId), eq(claims.id, claimId)))
    .limit(1);
  return row;
}

/**
 * A pack as its public evidence link shows it (signed out, found by the id in a verified token):
 * what the supplier was sent and by which workspace, nothing else. Undefined for an unknown id or
 * a pack whose files were attached (those have no link).
 */
export async function findEvidencePackForLink({ id }: { id: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({
      id: evidencePacks.id,
      workspaceId: evidencePacks.workspaceId,
      workspaceName: workspaces.name,
      purchaseRef: lots.purchaseRef,
      subject: evidencePacks.subject,
      body: evidencePacks.body,
      attachments: evidencePacks.attachments,
      createdAt: evidencePacks.createdAt,
      linkExpiresAt: evidencePacks.linkExpiresAt,
      revokedAt: evidencePacks.revokedAt,
      claimReference: claims.reference,
    })
    .from(evidencePacks)
    .innerJoin(workspaces, eq(workspaces.id, evidencePacks.workspaceId))
    .innerJoin(lots, and(eq(lots.workspaceId, evidencePacks.workspaceId), eq(lots.id, evidencePacks.lotId)))
    .innerJoin(claims, eq(claims.evidencePackId, evidencePacks.id))
    .where(and(eq(evidencePacks.id, id), eq(evidencePacks.delivery, "link")))
    .limit(1);
  return row;
}

/** Withdraws a pack's evidence link; undefined when the pack is not the workspace's, has no link or is already withdrawn. */
export async function revokeEvidenceLinkRow(tx: DbOrTx, { workspaceId, packId, revokedBy, at }: { workspaceId: string; packId: string; revokedBy: string; at: Date }) {
  const [row] = await tx
    .update(evidencePacks)
    .set({ revokedAt: at, revokedBy })
    .where(and(eq(evidencePacks.workspaceId, workspaceId), eq(evidencePacks.id, packId), eq(evidencePacks.delivery, "link"), isNull(evidencePacks.revokedAt)))
    .returning();
  return row;
}

export async function getEvidencePack({ workspaceId, packId }: { workspaceId: string; packId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(evidencePacks)
    .where(and(eq(evidencePacks.workspaceId, workspaceId), eq(evidencePacks.id, packId)))
    .limit(1);
  return row;
}
