import "server-only";
import { and, asc, desc, eq, inArray, isNotNull, isNull } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { lots, partTypes, photos, regions, units } from "@/db/schema";

export function listPartTypes({ workspaceId, active }: { workspaceId: string; active?: boolean }) {
  const where = [eq(partTypes.workspaceId, workspaceId)];
  if (active !== undefined) where.push(eq(partTypes.active, active));
  return db().select().from(partTypes).where(and(...where)).orderBy(asc(partTypes.name));
}

export async function getPartType({ workspaceId, partTypeId }: { workspaceId: string; partTypeId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(partTypes)
    .where(and(eq(partTypes.workspaceId, workspaceId), eq(partTypes.id, partTypeId)))
    .limit(1);
  return row;
}

/**
 * The newest processed photos of one view of a part type (with a preview to draw on; none taken
 * out of its unit as a wrong photo), with their Surface outlines: samples a lead draws the view's
 * zones on. Those with a Surface come first (the stored zones show on them at once), newest first
 * within each. Scoped by workspace on every table.
 */
export async function listSamplePhotos({ workspaceId, partTypeId, viewKey, limit = 12 }: { workspaceId: string; partTypeId: string; viewKey: string; limit?: number }) {
  const rows = await db()
    .select({
      id: photos.id,
      width: photos.width,
      height: photos.height,
      previewWidth: photos.previewWidth,
      previewHeight: photos.previewHeight,
      createdAt: photos.createdAt,
      serial: units.serial,
      sampleIndex: units.sampleIndex,
      purchaseRef: lots.purchaseRef,
    })
    .from(photos)
    .innerJoin(units, and(eq(units.id, photos.unitId), eq(units.workspaceId, workspaceId)))
    .innerJoin(lots, and(eq(lots.id, units.lotId), eq(lots.workspaceId, workspaceId)))
    .where(and(eq(photos.workspaceId, workspaceId), eq(units.partTypeId, partTypeId), eq(photos.viewKey, viewKey), eq(photos.status, "ready"), isNotNull(photos.previewWidth), isNotNull(photos.previewHeight), isNull(photos.removedAt)))
    .orderBy(desc(photos.createdAt), desc(photos.id))
    .limit(limit);
  const surfaces = rows.length
    ? await db()
        .select({ photoId: regions.photoId, id: regions.clientId, shape: regions.shape })
        .from(regions)
        .where(and(eq(regions.workspaceId, workspaceId), inArray(regions.photoId, rows.map((r) => r.id)), eq(regions.role, "surface")))
    : [];
  const samples = rows.map((row) => ({ ...row, surfaces: surfaces.filter((s) => s.photoId === row.id).map((s) => ({ id: s.id, shape: s.shape })) }));
  // A stable sort: the newest-first order is kept within each group.
  return samples.sort((a, b) => Number(b.surfaces.length > 0) - Number(a.surfaces.length > 0));
}
