import { submitAttempt } from "@/lib/calibration/attempts";
import { handler } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** Submit one's attempt: scored against the key and stored; the answer carries the key and the score. */
export const POST = handler({ permission: "calibration.take" }, async (_req, ctx: RouteContext<"/api/calibration/attempts/[id]/submit">, user) => {
  return Response.json({ attempt: await submitAttempt(user, parseId((await ctx.params).id, "That calibration attempt")) });
});
