import { requireUser } from "@/lib/auth/require-user";
import { INSPECTION_READERS } from "@/lib/auth/roles";
import { gradePreview } from "@/lib/grading/grades";
import { gradePreviewQuerySchema } from "@/lib/grading/schemas";
import { requireUnit } from "@/lib/grading/unit-grading";
import { handler, parseQuery } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** ?rubricVersion=N: what version N (default: the latest published) would grade the unit; stores nothing. */
export const GET = handler(async (req, ctx: RouteContext<"/api/units/[id]/grade-preview">) => {
  const user = await requireUser({ role: INSPECTION_READERS });
  const unitId = parseId((await ctx.params).id, "That unit");
  await requireUnit(user, unitId);
  const { rubricVersion } = parseQuery(req, gradePreviewQuerySchema);
  return Response.json(await gradePreview(user, unitId, rubricVersion));
});
