import "server-only";
/**
 * The Gallery's check for lib/photos/deletion.ts: a photo that a gallery item shows (in any
 * status, retired included: a calibration key or a report may still cite it) keeps its original.
 */
import type { DbOrTx } from "@/db/client";
import { countItemsUsingPhoto } from "@/db/queries/gallery";
import type { OriginalDeletionCheck } from "@/lib/photos/deletion";

export const galleryUseCheck: OriginalDeletionCheck = async (tx: DbOrTx, photo) => {
  const n = await countItemsUsingPhoto(tx, photo);
  if (n === 0) return null;
  return `${n === 1 ? "A gallery item shows" : `${n} gallery items show`} this photo; its original is kept for as long as an item uses it.`;
};
