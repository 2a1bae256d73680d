/**
 * Builds the switching-rule input (lib/sampling/switching.ts) from a supplier + part type's
 * decided lots, oldest decision first. Pure. Lots are named by purchase reference (with "#n" when
 * a reference repeats), because the rules' reasons name lots and people read them on the page.
 */
import type { LotDecisionCounts, StoredSamplingPlan } from "@/db/schema/lots";
import type { DecidedLot, SwitchingInput } from "@/lib/sampling/switching";
import { DEFECT_SEVERITIES } from "@/lib/part-types/severity";

export type DecidedLotRow = {
  id: string;
  purchaseRef: string;
  inspectionSeverity: "normal" | "tightened" | "reduced";
  verdict: "accept" | "reject" | null;
  plan: StoredSamplingPlan;
  decisionCounts: LotDecisionCounts | null;
};

export function decidedLotForSwitching(lot: DecidedLotRow, label: string = lot.purchaseRef): DecidedLot {
  if (!lot.verdict || !lot.decisionCounts) throw new Error(`lot ${lot.id} is not decided`);
  const counts = lot.decisionCounts;
  return {
    lotId: label,
    severity: lot.inspectionSeverity,
    accepted: lot.verdict === "accept",
    classes: DEFECT_SEVERITIES.map((severity) => {
      const entry = lot.plan.byDefectSeverity[severity];
      return {
        defectClass: severity,
        ...(entry.aql === null ? {} : { aql: entry.aql, planLetter: entry.planLetter as DecidedLot["classes"][number]["planLetter"] }),
        accept: entry.accept,
        reject: entry.reject,
        found: counts[severity].found,
      };
    }),
  };
}

export function switchingInputFor(decided: readonly DecidedLotRow[], scheme: { reducedAllowed: boolean; steadyProduction: boolean; resumedAfterLotIds: string[] } | null): SwitchingInput {
  const labels = lotLabels(decided);
  return {
    history: decided.map((lot) => decidedLotForSwitching(lot, labels.get(lot.id))),
    reducedAllowed: scheme?.reducedAllowed ?? false,
    steadyProduction: scheme?.steadyProduction ?? true,
    // Stored as lot ids; the rules see the same labels as the history.
    resumedAfterLotIds: (scheme?.resumedAfterLotIds ?? []).map((id) => labels.get(id) ?? id),
  };
}

/** Lot id → purchase reference, made unique with " #2", " #3" … in decision order. */
export function lotLabels(decided: readonly Pick<DecidedLotRow, "id" | "purchaseRef">[]): Map<string, string> {
  const seen = new Map<string, number>();
  const labels = new Map<string, string>();
  for (const lot of decided) {
    const n = (seen.get(lot.purchaseRef) ?? 0) + 1;
    seen.set(lot.purchaseRef, n);
    labels.set(lot.id, n === 1 ? lot.purchaseRef : `${lot.purchaseRef} #${n}`);
  }
  return labels;
}
