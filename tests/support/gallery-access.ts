/** Fixture ids for the Gallery routes in the access matrix (tests/integration/routes.ts). */
import type { Session } from "./http";
import { createGradedPhoto, insertItem, SCRATCHED } from "./gallery";

export async function galleryFixtureIds(lead: Session): Promise<Record<string, string>> {
  const { owner, partType, photo, extra } = await createGradedPhoto(lead, { extraPhotos: 4 });
  const [publishedPhoto, editPhoto, publishPhoto, retirePhoto] = extra;
  const base = { partTypeId: partType.id };
  const published = await insertItem(owner, { ...base, photoId: publishedPhoto.id, status: "published", regions: SCRATCHED });
  const toEdit = await insertItem(owner, { ...base, photoId: editPhoto.id });
  const toPublish = await insertItem(owner, { ...base, photoId: publishPhoto.id, regions: SCRATCHED, caption: "A scratch of 1.2 % across the lens window: C" });
  const toRetire = await insertItem(owner, { ...base, photoId: retirePhoto.id });
  return {
    galleryPartTypeId: partType.id,
    galleryItemId: published.id,
    galleryDraftId: toEdit.id,
    galleryPublishId: toPublish.id,
    galleryRetireId: toRetire.id,
    promotablePhotoId: photo.id,
  };
}
