import "server-only";
import type { DbOrTx } from "@/db/client";
import { loadLotEvidence } from "@/db/queries/lots";
import type { StoredSamplingPlan } from "@/db/schema/lots";
import type { Rule } from "@/lib/grading/rubric-schema";
import { cosmeticNonconformities } from "./cosmetic";
import { unitFindings } from "./findings";
import type { PromisedGrade } from "./schemas";
import { lotVerdict, type FindingDefect, type LotVerdict } from "./verdict";

export type LotForProgress = { id: string; partTypeId: string; promisedGrade: PromisedGrade; plan: StoredSamplingPlan; checklistItemIds: string[] };
export type LotProgress = {
  unitsCreated: number;
  verdict: LotVerdict;
  /** The part type has a published rubric: units are inspected once graded, and grades count. */
  cosmeticGrading: boolean;
  /** Per unit id, what it counts as (failed checklist items and cosmetic nonconformities). */
  defectsByUnit: Map<string, FindingDefect[]>;
};

/** Running verdicts of several lots from their units, checklist results and current grades. */
export async function lotProgress(workspaceId: string, lotList: readonly LotForProgress[], tx?: DbOrTx): Promise<Map<string, LotProgress>> {
  const evidence = await loadLotEvidence({ workspaceId, lotIds: lotList.map((l) => l.id) }, tx);
  const gradeByUnit = new Map(evidence.grades.map((g) => [g.unitId, g]));
  const progress = new Map<string, LotProgress>();
  for (const lot of lotList) {
    const lotUnits = evidence.units.filter((u) => u.lotId === lot.id);
    const unitIds = new Set(lotUnits.map((u) => u.id));
    const cosmeticDefects = new Map<string, FindingDefect[]>();
    for (const unit of lotUnits) {
      const grade = gradeByUnit.get(unit.id);
      if (!grade) continue;
      const rules = new Map<string, Rule>((evidence.rubricRules.get(grade.rubricVersionId) ?? []).map((rule) => [rule.id, rule]));
      cosmeticDefects.set(unit.id, cosmeticNonconformities(lot.promisedGrade, { ...grade, rules }));
    }
    const cosmeticGrading = evidence.gradedPartTypeIds.has(lot.partTypeId);
    const findings = unitFindings({ units: lotUnits, results: evidence.results.filter((r) => unitIds.has(r.unitId)), checklistItemIds: lot.checklistItemIds, cosmeticGrading, cosmeticDefects });
    progress.set(lot.id, {
      unitsCreated: lotUnits.length,
      verdict: lotVerdict(lot.plan, findings),
      cosmeticGrading,
      defectsByUnit: new Map(findings.map((f) => [f.unitId, f.defects])),
    });
  }
  return progress;
}

export async function oneLotProgress(workspaceId: string, lot: LotForProgress, tx?: DbOrTx): Promise<LotProgress> {
  return (await lotProgress(workspaceId, [lot], tx)).get(lot.id)!;
}

/** The progress input of a lot row as db/queries/lots.ts returns it. */
export const progressInput = (row: { lot: Omit<LotForProgress, "checklistItemIds">; checklistItemIds: string[] }): LotForProgress => ({
  id: row.lot.id,
  partTypeId: row.lot.partTypeId,
  promisedGrade: row.lot.promisedGrade,
  plan: row.lot.plan,
  checklistItemIds: row.checklistItemIds,
});
