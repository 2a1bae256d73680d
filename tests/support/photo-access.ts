/**
 * Fixture ids for the photo routes in the access matrix: a unit on the bench and a ready photo of
 * it, and on another unit a ready photo with saved regions (for removal, which withdraws it).
 */
import sharp from "sharp";
import { api, type Session } from "./http";
import { createPhotoUnits, uploadPhoto } from "./photos";

export async function photoFixtureIds(lead: Session): Promise<Record<string, string>> {
  const me = await api<{ user: { workspaceId: string } }>(lead, "GET", "/api/me");
  const { unitIds } = await createPhotoUnits({ id: me.body.user.workspaceId });
  // Unique pixels per workspace, so the two fixture photos never look like one reused file.
  const jpeg = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: Math.floor(Math.random() * 255), g: 90, b: 40 } } })
    .jpeg()
    .toBuffer();
  const { finalise } = await uploadPhoto(lead, unitIds[0], jpeg);
  if (finalise?.status !== 201) throw new Error(`Fixture photo upload failed: ${JSON.stringify(finalise?.body)}`);
  // A second unit whose photo has saved regions (the lead saved them, so the lead holds the unit): removal withdraws it.
  const second = await createPhotoUnits({ id: me.body.user.workspaceId });
  const other = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 40, g: Math.floor(Math.random() * 255), b: 90 } } })
    .jpeg()
    .toBuffer();
  const removable = await uploadPhoto(lead, second.unitIds[0], other);
  if (removable.finalise?.status !== 201) throw new Error(`Fixture photo upload failed: ${JSON.stringify(removable.finalise?.body)}`);
  const removalPhotoId = removable.finalise.body.photo.id;
  const regions = { baseVersion: 0, regions: { regions: [{ id: "fixture-1", defect: "scratch", shape: { kind: "rect", x: 5, y: 5, width: 10, height: 10 } }], surfaces: [], ruler: null } };
  const saved = await api(lead, "PUT", `/api/photos/${removalPhotoId}/regions`, regions);
  if (saved.status !== 200) throw new Error(`Fixture regions failed: ${JSON.stringify(saved.body)}`);
  return { photoUnitId: unitIds[0], photoId: finalise.body.photo.id, removalPhotoId };
}
