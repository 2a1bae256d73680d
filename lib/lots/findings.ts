/**
 * Turns a lot's units and their checklist results into the findings the verdict counts. Pure.
 *
 * A unit counts as inspected when its functional checklist is complete (every current item has a
 * result) or it has been graded (status graded, in recheck or final). The Bench issue adds
 * cosmetic grading: it should then require a grade too and pass the unit's cosmetic defects (their
 * classes' severities) in `cosmeticDefects`.
 */
import type { DefectSeverity, UnitStatus } from "@/db/schema/lots";
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
  cosmeticDefects?: ReadonlyMap<string, FindingDefect[]>;
}): UnitFinding[] {
  const byUnit = new Map<string, FindingResult[]>();
  for (const r of input.results) byUnit.set(r.unitId, [...(byUnit.get(r.unitId) ?? []), r]);
  return input.units.map((unit) => {
    const results = byUnit.get(unit.id) ?? [];
    // Failures of items since removed from the checklist still count: they were found.
    const functional: FindingDefect[] = results.filter((r) => !r.passed).map((r) => ({ severity: r.severityOnFail, source: "functional", label: r.itemId }));
    return {
      unitId: unit.id,
      sampleIndex: unit.sampleIndex,
      inspected: GRADED.includes(unit.status) || checklistComplete(input.checklistItemIds, results),
      defects: [...functional, ...(input.cosmeticDefects?.get(unit.id) ?? [])],
    };
  });
}
