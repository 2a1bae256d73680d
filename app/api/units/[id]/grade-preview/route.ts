import { gradePreview } from "@/lib/grading/grades";
import { gradePreviewQuerySchema } from "@/lib/grading/schemas";
import { requireUnit } from "@/lib/grading/unit-grading";
import { handler, parseQuery } from "@/lib/http/route";
import { parseId } from "@/lib/validation";
import { noteInspectionOpened } from "@/lib/recheck/openings";

/** ?rubricVersion=N: what version N (default: the latest published) would grade the unit; stores nothing. */
export const GET = handler({ permission: "inspection.read" }, async (req, ctx: RouteContext<"/api/units/[id]/grade-preview">, user) => {
  const unitId = parseId((await ctx.params).id, "That unit");
  await requireUnit(user, unitId);
  const { rubricVersion } = parseQuery(req, gradePreviewQuerySchema);
  const preview = await gradePreview(user, unitId, rubricVersion);
  await noteInspectionOpened(user, unitId);
  return Response.json(preview);
});
