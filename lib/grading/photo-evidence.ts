import "server-only";
/**
 * The grading check for lib/photos/deletion.ts's ORIGINAL_DELETION_CHECKS: a photo whose regions
 * were saved, or that a measurement read, is evidence behind a proposed or recorded grade and its
 * original must stay. (To be listed in ORIGINAL_DELETION_CHECKS by the photo-intake owner.)
 */
import type { DbOrTx } from "@/db/client";
import { getPhotoEvidenceUse } from "@/db/queries/grading";
import type { OriginalDeletionCheck } from "@/lib/photos/deletion";

export const gradingEvidenceCheck: OriginalDeletionCheck = async (tx: DbOrTx, { workspaceId, photoId }) => {
  const row = await getPhotoEvidenceUse(tx, { workspaceId, photoId });
  if (row?.measured) return "A measurement (and possibly a grade) was made from this photo; it is evidence and cannot be deleted.";
  if (row?.regions) return "Regions were marked on this photo; it is evidence and cannot be deleted.";
  return null;
};
