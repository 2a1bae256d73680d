import "server-only";
import { and, desc, eq, isNull, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { certificates, checklistResults, grades, lots, partTypes, photos, rubricVersions, units, users, workspaces, type NewCertificate } from "@/db/schema";

type UnitKey = { workspaceId: string; unitId: string };

/** What a certificate of the unit states today: the unit, its lot and part type, its current grade with the rubric version. */
export async function getUnitForCertificate({ workspaceId, unitId }: UnitKey, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ unit: units, lotModelFamily: lots.modelFamily, partType: partTypes, workspaceName: workspaces.name })
    .from(units)
    .innerJoin(lots, eq(lots.id, units.lotId))
    .innerJoin(partTypes, eq(partTypes.id, units.partTypeId))
    .innerJoin(workspaces, eq(workspaces.id, units.workspaceId))
    .where(and(eq(units.workspaceId, workspaceId), eq(units.id, unitId)))
    .limit(1);
  if (!row) return undefined;
  const [grade] = await tx
    .select({ grade: grades, rubricVersion: rubricVersions.version })
    .from(grades)
    .innerJoin(rubricVersions, eq(rubricVersions.id, grades.rubricVersionId))
    .where(and(eq(grades.workspaceId, workspaceId), eq(grades.unitId, unitId)))
    .orderBy(desc(grades.createdAt), desc(grades.id))
    .limit(1);
  const results = await tx
    .select({ itemId: checklistResults.itemId, passed: checklistResults.passed, value: checklistResults.value })
    .from(checklistResults)
    .where(and(eq(checklistResults.workspaceId, workspaceId), eq(checklistResults.unitId, unitId)));
  const unitPhotos = await tx
    .select({ id: photos.id, viewKey: photos.viewKey, sha256: photos.sha256, thumbnailKey: photos.thumbnailKey, width: photos.width, height: photos.height })
    .from(photos)
    .where(and(eq(photos.workspaceId, workspaceId), eq(photos.unitId, unitId), isNull(photos.removedAt), eq(photos.status, "ready")))
    .orderBy(photos.createdAt, photos.id);
  return { ...row, current: grade ?? null, results, photos: unitPhotos };
}

export async function insertCertificate(tx: DbOrTx, row: NewCertificate) {
  const [inserted] = await tx.insert(certificates).values(row).onConflictDoNothing({ target: certificates.shortCode }).returning();
  return inserted;
}

export function listUnitCertificates({ workspaceId, unitId }: UnitKey, tx: DbOrTx = db()) {
  return tx
    .select({
      id: certificates.id,
      shortCode: certificates.shortCode,
      contentHash: certificates.contentHash,
      issuedAt: certificates.issuedAt,
      issuedByName: users.name,
      linkExpiresAt: certificates.linkExpiresAt,
      revokedAt: certificates.revokedAt,
      revokeReason: certificates.revokeReason,
      grade: sql<string>`${certificates.content}->>'grade'`,
    })
    .from(certificates)
    .innerJoin(users, eq(users.id, certificates.issuedBy))
    .where(and(eq(certificates.workspaceId, workspaceId), eq(certificates.unitId, unitId)))
    .orderBy(desc(certificates.issuedAt));
}

export async function getCertificate({ workspaceId, certificateId }: { workspaceId: string; certificateId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(certificates)
    .where(and(eq(certificates.workspaceId, workspaceId), eq(certificates.id, certificateId)))
    .limit(1);
  return row;
}

/** The public verification page's read: by id (from a signed token) or by short code, in any workspace. */
export async function findCertificateForVerification(by: { id: string } | { shortCode: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(certificates)
    .where("id" in by ? eq(certificates.id, by.id) : eq(certificates.shortCode, by.shortCode))
    .limit(1);
  return row;
}

/** Revokes a certificate once; undefined when it is not this workspace's or already revoked. */
export async function revokeCertificateRow(
  tx: DbOrTx,
  { workspaceId, certificateId, revokedBy, reason, at }: { workspaceId: string; certificateId: string; revokedBy: string; reason: string; at: Date },
) {
  const [row] = await tx
    .update(certificates)
    .set({ revokedAt: at, revokedBy, revokeReason: reason })
    .where(and(eq(certificates.workspaceId, workspaceId), eq(certificates.id, certificateId), isNull(certificates.revokedAt)))
    .returning();
  return row;
}
