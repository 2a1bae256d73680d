/**
 * Object keys, built by the server only: from ids it generated or read from the database, never
 * from a file name or any other text a person typed. Every key of a photo carries its workspace,
 * unit and photo id, so the orphan sweep can tell from the key alone which row it belongs to.
 * A photo uploaded straight into the Gallery has no unit: its keys say `gallery` instead.
 *
 *   uploads/<workspace>/<unit | gallery>/<photo>         staging: the only key a browser gets a PUT URL for
 *   photos/<workspace>/<unit | gallery>/<photo>/original  the accepted bytes, copied by the server
 *   photos/<workspace>/<unit | gallery>/<photo>/preview.webp, …/thumbnail.webp
 *   evidence/<workspace>/<evidence pack>/<n>              file n of a pack sent by evidence link
 *                                                         (the orphan sweep does not read this prefix)
 */
export const STAGING_PREFIX = "uploads/";
export const PHOTOS_PREFIX = "photos/";

/** `unitId` null: a photo uploaded into the Gallery. */
export type PhotoKeyOwner = { workspaceId: string; unitId: string | null; photoId: string };
export type PhotoObjectKind = "staging" | "original" | "preview" | "thumbnail";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;
/** The folder of gallery uploads in place of a unit id. */
const GALLERY_FOLDER = "gallery";

function checked(owner: PhotoKeyOwner): PhotoKeyOwner {
  for (const [name, value] of Object.entries(owner)) {
    if (name === "unitId" && value === null) continue;
    if (typeof value !== "string" || !UUID.test(value)) throw new Error(`object key part ${name} must be a lower-case UUID (got "${value}")`);
  }
  return owner;
}

/** `<workspace>/<unit | gallery>/<photo>` */
const ownerPath = (owner: PhotoKeyOwner) => {
  const { workspaceId, unitId, photoId } = checked(owner);
  return `${workspaceId}/${unitId ?? GALLERY_FOLDER}/${photoId}`;
};

export function stagingKey(owner: PhotoKeyOwner): string {
  return `${STAGING_PREFIX}${ownerPath(owner)}`;
}

const photoFolder = (owner: PhotoKeyOwner) => `${PHOTOS_PREFIX}${ownerPath(owner)}`;

export const originalKey = (owner: PhotoKeyOwner) => `${photoFolder(owner)}/original`;
export const previewKey = (owner: PhotoKeyOwner) => `${photoFolder(owner)}/preview.webp`;
export const thumbnailKey = (owner: PhotoKeyOwner) => `${photoFolder(owner)}/thumbnail.webp`;

/** The folder of one unit's accepted photos, for listing. */
export function unitPhotosPrefix({ workspaceId, unitId }: { workspaceId: string; unitId: string }): string {
  checked({ workspaceId, unitId, photoId: unitId });
  return `${PHOTOS_PREFIX}${workspaceId}/${unitId}/`;
}

const FILE_KIND: Record<string, PhotoObjectKind> = { original: "original", "preview.webp": "preview", "thumbnail.webp": "thumbnail" };

function ownerOf(workspaceId: string, folder: string, photoId: string): PhotoKeyOwner | null {
  if (!UUID.test(workspaceId) || !UUID.test(photoId)) return null;
  if (folder === GALLERY_FOLDER) return { workspaceId, unitId: null, photoId };
  return UUID.test(folder) ? { workspaceId, unitId: folder, photoId } : null;
}

/** What a key is and whose it is; null for a key this app would never have written. */
export function parsePhotoKey(key: string): (PhotoKeyOwner & { kind: PhotoObjectKind }) | null {
  const parts = key.split("/");
  if (parts[0] === "uploads" && parts.length === 4) {
    const owner = ownerOf(parts[1], parts[2], parts[3]);
    return owner && { ...owner, kind: "staging" };
  }
  if (parts[0] === "photos" && parts.length === 5) {
    const owner = ownerOf(parts[1], parts[2], parts[3]);
    const kind = FILE_KIND[parts[4]];
    if (owner && kind) return { ...owner, kind };
  }
  return null;
}

export const EVIDENCE_PREFIX = "evidence/";

/** File `index` (0-based, in the pack's attachment order) of an evidence pack sent as a link. */
export function evidenceFileKey({ workspaceId, packId, index }: { workspaceId: string; packId: string; index: number }): string {
  checked({ workspaceId, unitId: packId, photoId: packId });
  if (!Number.isInteger(index) || index < 0) throw new Error(`evidence file index must be a whole number >= 0 (got ${index})`);
  return `${EVIDENCE_PREFIX}${workspaceId}/${packId}/${index}`;
}
