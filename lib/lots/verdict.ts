/**
 * The running verdict of a lot from its units' findings against the stored plan. Pure.
 *
 * Counting (decision, shown on the lot page):
 * - "Defectives per severity" counts units, not defects: a unit counts at most once per severity,
 *   when it has at least one defect of that severity: a failed checklist item, or a cosmetic
 *   nonconformity (its grade worse than the lot's promised grade, lib/lots/cosmetic.ts). A unit
 *   with a critical and a major defect counts once in each class. ISO 2859-1's note on classes of nonconforming items files an item under its
 *   most serious class only (from memory, b); counting per class can only raise each count, so it
 *   never accepts a lot that the stricter reading would reject. (c) common practice.
 * - Each class counts the units within its own sample (sample order 1..n of its plan). Defects a
 *   unit outside that range shows are reported as `foundOutsideSample`, not counted.
 * - A defect counts as soon as it is recorded, even before the unit's inspection is complete:
 *   found >= Re rejects at once (the count can only grow). Accepting needs every unit of the
 *   class's sample inspected and found <= Ac; with a reduced plan's gap (Ac < found < Re) the lot is
 *   accepted and normal inspection is reinstated (judgeLot, Z1.4 §10.1.4).
 */
import type { LotDecisionCounts, StoredSamplingPlan } from "@/db/schema/lots";
import { judgeLot } from "@/lib/sampling/iso2859";
import { DEFECT_SEVERITIES, type DefectSeverity } from "@/lib/part-types/severity";

export type FindingDefect = { severity: DefectSeverity; source?: "functional" | "cosmetic"; label?: string };
export type UnitFinding = {
  unitId: string;
  /** 1-based position in the sample order. */
  sampleIndex: number;
  /** Every check the unit needs is done (see lib/lots/findings.ts). */
  inspected: boolean;
  defects: FindingDefect[];
};

export type VerdictStatus = "accept" | "reject" | "pending";
export type ClassVerdict = {
  severity: DefectSeverity;
  aql: number | null;
  sampleSize: number;
  accept: number;
  reject: number;
  inspected: number;
  found: number;
  foundOutsideSample: number;
  status: VerdictStatus;
  /** Accepted in a reduced plan's gap: the next lot goes back to normal inspection. */
  reinstateNormal: boolean;
};
export type LotVerdict = {
  verdict: VerdictStatus;
  reinstateNormal: boolean;
  unitsToInspect: number;
  unitsInspected: number;
  classes: Record<DefectSeverity, ClassVerdict>;
  summary: string;
};

type PlanPart = Pick<StoredSamplingPlan, "sampleSize" | "byDefectSeverity">;

function validate(plan: PlanPart, findings: readonly UnitFinding[]) {
  const ids = new Set<string>();
  const indexes = new Set<number>();
  for (const f of findings) {
    if (ids.has(f.unitId)) throw new Error(`unit ${f.unitId} appears twice in the findings`);
    if (!Number.isInteger(f.sampleIndex) || f.sampleIndex < 1 || f.sampleIndex > plan.sampleSize) {
      throw new Error(`unit ${f.unitId} has sample position ${f.sampleIndex}, outside 1..${plan.sampleSize}`);
    }
    if (indexes.has(f.sampleIndex)) throw new Error(`two units share sample position ${f.sampleIndex}`);
    ids.add(f.unitId);
    indexes.add(f.sampleIndex);
  }
}

function judgeClass(plan: PlanPart, severity: DefectSeverity, findings: readonly UnitFinding[]): ClassVerdict {
  const entry = plan.byDefectSeverity[severity];
  let inspected = 0;
  let found = 0;
  let foundOutsideSample = 0;
  for (const f of findings) {
    const has = f.defects.some((d) => d.severity === severity);
    if (f.sampleIndex > entry.sampleSize) {
      if (has) foundOutsideSample += 1;
      continue;
    }
    if (f.inspected) inspected += 1;
    if (has) found += 1;
  }
  let status: VerdictStatus = "pending";
  let reinstateNormal = false;
  if (found >= entry.reject) status = "reject";
  else if (inspected >= entry.sampleSize) {
    const judgement = judgeLot(entry, found);
    status = judgement === "not-accepted" ? "reject" : "accept";
    reinstateNormal = judgement === "accept-reinstate-normal";
  }
  return { severity, aql: entry.aql, sampleSize: entry.sampleSize, accept: entry.accept, reject: entry.reject, inspected, found, foundOutsideSample, status, reinstateNormal };
}

export function lotVerdict(plan: PlanPart, findings: readonly UnitFinding[]): LotVerdict {
  validate(plan, findings);
  const classes = Object.fromEntries(DEFECT_SEVERITIES.map((s) => [s, judgeClass(plan, s, findings)])) as Record<DefectSeverity, ClassVerdict>;
  const list = DEFECT_SEVERITIES.map((s) => classes[s]);
  const rejected = list.filter((c) => c.status === "reject");
  const verdict: VerdictStatus = rejected.length ? "reject" : list.every((c) => c.status === "accept") ? "accept" : "pending";
  const reinstateNormal = verdict === "accept" && list.some((c) => c.reinstateNormal);
  const unitsInspected = findings.filter((f) => f.inspected).length;

  let summary: string;
  if (verdict === "reject") {
    summary = `Reject: ${rejected.map((c) => `${c.found} ${c.severity} defective${c.found === 1 ? "" : "s"} in the first ${c.sampleSize} units reach${c.found === 1 ? "es" : ""} Re ${c.reject}`).join("; ")}.`;
  } else if (verdict === "accept") {
    summary = reinstateNormal ? "Accept, with a count between Ac and Re on reduced inspection: the next lot returns to normal inspection." : "Accept: every class is within its acceptance number.";
  } else {
    summary = `Pending: ${unitsInspected} of ${plan.sampleSize} units inspected; no class has reached its rejection number.`;
  }
  return { verdict, reinstateNormal, unitsToInspect: plan.sampleSize, unitsInspected, classes, summary };
}

/**
 * A decided lot shows the verdict and the counts its decision rested on (stored with it), never a
 * recount under a later rule: history is not rewritten. Classes are judged on those counts.
 */
export function decidedVerdictView(plan: PlanPart, decided: { verdict: "accept" | "reject"; counts: LotDecisionCounts }, live: LotVerdict): LotVerdict {
  const classes = { ...live.classes };
  for (const severity of DEFECT_SEVERITIES) {
    const entry = plan.byDefectSeverity[severity];
    const { found, inspected } = decided.counts[severity];
    const judgement = judgeLot(entry, found);
    classes[severity] = {
      ...classes[severity],
      found,
      inspected,
      foundOutsideSample: 0,
      status: judgement === "not-accepted" ? "reject" : "accept",
      reinstateNormal: judgement === "accept-reinstate-normal",
    };
  }
  const summary = `Decided: ${decided.verdict}, on the counts recorded with the decision.`;
  return { ...live, verdict: decided.verdict, reinstateNormal: DEFECT_SEVERITIES.some((s) => classes[s].reinstateNormal), classes, summary };
}
