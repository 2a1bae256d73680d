import "server-only";
import { listLots } from "@/db/queries/lots";
import { lotSummary } from "./dto";
import { lotProgress, progressInput } from "./progress";
import type { LotListQuery } from "./schemas";

/** One page of the Lots list as GET /api/lots sends it; the Lots page renders the first one on the server with it. */
export async function lotPage({ workspaceId, query }: { workspaceId: string; query: LotListQuery }) {
  const { rows, total } = await listLots({ workspaceId, query });
  const progress = await lotProgress(workspaceId, rows.map(progressInput));
  return { lots: rows.map((r) => lotSummary(r, progress.get(r.lot.id)!)), total, page: query.page, pageSize: query.pageSize };
}
export type LotPage = Awaited<ReturnType<typeof lotPage>>;
