/** Fixture ids for the photo routes in the access matrix: a unit on the bench and a ready photo of it. */
import sharp from "sharp";
import { api, type Session } from "./http";
import { createPhotoUnits, uploadPhoto } from "./photos";

export async function photoFixtureIds(lead: Session): Promise<Record<string, string>> {
  const me = await api<{ user: { workspaceId: string } }>(lead, "GET", "/api/me");
  const { unitIds } = await createPhotoUnits({ id: me.body.user.workspaceId });
  // Unique pixels per workspace, so the two fixture photos never look like one reused file.
  const jpeg = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: Math.floor(Math.random() * 255), g: 90, b: 40 } } }).jpeg().toBuffer();
  const { finalise } = await uploadPhoto(lead, unitIds[0], jpeg);
  if (finalise?.status !== 201) throw new Error(`Fixture photo upload failed: ${JSON.stringify(finalise?.body)}`);
  return { photoUnitId: unitIds[0], photoId: finalise.body.photo.id };
}
