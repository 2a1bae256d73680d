import { listLots } from "@/db/queries/lots";
import { requireUser } from "@/lib/auth/require-user";
import { handler, parseJson, parseQuery } from "@/lib/http/route";
import { lotSummary } from "@/lib/lots/dto";
import { createLot } from "@/lib/lots/lots";
import { lotProgress, progressInput } from "@/lib/lots/progress";
import { lotCreateSchema, lotListQuerySchema } from "@/lib/lots/schemas";
import { screenByHref } from "@/lib/nav";

const LOTS_ROLES = screenByHref("/lots")!.roles;

/** One page of lots, sorted and filtered on the server. */
export const GET = handler(async (req) => {
  const user = await requireUser({ role: LOTS_ROLES });
  const query = parseQuery(req, lotListQuerySchema);
  const { rows, total } = await listLots({ workspaceId: user.workspaceId, query });
  const progress = await lotProgress(user.workspaceId, rows.map(progressInput));
  return Response.json({ lots: rows.map((r) => lotSummary(r, progress.get(r.lot.id)!)), total, page: query.page, pageSize: query.pageSize });
});

export const POST = handler(async (req) => {
  const user = await requireUser({ role: "lead" });
  const input = await parseJson(req, lotCreateSchema);
  return Response.json({ lot: await createLot(user, input) }, { status: 201 });
});
