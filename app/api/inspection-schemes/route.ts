import { handler, parseJson, parseQuery } from "@/lib/http/route";
import { assertPair, switchingStateFor, updateScheme } from "@/lib/lots/scheme";
import { schemeQuerySchema, schemeUpdateSchema } from "@/lib/lots/schemas";

/** Where the switching rules stand for the next lot of a supplier + part type, and the lead's settings. */
export const GET = handler({ permission: "lots.read" }, async (req, _ctx, user) => {
  const { supplierId, partTypeId } = parseQuery(req, schemeQuerySchema);
  const pair = { workspaceId: user.workspaceId, supplierId, partTypeId };
  await assertPair(pair);
  return Response.json(await switchingStateFor(pair));
});

export const PUT = handler({ permission: "lots.manage" }, async (req, _ctx, user) => {
  const input = await parseJson(req, schemeUpdateSchema);
  return Response.json(await updateScheme(user, input));
});
