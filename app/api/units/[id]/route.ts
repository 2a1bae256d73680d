import { getUnitDetail, listUnitResults } from "@/db/queries/units";
import { notFound } from "@/lib/errors";
import { handler, parseJson } from "@/lib/http/route";
import { toUnitView } from "@/lib/units/dto";
import { unitUpdateSchema } from "@/lib/units/schemas";
import { setUnitSerial } from "@/lib/units/units";
import { parseId } from "@/lib/validation";
import { noteInspectionOpened } from "@/lib/recheck/openings";

/** The unit with its lot, part type checklist and recorded results (what the Bench shows; not for auditors). */
export const GET = handler({ permission: "inspection.read" }, async (_req, ctx: RouteContext<"/api/units/[id]">, user) => {
  const id = parseId((await ctx.params).id, "That unit");
  const detail = await getUnitDetail({ workspaceId: user.workspaceId, unitId: id });
  if (!detail) throw notFound("That unit");
  const results = await listUnitResults({ workspaceId: user.workspaceId, unitIds: [id] });
  await noteInspectionOpened(user, id);
  return Response.json(toUnitView(detail, results));
});

/** Sets a placeholder unit's serial. */
export const PATCH = handler({ permission: "units.record" }, async (req, ctx: RouteContext<"/api/units/[id]">, user) => {
  const id = parseId((await ctx.params).id, "That unit");
  const { serial } = await parseJson(req, unitUpdateSchema);
  return Response.json({ unit: await setUnitSerial(user, id, serial) });
});
