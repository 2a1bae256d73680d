import { handler, parseJson, parseQuery } from "@/lib/http/route";
import { lotPage } from "@/lib/lots/list";
import { createLot } from "@/lib/lots/lots";
import { lotCreateSchema, lotListQuerySchema } from "@/lib/lots/schemas";

/** One page of lots, sorted and filtered on the server. */
export const GET = handler({ permission: "lots.read" }, async (req, _ctx, user) => {
  return Response.json(await lotPage({ workspaceId: user.workspaceId, query: parseQuery(req, lotListQuerySchema) }));
});

export const POST = handler({ permission: "lots.manage" }, async (req, _ctx, user) => {
  const input = await parseJson(req, lotCreateSchema);
  return Response.json({ lot: await createLot(user, input) }, { status: 201 });
});
