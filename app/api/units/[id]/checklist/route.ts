import { recordChecklistResult } from "@/lib/checklist/record";
import { handler, parseJson } from "@/lib/http/route";
import { checklistRecordSchema } from "@/lib/units/schemas";
import { parseId } from "@/lib/validation";

/** Records one checklist item's result; the server decides pass or fail against the item's limits. */
export const POST = handler({ permission: "units.record" }, async (req, ctx: RouteContext<"/api/units/[id]/checklist">, user) => {
  const id = parseId((await ctx.params).id, "That unit");
  const input = await parseJson(req, checklistRecordSchema);
  return Response.json({ result: await recordChecklistResult(user, id, input) });
});
