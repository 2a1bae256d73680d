import { getLot } from "@/db/queries/lots";
import { requireUser } from "@/lib/auth/require-user";
import { notFound } from "@/lib/errors";
import { handler } from "@/lib/http/route";
import { lotSummary } from "@/lib/lots/dto";
import { oneLotProgress } from "@/lib/lots/progress";
import { switchingStateFor } from "@/lib/lots/scheme";
import { screenByHref } from "@/lib/nav";
import { parseId } from "@/lib/validation";

/** The lot with its stored plan, running verdict per class, and where switching stands for the next lot. */
export const GET = handler(async (_req, ctx: RouteContext<"/api/lots/[id]">) => {
  const user = await requireUser({ role: screenByHref("/lots")!.roles });
  const id = parseId((await ctx.params).id, "That lot");
  const row = await getLot({ workspaceId: user.workspaceId, lotId: id });
  if (!row) throw notFound("That lot");
  const progress = await oneLotProgress(user.workspaceId, { id, plan: row.lot.plan, checklistItemIds: row.checklistItemIds });
  const next = await switchingStateFor({ workspaceId: user.workspaceId, supplierId: row.lot.supplierId, partTypeId: row.lot.partTypeId });
  return Response.json({
    lot: { ...lotSummary(row, progress), plan: row.lot.plan, sampleDraw: row.lot.sampleDraw, dispositionReason: row.lot.dispositionReason, decidedAt: row.lot.decidedAt, decisionCounts: row.lot.decisionCounts },
    verdict: progress.verdict,
    nextLot: { severity: next.state.severity, reason: next.state.reason, progress: next.state.progress, discontinued: next.state.discontinued },
  });
});
