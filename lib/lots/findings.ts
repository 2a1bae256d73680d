/**
 * Turns a lot's units, their checklist results and their grades into the findings the verdict
 * counts. Pure.
 *
 * Inspected: when the part type can be graded cosmetically (it has a published rubric), a unit
 * is inspected once it has a grade (status graded, in recheck or final): until then a cosmetic
 * shortfall could still appear, so the lot cannot be accepted on it. Without a published rubric
 * there is no cosmetic grade to wait for, and a complete functional checklist (every current item
 * has a result) is enough, as before cosmetic grades counted.
 *
 * Defects: every failed checklist item (items since removed from the checklist still count: they
 * were found), plus the unit's cosmetic nonconformities (lib/lots/cosmetic.ts) in `cosmeticDefects`.
 */
import type { UnitStatus } from "@/db/schema/lots";
import type { DefectSeverity } from "@/lib/part-types/severity";
import type { FindingDefect, UnitFinding } from "./verdict";

export type FindingUnit = { id: string; sampleIndex: number; status: UnitStatus };
export type FindingResult = { unitId: string; itemId: string; passed: boolean; severityOnFail: DefectSeverity };

const GRADED: readonly UnitStatus[] = ["graded", "in_recheck", "final"];

export function checklistComplete(itemIds: readonly string[], results: readonly Pick<FindingResult, "itemId">[]): boolean {
  if (itemIds.length === 0) return false;
  const recorded = new Set(results.map((r) => r.itemId));
  return itemIds.every((id) => recorded.has(id));
}

export function unitFindings(input: {
  units: readonly FindingUnit[];
  results: readonly FindingResult[];
  checklistItemIds: readonly string[];
  /** The part type has a published rubric, so units are graded cosmetically. */
  cosmeticGrading: boolean;
  cosmeticDefects?: ReadonlyMap<string, FindingDefect[]>;
}): UnitFinding[] {
  const byUnit = new Map<string, FindingResult[]>();
  for (const r of input.results) byUnit.set(r.unitId, [...(byUnit.get(r.unitId) ?? []), r]);
  return input.units.map((unit) => {
    const results = byUnit.get(unit.id) ?? [];
    const functional: FindingDefect[] = results.filter((r) => !r.passed).map((r) => ({ severity: r.severityOnFail, source: "functional", label: r.itemId }));
    const graded = GRADED.includes(unit.status);
    return {
      unitId: unit.id,
      sampleIndex: unit.sampleIndex,
      inspected: graded || (!input.cosmeticGrading && checklistComplete(input.checklistItemIds, results)),
      defects: [...functional, ...(input.cosmeticDefects?.get(unit.id) ?? [])],
    };
  });
}
