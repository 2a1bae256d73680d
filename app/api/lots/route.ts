import { requireUser } from "@/lib/auth/require-user";
import { handler, parseJson, parseQuery } from "@/lib/http/route";
import { lotPage } from "@/lib/lots/list";
import { createLot } from "@/lib/lots/lots";
import { lotCreateSchema, lotListQuerySchema } from "@/lib/lots/schemas";
import { screenByHref } from "@/lib/nav";

const LOTS_ROLES = screenByHref("/lots")!.roles;

/** One page of lots, sorted and filtered on the server. */
export const GET = handler(async (req) => {
  const user = await requireUser({ role: LOTS_ROLES });
  return Response.json(await lotPage({ workspaceId: user.workspaceId, query: parseQuery(req, lotListQuerySchema) }));
});

export const POST = handler(async (req) => {
  const user = await requireUser({ role: "lead" });
  const input = await parseJson(req, lotCreateSchema);
  return Response.json({ lot: await createLot(user, input) }, { status: 201 });
});
