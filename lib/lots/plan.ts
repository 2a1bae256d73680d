/**
 * The sampling plan stored with a lot: one ISO 2859-1 single sampling plan per defect severity
 * (critical, major, minor), from the lot size, inspection level, AQLs and the inspection severity
 * the switching rules gave. Pure; the form previews it and the server stores it.
 *
 * Decisions (documented on the lot page too):
 * - Critical with no AQL ("0") means zero acceptance: Ac 0 / Re 1, judged on every inspected unit
 *   — any critical defect rejects the lot. (c) common practice.
 * - Units to inspect = the largest sample among the classes (the lot size when the part type is
 *   inspected 100 % or a plan's sample reaches the lot size — ISO 2859-1 table footnote, a).
 * - Each class with an AQL is judged on its own plan: the first n units of the sample order, where
 *   n is that plan's sample size (capped at the lot size). The draw order is random, so those n are
 *   a random sample and the plan's Ac/Re keep their meaning. Parts inspected 100 % are sorted unit
 *   by unit; their lot verdict still uses each class's own n, so it means the same as for sampled lots.
 */
import type { StoredSamplingPlan } from "@/db/schema/lots";
import type { DefectSeverity } from "@/lib/part-types/severity";
import { singleSamplingPlan, type InspectionLevel, type InspectionSeverity } from "@/lib/sampling/iso2859";

export type LotAqls = { critical: number | null; major: number; minor: number };
export const DEFAULT_AQLS: LotAqls = { critical: null, major: 1.0, minor: 2.5 };
export const DEFAULT_LEVEL: InspectionLevel = "II";

export type LotPlanInput = {
  lotSize: number;
  level: InspectionLevel;
  aqls: LotAqls;
  severity: InspectionSeverity;
  inspectAll: boolean;
  switchingReason: string;
  switchingProgress?: string;
};

export function buildLotPlan(input: LotPlanInput): StoredSamplingPlan {
  const { lotSize, level, aqls, severity, inspectAll } = input;
  const plans = {
    major: singleSamplingPlan({ lotSize, level, aql: aqls.major, severity }),
    minor: singleSamplingPlan({ lotSize, level, aql: aqls.minor, severity }),
    critical: aqls.critical === null ? null : singleSamplingPlan({ lotSize, level, aql: aqls.critical, severity }),
  };
  const withAql = [plans.critical, plans.major, plans.minor].filter((p) => p !== null);
  const largest = withAql.reduce((a, b) => (b.sampleSize > a.sampleSize ? b : a));
  const hundredPercent = inspectAll || withAql.some((p) => p.hundredPercent);
  const unitsToInspect = hundredPercent ? lotSize : largest.sampleSize;

  const entry = (aql: number, plan: (typeof withAql)[number]) => ({
    aql,
    codeLetter: plan.codeLetter,
    planLetter: plan.planLetter,
    sampleSize: plan.sampleSize,
    accept: plan.accept,
    reject: plan.reject,
  });
  return {
    standard: "ISO 2859-1 single sampling",
    lotSize,
    level,
    severity,
    sampleSize: unitsToInspect,
    hundredPercent,
    byDefectSeverity: {
      critical: plans.critical
        ? entry(aqls.critical!, plans.critical)
        : { aql: null, codeLetter: largest.codeLetter, planLetter: largest.planLetter, sampleSize: unitsToInspect, accept: 0, reject: 1 },
      major: entry(aqls.major, plans.major),
      minor: entry(aqls.minor, plans.minor),
    },
    switchingReason: input.switchingReason,
    ...(input.switchingProgress ? { switchingProgress: input.switchingProgress } : {}),
  };
}

/** "critical 0 (any rejects)", "major 1.0", "minor 2.5" */
export function aqlLabel(aql: number | null): string {
  if (aql === null) return "0 (any defect rejects)";
  return aql < 1 ? String(aql) : aql.toFixed(1);
}

/** Which units a class is judged on, in words (shown beside the plan). */
export function judgedOnText(plan: StoredSamplingPlan, severity: DefectSeverity): string {
  const entry = plan.byDefectSeverity[severity];
  if (entry.sampleSize >= plan.sampleSize) return plan.hundredPercent ? "every unit of the lot" : "every sampled unit";
  return `the first ${entry.sampleSize} units of the sample order`;
}
