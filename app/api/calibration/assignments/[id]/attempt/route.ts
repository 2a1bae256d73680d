import { openAttempt } from "@/lib/calibration/attempts";
import { handler } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** Start the assignment's attempt, or resume the one started: `{ attemptId }`. */
export const POST = handler({ permission: "calibration.take" }, async (_req, ctx: RouteContext<"/api/calibration/assignments/[id]/attempt">, user) => {
  return Response.json(await openAttempt(user, parseId((await ctx.params).id, "That calibration assignment")));
});
