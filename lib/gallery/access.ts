/**
 * Who sees what in the Gallery. The permissions themselves are `gallery.read` (everyone) and
 * `gallery.edit` (trainers; leads hold every permission) in lib/auth/permissions.ts. Drafts and
 * retired items are the editors' working set: for anyone else they answer 404, like a missing
 * item; published items reach everyone.
 */
import { can } from "@/lib/auth/permissions";
import type { Role } from "@/lib/auth/roles";
import type { GalleryStatus } from "./rules";

export const canEditGallery = (roles: readonly Role[]): boolean => can({ roles }, "gallery.edit");

/** Whether someone with these roles may see an item in this status. */
export const canSeeItem = (roles: readonly Role[], status: GalleryStatus): boolean => status === "published" || canEditGallery(roles);
