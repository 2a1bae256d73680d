import { getLot } from "@/db/queries/lots";
import { listLotUnits } from "@/db/queries/units";
import { notFound } from "@/lib/errors";
import { unitsForReader } from "@/lib/lots/blind-units";
import { handler, parseJson } from "@/lib/http/route";
import { MAX_SERIAL_LIST_BYTES, unitsCreateSchema } from "@/lib/units/schemas";
import { createLotUnits } from "@/lib/units/units";
import { parseId } from "@/lib/validation";

export const GET = handler({ permission: "lots.read" }, async (_req, ctx: RouteContext<"/api/lots/[id]/units">, user) => {
  const id = parseId((await ctx.params).id, "That lot");
  if (!(await getLot({ workspaceId: user.workspaceId, lotId: id }))) throw notFound("That lot");
  return Response.json({ units: unitsForReader(await listLotUnits({ workspaceId: user.workspaceId, lotId: id }), user) });
});

/** Creates the lot's sample once: drawn from a pasted/uploaded serial list, or numbered placeholders. */
export const POST = handler({ permission: "lots.manage" }, async (req, ctx: RouteContext<"/api/lots/[id]/units">, user) => {
  const id = parseId((await ctx.params).id, "That lot");
  const input = await parseJson(req, unitsCreateSchema, { maxBytes: MAX_SERIAL_LIST_BYTES });
  return Response.json(await createLotUnits(user, id, input), { status: 201 });
});
