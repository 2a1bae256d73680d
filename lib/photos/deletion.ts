import "server-only";
/**
 * The one gate every deletion of a photo's original goes through. Evidence must outlive the
 * decisions made on it: once grades (and regions, measurements, gallery items) reference photos,
 * each of those features adds its check to ORIGINAL_DELETION_CHECKS — e.g. "a grade references
 * this photo" — and no caller needs to change. Today: regions and measurements (lib/grading/photo-evidence.ts)
 * and gallery items (lib/gallery/photo-use.ts).
 */
import type { DbOrTx } from "@/db/client";
import { galleryUseCheck } from "@/lib/gallery/photo-use";
import { gradingEvidenceCheck } from "@/lib/grading/photo-evidence";
import { AppError } from "@/lib/errors";

export type PhotoRef = { workspaceId: string; photoId: string };

/** Answers a sentence saying why the original must stay, or null when this check has no objection. */
export type OriginalDeletionCheck = (tx: DbOrTx, photo: PhotoRef) => Promise<string | null>;

export const ORIGINAL_DELETION_CHECKS: OriginalDeletionCheck[] = [
  // Regions marked on it, or a measurement (and so possibly a grade) made from it.
  gradingEvidenceCheck,
  // A gallery item shows it (draft, published or retired).
  galleryUseCheck,
];

export async function originalDeletionBlockers(tx: DbOrTx, photo: PhotoRef, checks: readonly OriginalDeletionCheck[] = ORIGINAL_DELETION_CHECKS): Promise<string[]> {
  const reasons: string[] = [];
  for (const check of checks) {
    const reason = await check(tx, photo);
    if (reason) reasons.push(reason);
  }
  return reasons;
}

/** Throws 409 with every reason when the original may not be deleted. */
export async function assertOriginalDeletable(tx: DbOrTx, photo: PhotoRef, checks: readonly OriginalDeletionCheck[] = ORIGINAL_DELETION_CHECKS): Promise<void> {
  const reasons = await originalDeletionBlockers(tx, photo, checks);
  if (reasons.length) throw new AppError("conflict", `This photo's original cannot be deleted: ${reasons.join(" ")}`);
}
