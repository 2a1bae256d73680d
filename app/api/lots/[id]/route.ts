import { getLot } from "@/db/queries/lots";
import { notFound } from "@/lib/errors";
import { handler } from "@/lib/http/route";
import { lotSummary } from "@/lib/lots/dto";
import { oneLotProgress, progressInput } from "@/lib/lots/progress";
import { switchingStateFor } from "@/lib/lots/scheme";
import { decidedVerdictView } from "@/lib/lots/verdict";
import { parseId } from "@/lib/validation";

/** The lot with its stored plan, running verdict per class, what each unit counts as, and where switching stands for the next lot. */
export const GET = handler({ permission: "lots.read" }, async (_req, ctx: RouteContext<"/api/lots/[id]">, user) => {
  const id = parseId((await ctx.params).id, "That lot");
  const row = await getLot({ workspaceId: user.workspaceId, lotId: id });
  if (!row) throw notFound("That lot");
  const progress = await oneLotProgress(user.workspaceId, progressInput(row));
  const next = await switchingStateFor({ workspaceId: user.workspaceId, supplierId: row.lot.supplierId, partTypeId: row.lot.partTypeId });
  return Response.json({
    lot: {
      ...lotSummary(row, progress),
      plan: row.lot.plan,
      sampleDraw: row.lot.sampleDraw,
      dispositionReason: row.lot.dispositionReason,
      decidedAt: row.lot.decidedAt,
      decisionCounts: row.lot.decisionCounts,
    },
    // A decided lot answers with the verdict and counts its decision stored (lib/lots/verdict.ts).
    verdict:
      row.lot.status === "decided" && row.lot.verdict && row.lot.decisionCounts
        ? decidedVerdictView(row.lot.plan, { verdict: row.lot.verdict, counts: row.lot.decisionCounts }, progress.verdict)
        : progress.verdict,
    cosmeticGrading: progress.cosmeticGrading,
    /** What each unit counts as (failed items and cosmetic nonconformities), for units that count at all. */
    unitDefects: Object.fromEntries([...progress.defectsByUnit].filter(([, defects]) => defects.length > 0)),
    nextLot: { severity: next.state.severity, reason: next.state.reason, progress: next.state.progress, discontinued: next.state.discontinued },
  });
});
