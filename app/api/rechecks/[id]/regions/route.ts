import { handler, parseJson } from "@/lib/http/route";
import { saveRecheckRegions } from "@/lib/recheck/recheck-regions";
import { saveRecheckRegionsSchema } from "@/lib/recheck/schemas";
import { REGION_SAVE_MAX_BYTES } from "@/lib/regions/schemas";
import { parseId } from "@/lib/validation";

/** Saves the auditor's own regions on one photo of the recheck (`{ photoId, baseVersion, regions }`; 409 when the version moved). */
export const PUT = handler({ permission: "recheck.perform" }, async (req, ctx: RouteContext<"/api/rechecks/[id]/regions">, user) => {
  const recheckId = parseId((await ctx.params).id, "That recheck");
  const { photoId, ...input } = await parseJson(req, saveRecheckRegionsSchema, { maxBytes: REGION_SAVE_MAX_BYTES });
  return Response.json(await saveRecheckRegions(user, recheckId, photoId, input));
});
