import { z } from "zod";
import { measureAnswer } from "@/lib/calibration/measure-answer";
import { positionSchema } from "@/lib/calibration/schemas";
import { handler, parseQuery } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

const measurementQuerySchema = z.strictObject({ position: positionSchema });

/** The taker's saved regions of one item (`?position=`) measured, with the current published rubric's proposal: the Bench's numbers, nothing of the key. */
export const GET = handler({ permission: "calibration.take" }, async (req, ctx: RouteContext<"/api/calibration/attempts/[id]/measurement">, user) => {
  const attemptId = parseId((await ctx.params).id, "That calibration attempt");
  const { position } = parseQuery(req, measurementQuerySchema);
  return Response.json({ measurement: await measureAnswer(user, attemptId, position) });
});
