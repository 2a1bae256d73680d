import "server-only";
import { aliasedTable, and, asc, eq, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { lots, partTypes, photos, regions, regionSets, units, users } from "@/db/schema";
import type { StoredRegion } from "@/lib/regions/payload";

type PhotoKey = { workspaceId: string; photoId: string };

const holders = aliasedTable(users, "lease_holders");

/** A photo with what annotating it needs: its size, its unit's bench state and the part type's classes. */
export async function getPhotoForRegions({ workspaceId, photoId }: PhotoKey, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({
      photo: {
        id: photos.id,
        unitId: photos.unitId,
        viewKey: photos.viewKey,
        status: photos.status,
        width: photos.width,
        height: photos.height,
        previewKey: photos.previewKey,
        previewWidth: photos.previewWidth,
        previewHeight: photos.previewHeight,
        originalKey: photos.originalKey,
        removedAt: photos.removedAt,
      },
      unit: { id: units.id, status: units.status, leaseHolderId: units.leaseHolderId, leaseExpiresAt: units.leaseExpiresAt },
      leaseHolderName: holders.name,
      lotStatus: lots.status,
      partType: { id: partTypes.id, name: partTypes.name, defectClasses: partTypes.defectClasses, views: partTypes.views, panelResolution: partTypes.panelResolution },
    })
    .from(photos)
    .innerJoin(units, and(eq(units.id, photos.unitId), eq(units.workspaceId, photos.workspaceId)))
    .innerJoin(lots, eq(lots.id, units.lotId))
    .innerJoin(partTypes, eq(partTypes.id, units.partTypeId))
    .leftJoin(holders, eq(holders.id, units.leaseHolderId))
    .where(and(eq(photos.workspaceId, workspaceId), eq(photos.id, photoId)))
    .limit(1);
  return row ?? null;
}
export type PhotoForRegions = NonNullable<Awaited<ReturnType<typeof getPhotoForRegions>>>;

/** The photo's region set version (0 when never saved), who saved it last, and when. */
export async function getRegionSetHead({ workspaceId, photoId }: PhotoKey, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ version: regionSets.version, updatedAt: regionSets.updatedAt, updatedByName: users.name })
    .from(regionSets)
    .leftJoin(users, eq(users.id, regionSets.updatedBy))
    .where(and(eq(regionSets.workspaceId, workspaceId), eq(regionSets.photoId, photoId)))
    .limit(1);
  return row ?? { version: 0, updatedAt: null, updatedByName: null };
}

/** The stored regions of one photo, in drawing order. */
export function listPhotoRegions({ workspaceId, photoId }: PhotoKey, tx: DbOrTx = db()): Promise<StoredRegion[]> {
  return tx
    .select({
      clientId: regions.clientId,
      role: regions.role,
      defectClass: regions.defectClass,
      shape: regions.shape,
      ruler: regions.ruler,
      authorId: regions.authorId,
      versionWritten: regions.versionWritten,
      position: regions.position,
    })
    .from(regions)
    .where(and(eq(regions.workspaceId, workspaceId), eq(regions.photoId, photoId)))
    .orderBy(asc(regions.position), asc(regions.createdAt), asc(regions.clientId));
}

/**
 * The region set row, created at version 0 if missing, locked for the rest of the transaction:
 * concurrent saves of one photo queue here, so each compares against the version the previous
 * one committed (compare-and-swap).
 */
export async function lockRegionSet(tx: DbOrTx, { workspaceId, photoId }: PhotoKey): Promise<{ version: number; updatedBy: string | null }> {
  await tx.insert(regionSets).values({ photoId, workspaceId, version: 0 }).onConflictDoNothing({ target: regionSets.photoId });
  const [row] = await tx
    .select({ version: regionSets.version, updatedBy: regionSets.updatedBy })
    .from(regionSets)
    .where(and(eq(regionSets.workspaceId, workspaceId), eq(regionSets.photoId, photoId)))
    .for("update");
  return row;
}

const INSERT_CHUNK = 500;

/** Replaces the photo's rows with `rows` and sets the set's version. */
export async function writeRegionSet(tx: DbOrTx, input: PhotoKey & { rows: StoredRegion[]; version: number; updatedBy: string }) {
  const { workspaceId, photoId } = input;
  await tx.delete(regions).where(and(eq(regions.workspaceId, workspaceId), eq(regions.photoId, photoId)));
  for (let start = 0; start < input.rows.length; start += INSERT_CHUNK) {
    await tx.insert(regions).values(input.rows.slice(start, start + INSERT_CHUNK).map((row) => ({ ...row, workspaceId, photoId })));
  }
  await tx
    .update(regionSets)
    .set({ version: input.version, updatedBy: input.updatedBy, updatedAt: sql`now()` })
    .where(and(eq(regionSets.workspaceId, workspaceId), eq(regionSets.photoId, photoId)));
}
