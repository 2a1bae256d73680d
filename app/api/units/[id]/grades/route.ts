import { gradeHistory, recordGrade } from "@/lib/grading/grades";
import { recordGradeSchema } from "@/lib/grading/schemas";
import { requireUnit } from "@/lib/grading/unit-grading";
import { handler, parseJson } from "@/lib/http/route";
import { parseId } from "@/lib/validation";
import { noteInspectionOpened } from "@/lib/recheck/openings";

/** The unit's append-only grade history, oldest first, and its current grade. */
export const GET = handler({ permission: "inspection.read" }, async (_req, ctx: RouteContext<"/api/units/[id]/grades">, user) => {
  const unitId = parseId((await ctx.params).id, "That unit");
  const history = await gradeHistory(user, unitId);
  await noteInspectionOpened(user, unitId);
  return Response.json(history);
});

/**
 * Accepts the current measurement's proposed grade or overrides it with a reason (201). A graded
 * unit takes only a lead's override naming the grade it replaces (`expectedCurrentGradeId`; 409
 * when that is no longer current). A repeat with the same `idempotencyKey` answers 200 with the
 * row the first request made.
 */
export const POST = handler({ permission: "grades.record" }, async (req, ctx: RouteContext<"/api/units/[id]/grades">, user) => {
  const unitId = parseId((await ctx.params).id, "That unit");
  await requireUnit(user, unitId);
  const input = await parseJson(req, recordGradeSchema);
  const { grade, replayed } = await recordGrade(user, unitId, input);
  return Response.json({ grade, replayed }, { status: replayed ? 200 : 201 });
});
