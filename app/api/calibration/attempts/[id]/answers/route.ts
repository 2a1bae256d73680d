import { saveItemAnswer } from "@/lib/calibration/attempts";
import { saveAnswerSchema } from "@/lib/calibration/schemas";
import { handler, parseJson } from "@/lib/http/route";
import { REGION_SAVE_MAX_BYTES } from "@/lib/regions/schemas";
import { parseId } from "@/lib/validation";

/** Save one item's answer (`{ position, grade, regions }`) while the attempt is in progress. */
export const PUT = handler({ permission: "calibration.take" }, async (req, ctx: RouteContext<"/api/calibration/attempts/[id]/answers">, user) => {
  const attemptId = parseId((await ctx.params).id, "That calibration attempt");
  const { position, ...input } = await parseJson(req, saveAnswerSchema, { maxBytes: REGION_SAVE_MAX_BYTES });
  return Response.json(await saveItemAnswer(user, attemptId, position, input));
});
