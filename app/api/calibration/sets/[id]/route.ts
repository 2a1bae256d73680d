import { readSetForTrainer } from "@/lib/calibration/sets";
import { handler } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** The set with its key, its assignments, every submitted attempt and the items most people get wrong (trainers). */
export const GET = handler({ permission: "calibration.manage" }, async (_req, ctx: RouteContext<"/api/calibration/sets/[id]">, user) => {
  return Response.json(await readSetForTrainer(user, parseId((await ctx.params).id, "That calibration set")));
});
