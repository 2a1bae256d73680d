/**
 * Who sees what in the Gallery. The permissions themselves are `gallery.read` (everyone) and
 * `gallery.edit` (trainers; leads hold every permission) in lib/auth/permissions.ts. Drafts and
 * retired items are the editors' working set: for anyone else they answer 404, like a missing
 * item; published items reach everyone — except, for readers without `inspection.read`
 * (auditors), items promoted from a unit whose recheck is still waiting: such an item carries the
 * first grader's regions and grade, which the blind recheck must not see (issue 19). They come
 * back once the recheck is submitted.
 */
import { can } from "@/lib/auth/permissions";
import type { Role } from "@/lib/auth/roles";
import type { GalleryStatus } from "./rules";

export const canEditGallery = (roles: readonly Role[]): boolean => can({ roles }, "gallery.edit");

/** Whether someone with these roles may see an item in this status. */
export const canSeeItem = (roles: readonly Role[], status: GalleryStatus): boolean => status === "published" || canEditGallery(roles);

/** Whether the reader's Gallery leaves out items of units waiting for a blind recheck. */
export const hidesUnitsAwaitingRecheck = (roles: readonly Role[]): boolean => !can({ roles }, "inspection.read");

/** Whether someone with these roles may open this item: its status, and the blind-recheck rule above. */
export const canOpenItem = (roles: readonly Role[], item: { status: GalleryStatus; sourceUnitAwaitsRecheck: boolean }): boolean =>
  canSeeItem(roles, item.status) && !(item.sourceUnitAwaitsRecheck && hidesUnitsAwaitingRecheck(roles));
