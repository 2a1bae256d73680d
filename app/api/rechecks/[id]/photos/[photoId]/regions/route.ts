import { handler, parseJson } from "@/lib/http/route";
import { saveRecheckRegions } from "@/lib/recheck/recheck-regions";
import { REGION_SAVE_MAX_BYTES, saveRegionsSchema } from "@/lib/regions/schemas";
import { parseId } from "@/lib/validation";

/** Saves the auditor's own regions on one photo of the recheck (`{ baseVersion, regions }`; 409 when the version moved). */
export const PUT = handler({ permission: "recheck.perform" }, async (req, ctx: RouteContext<"/api/rechecks/[id]/photos/[photoId]/regions">, user) => {
  const params = await ctx.params;
  const recheckId = parseId(params.id, "That recheck");
  const photoId = parseId(params.photoId, "That photo");
  const input = await parseJson(req, saveRegionsSchema, { maxBytes: REGION_SAVE_MAX_BYTES });
  return Response.json(await saveRecheckRegions(user, recheckId, photoId, input));
});
