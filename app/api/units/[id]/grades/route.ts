import { requireUser } from "@/lib/auth/require-user";
import { gradeHistory, recordGrade } from "@/lib/grading/grades";
import { recordGradeSchema } from "@/lib/grading/schemas";
import { requireUnit } from "@/lib/grading/unit-grading";
import { handler, parseJson } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** The unit's append-only grade history, oldest first, and its current grade. */
export const GET = handler(async (_req, ctx: RouteContext<"/api/units/[id]/grades">) => {
  const user = await requireUser();
  const unitId = parseId((await ctx.params).id, "That unit");
  return Response.json(await gradeHistory(user, unitId));
});

/** Accepts the current measurement's proposed grade or overrides it with a reason (201). */
export const POST = handler(async (req, ctx: RouteContext<"/api/units/[id]/grades">) => {
  const user = await requireUser({ role: "inspector" });
  const unitId = parseId((await ctx.params).id, "That unit");
  await requireUnit(user, unitId);
  const input = await parseJson(req, recordGradeSchema);
  return Response.json({ grade: await recordGrade(user, unitId, input) }, { status: 201 });
});
