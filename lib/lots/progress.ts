import "server-only";
import { db, type DbOrTx } from "@/db/client";
import { loadLotEvidence } from "@/db/queries/lots";
import type { StoredSamplingPlan } from "@/db/schema/lots";
import { unitFindings } from "./findings";
import { lotVerdict, type LotVerdict } from "./verdict";

export type LotForProgress = { id: string; plan: StoredSamplingPlan; checklistItemIds: string[] };
export type LotProgress = { unitsCreated: number; verdict: LotVerdict };

/** Running verdicts of several lots from their units and checklist results (one query each). */
export async function lotProgress(workspaceId: string, lotList: readonly LotForProgress[], tx: DbOrTx = db()): Promise<Map<string, LotProgress>> {
  const evidence = await loadLotEvidence({ workspaceId, lotIds: lotList.map((l) => l.id) }, tx);
  const progress = new Map<string, LotProgress>();
  for (const lot of lotList) {
    const lotUnits = evidence.units.filter((u) => u.lotId === lot.id);
    const unitIds = new Set(lotUnits.map((u) => u.id));
    const findings = unitFindings({ units: lotUnits, results: evidence.results.filter((r) => unitIds.has(r.unitId)), checklistItemIds: lot.checklistItemIds });
    progress.set(lot.id, { unitsCreated: lotUnits.length, verdict: lotVerdict(lot.plan, findings) });
  }
  return progress;
}

export async function oneLotProgress(workspaceId: string, lot: LotForProgress, tx: DbOrTx = db()): Promise<LotProgress> {
  return (await lotProgress(workspaceId, [lot], tx)).get(lot.id)!;
}
