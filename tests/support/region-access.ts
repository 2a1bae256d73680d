/**
 * Fixture ids for the regions and suggestions routes in the access matrix: a unit on the bench
 * (no lease held, so every inspector may write) with one photo processed through the real
 * pipeline, so its preview is in the store for the suggestions route.
 */
import sharp from "sharp";
import { api, type Session } from "./http";
import { createPhotoUnits, uploadPhoto } from "./photos";

export async function regionFixtureIds(lead: Session): Promise<Record<string, string>> {
  const me = await api<{ user: { workspaceId: string } }>(lead, "GET", "/api/me");
  const { unitIds } = await createPhotoUnits({ id: me.body.user.workspaceId });
  // A dark part on a light card, unique per workspace (so the two fixture photos never look reused).
  const shade = 20 + Math.floor(Math.random() * 60);
  const part = await sharp({ create: { width: 60, height: 40, channels: 3, background: { r: shade, g: shade, b: shade } } })
    .png()
    .toBuffer();
  const jpeg = await sharp({ create: { width: 120, height: 90, channels: 3, background: { r: 225, g: 222, b: 215 } } })
    .composite([{ input: part, left: 30, top: 25 }])
    .jpeg()
    .toBuffer();
  const { finalise } = await uploadPhoto(lead, unitIds[0], jpeg);
  if (finalise?.status !== 201) throw new Error(`Fixture photo upload failed: ${JSON.stringify(finalise?.body)}`);
  return { regionPhotoId: finalise.body.photo.id };
}
