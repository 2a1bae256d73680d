import { handler, parseJson } from "@/lib/http/route";
import { loadPhotoForRegions, readRegionSet, RegionVersionConflict, saveRegionSet } from "@/lib/regions/regions";
import { REGION_SAVE_MAX_BYTES, saveRegionsSchema } from "@/lib/regions/schemas";
import { noteInspectionOpened } from "@/lib/recheck/openings";
import { parseId } from "@/lib/validation";

/** The photo's region set and its version; inspection work, so not for auditors (blind recheck). */
export const GET = handler({ permission: "inspection.read" }, async (_req, ctx: RouteContext<"/api/photos/[id]/regions">, user) => {
  const photoId = parseId((await ctx.params).id, "That photo");
  const photo = await loadPhotoForRegions(user, photoId);
  const regionSet = await readRegionSet(user, photoId);
  await noteInspectionOpened(user, photo.unit.id);
  return Response.json(regionSet);
});

/**
 * Saves the whole region set: `{ baseVersion, regions }`. 200 with the new version; 409 with
 * `current` (version and regions) when someone saved since `baseVersion`; 400 with the
 * validation sentences (nothing stored); 409 while another person's lease on the unit runs.
 */
export const PUT = handler({ permission: "regions.edit" }, async (req, ctx: RouteContext<"/api/photos/[id]/regions">, user) => {
  const photoId = parseId((await ctx.params).id, "That photo");
  const input = await parseJson(req, saveRegionsSchema, { maxBytes: REGION_SAVE_MAX_BYTES });
  try {
    return Response.json(await saveRegionSet(user, photoId, input));
  } catch (err) {
    if (!(err instanceof RegionVersionConflict)) throw err;
    return Response.json({ error: { code: err.code, message: err.message }, current: err.current }, { status: 409 });
  }
});
