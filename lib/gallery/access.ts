/**
 * Who does what in the Gallery (leads pass every check, lib/auth/roles.ts): trainers edit, promote,
 * upload, publish and retire; everyone in the workspace reads published items. Drafts and retired
 * items are the editors' working set: for anyone else they answer 404, like a missing item.
 */
import { hasAnyRole, type Role } from "@/lib/auth/roles";
import type { GalleryStatus } from "./rules";

export const GALLERY_EDITORS: readonly Role[] = ["trainer"];

export const canEditGallery = (roles: readonly Role[]): boolean => hasAnyRole(roles, GALLERY_EDITORS);

/** Whether someone with these roles may see an item in this status. */
export const canSeeItem = (roles: readonly Role[], status: GalleryStatus): boolean => status === "published" || canEditGallery(roles);
