import { readAttempt } from "@/lib/calibration/attempts";
import { handler } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** One's attempt: the items and one's answers (nothing of the key) until submitted; then the key and the score. */
export const GET = handler({ permission: "calibration.take" }, async (_req, ctx: RouteContext<"/api/calibration/attempts/[id]">, user) => {
  return Response.json({ attempt: await readAttempt(user, parseId((await ctx.params).id, "That calibration attempt")) });
});
