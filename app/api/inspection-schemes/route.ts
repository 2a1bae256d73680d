import { requireUser } from "@/lib/auth/require-user";
import { handler, parseJson, parseQuery } from "@/lib/http/route";
import { assertPair, switchingStateFor, updateScheme } from "@/lib/lots/scheme";
import { schemeQuerySchema, schemeUpdateSchema } from "@/lib/lots/schemas";
import { screenByHref } from "@/lib/nav";

/** Where the switching rules stand for the next lot of a supplier + part type, and the lead's settings. */
export const GET = handler(async (req) => {
  const user = await requireUser({ role: screenByHref("/lots")!.roles });
  const { supplierId, partTypeId } = parseQuery(req, schemeQuerySchema);
  const pair = { workspaceId: user.workspaceId, supplierId, partTypeId };
  await assertPair(pair);
  return Response.json(await switchingStateFor(pair));
});

export const PUT = handler(async (req) => {
  const user = await requireUser({ role: "lead" });
  const input = await parseJson(req, schemeUpdateSchema);
  return Response.json(await updateScheme(user, input));
});
