/**
 * Object keys, built by the server only: from ids it generated or read from the database, never
 * from a file name or any other text a person typed. Every key of a photo carries its workspace,
 * unit and photo id, so the orphan sweep can tell from the key alone which row it belongs to.
 *
 *   uploads/<workspace>/<unit>/<photo>         staging: the only key a browser gets a PUT URL for
 *   photos/<workspace>/<unit>/<photo>/original  the accepted bytes, copied by the server
 *   photos/<workspace>/<unit>/<photo>/preview.webp, …/thumbnail.webp
 */
export const STAGING_PREFIX = "uploads/";
export const PHOTOS_PREFIX = "photos/";

export type PhotoKeyOwner = { workspaceId: string; unitId: string; photoId: string };
export type PhotoObjectKind = "staging" | "original" | "preview" | "thumbnail";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

function checked(owner: PhotoKeyOwner): PhotoKeyOwner {
  for (const [name, value] of Object.entries(owner)) {
    if (!UUID.test(value)) throw new Error(`object key part ${name} must be a lower-case UUID (got "${value}")`);
  }
  return owner;
}

export function stagingKey(owner: PhotoKeyOwner): string {
  const { workspaceId, unitId, photoId } = checked(owner);
  return `${STAGING_PREFIX}${workspaceId}/${unitId}/${photoId}`;
}

const photoFolder = (owner: PhotoKeyOwner) => {
  const { workspaceId, unitId, photoId } = checked(owner);
  return `${PHOTOS_PREFIX}${workspaceId}/${unitId}/${photoId}`;
};

export const originalKey = (owner: PhotoKeyOwner) => `${photoFolder(owner)}/original`;
export const previewKey = (owner: PhotoKeyOwner) => `${photoFolder(owner)}/preview.webp`;
export const thumbnailKey = (owner: PhotoKeyOwner) => `${photoFolder(owner)}/thumbnail.webp`;

/** The folder of one unit's accepted photos, for listing. */
export function unitPhotosPrefix({ workspaceId, unitId }: { workspaceId: string; unitId: string }): string {
  checked({ workspaceId, unitId, photoId: unitId });
  return `${PHOTOS_PREFIX}${workspaceId}/${unitId}/`;
}

const FILE_KIND: Record<string, PhotoObjectKind> = { original: "original", "preview.webp": "preview", "thumbnail.webp": "thumbnail" };

/** What a key is and whose it is; null for a key this app would never have written. */
export function parsePhotoKey(key: string): (PhotoKeyOwner & { kind: PhotoObjectKind }) | null {
  const parts = key.split("/");
  if (parts[0] === "uploads" && parts.length === 4) {
    const [, workspaceId, unitId, photoId] = parts;
    if ([workspaceId, unitId, photoId].every((p) => UUID.test(p))) return { workspaceId, unitId, photoId, kind: "staging" };
    return null;
  }
  if (parts[0] === "photos" && parts.length === 5) {
    const [, workspaceId, unitId, photoId, file] = parts;
    const kind = FILE_KIND[file];
    if (kind && [workspaceId, unitId, photoId].every((p) => UUID.test(p))) return { workspaceId, unitId, photoId, kind };
  }
  return null;
}
