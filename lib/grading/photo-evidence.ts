import "server-only";
/**
 * The grading check for lib/photos/deletion.ts's ORIGINAL_DELETION_CHECKS: a photo whose regions
 * were saved, or that a measurement read, is evidence behind a proposed or recorded grade and its
 * original must stay. (To be listed in ORIGINAL_DELETION_CHECKS by the photo-intake owner.)
 */
import { and, eq, sql } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { measurements, regionSets } from "@/db/schema";
import type { OriginalDeletionCheck } from "@/lib/photos/deletion";

export const gradingEvidenceCheck: OriginalDeletionCheck = async (tx: DbOrTx, { workspaceId, photoId }) => {
  const [row] = await tx
    .select({
      regions: sql<boolean>`EXISTS (SELECT 1 FROM ${regionSets} WHERE ${and(eq(regionSets.workspaceId, workspaceId), eq(regionSets.photoId, photoId))})`,
      measured: sql<boolean>`EXISTS (SELECT 1 FROM ${measurements} WHERE ${and(eq(measurements.workspaceId, workspaceId), eq(measurements.photoId, photoId))})`,
    })
    .from(sql`(SELECT 1) AS one`);
  if (row?.measured) return "A measurement (and possibly a grade) was made from this photo; it is evidence and cannot be deleted.";
  if (row?.regions) return "Regions were marked on this photo; it is evidence and cannot be deleted.";
  return null;
};
