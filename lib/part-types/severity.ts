/**
 * Defect severity: how serious a nonconformity is. A part type gives one to each defect class and
 * each checklist item; lots are sampled and judged per severity class; the Bench orders its class
 * bar by it. The three classes critical / major / minor are the nonconformity classes of
 * acceptance sampling (ISO 2859-1 classifies nonconformities by seriousness; three classes is
 * common practice, see docs/contracts.md "Lot verdict counting").
 *
 * The one home of the list, its type, its labels and its order: everything else imports these
 * (db/ imports the type only, as its lint rule asks). Pure, no imports.
 */

/** Worst first: the order of plans, verdicts, reports and "worst failure". */
export const DEFECT_SEVERITIES = ["critical", "major", "minor"] as const;
export type DefectSeverity = (typeof DEFECT_SEVERITIES)[number];

/** Least severe first: the Bench's class groups and number keys (lib/annotate/class-order.ts). */
export const DEFECT_SEVERITIES_MILDEST_FIRST: readonly DefectSeverity[] = [...DEFECT_SEVERITIES].reverse();

export const DEFECT_SEVERITY_LABELS: Record<DefectSeverity, string> = { critical: "Critical", major: "Major", minor: "Minor" };

/** 0 for the worst class (critical), growing as severity falls. */
export function severityRank(severity: DefectSeverity): number {
  return DEFECT_SEVERITIES.indexOf(severity);
}
