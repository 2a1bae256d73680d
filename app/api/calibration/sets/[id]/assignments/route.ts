import { assignSetSchema } from "@/lib/calibration/schemas";
import { assignSet } from "@/lib/calibration/sets";
import { handler, parseJson } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** Assign the set to people with a due date (`{ userIds, dueOn }`); assigning again moves the date. */
export const POST = handler({ permission: "calibration.manage" }, async (req, ctx: RouteContext<"/api/calibration/sets/[id]/assignments">, user) => {
  const setId = parseId((await ctx.params).id, "That calibration set");
  return Response.json(await assignSet(user, setId, await parseJson(req, assignSetSchema)));
});
