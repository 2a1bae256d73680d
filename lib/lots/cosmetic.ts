/**
 * Which cosmetic nonconformities a graded unit adds to its lot's counts (docs/contracts.md, "Lot
 * verdict counting"). Pure: lib/lots/progress.ts loads the grades, this decides.
 *
 * The rule, precisely:
 * - The unit's grade is its **current** grade: the last row of its grade history (inspection,
 *   recheck, adjudication or override), compared with the grade the lot's purchase promised
 *   (A best … Reject worst). A grade no worse than the promise adds nothing cosmetic.
 * - "The defect classes that made it so" are read from that grade's explanation lines (the rules
 *   of the rubric version that fired on the measurement the grade rests on): every line whose own
 *   grade is worse than the promise names its classes —
 *     `builtin:critical:<class>` → that class;
 *     a rubric rule on a defect metric (share, count, lengths, area, diameter) → its `defect`;
 *     a `pixelFaultClass` rule → the pixel-fault classes the part type has (the ISO 13406-2 class
 *       reads them together, so the rule counts at the most severe of them);
 *     a `functionalFailures` rule → no class: that failure is counted from the checklist already.
 *   Each such class counts in its severity (the part type's, as stored with the measurement), once
 *   per severity: a unit with a major scratch and a minor dent, each enough on its own to break
 *   the promise, counts once as major and once as minor. The worst class is always among them.
 * - A grade overridden below the promise with no fired line below it: the classes of the fired
 *   cosmetic lines (the grader judged those defects worse than the rubric did); with none either,
 *   the shortfall counts as **major** with no class named — it breaks what was bought, which is
 *   more than a blemish, and nothing says it is a safety matter (our choice, c). When no cosmetic
 *   line is below the promise but a functional one is, that failure explains the grade and nothing
 *   cosmetic is added: the failure itself counts.
 * - A critical defect class always counts as critical: a fired line naming a class of critical
 *   severity counts, whatever the promise and whatever an override said.
 * Counting once per class in which a unit has a nonconformity, rather than only in its most serious
 * class, follows lib/lots/verdict.ts: it can only raise a count (ISO 2859-1 practice for classified
 * nonconformities, from memory, b; common practice, c).
 */
import { DEFECT_SEVERITIES, severityRank, type DefectSeverity } from "@/lib/part-types/severity";
import { gradeRank, type Grade, type Rule } from "@/lib/grading/rubric-schema";
import { PIXEL_FAULT_DEFECTS } from "@/lib/measure/pixel-faults";
import type { PromisedGrade } from "./schemas";
import type { FindingDefect } from "./verdict";

export type GradeEvidence = {
  finalGrade: Grade;
  /** The grade's explanation lines (rule id and the grade each fired rule gave). */
  lines: readonly { ruleId: string; grade: Grade }[];
  /** Rules of the rubric version the grade was given under, by id. */
  rules: ReadonlyMap<string, Rule>;
  /** Defect class → severity, as stored with the measurement the grade rests on. */
  severities: Readonly<Record<string, DefectSeverity>>;
  /** Defect class → label, for the reason shown on the lot page. */
  labels?: Readonly<Record<string, string>>;
};

const CRITICAL_PREFIX = "builtin:critical:";

/** The defect classes a fired line stands for; [] for functional and "nothing fired" lines. */
export function lineDefectClasses(ruleId: string, rules: ReadonlyMap<string, Rule>, severities: Readonly<Record<string, DefectSeverity>>): string[] {
  if (ruleId.startsWith(CRITICAL_PREFIX)) return [ruleId.slice(CRITICAL_PREFIX.length)];
  const rule = rules.get(ruleId);
  if (!rule || rule.metric === "functionalFailures") return [];
  if (rule.metric === "pixelFaultClass") {
    const pixelClasses = PIXEL_FAULT_DEFECTS.filter((key) => severities[key] !== undefined);
    const worst = Math.min(...pixelClasses.map((key) => severityRank(severities[key])));
    return pixelClasses.filter((key) => severityRank(severities[key]) === worst);
  }
  return [rule.defect];
}

const isWorse = (grade: Grade, than: Grade) => gradeRank(grade) > gradeRank(than);

/**
 * The cosmetic nonconformities of one graded unit, at most one per severity (each with a reason a
 * person can read), or [] when its cosmetic grade keeps the promise and no critical class fired.
 */
export function cosmeticNonconformities(promised: PromisedGrade, grade: GradeEvidence): FindingDefect[] {
  const { rules, severities } = grade;
  const label = (key: string) => grade.labels?.[key] ?? key;
  const fired = grade.lines.map((line) => ({ line, classes: lineDefectClasses(line.ruleId, rules, severities).filter((key) => severities[key] !== undefined) }));
  const bySeverity = new Map<DefectSeverity, Set<string>>();
  const add = (key: string) => {
    const severity = severities[key];
    bySeverity.set(severity, (bySeverity.get(severity) ?? new Set()).add(key));
  };

  for (const { classes } of fired) for (const key of classes) if (severities[key] === "critical") add(key);

  let unattributed = false;
  if (isWorse(grade.finalGrade, promised)) {
    const below = fired.filter(({ line, classes }) => classes.length > 0 && isWorse(line.grade, promised));
    const functionalExplains = grade.lines.some((line) => rules.get(line.ruleId)?.metric === "functionalFailures" && isWorse(line.grade, promised));
    // Nothing fired below the promise: an override; unless a failure explains it (counted already).
    const cosmetic = below.length > 0 ? below : functionalExplains ? [] : fired.filter(({ classes }) => classes.length > 0);
    for (const { classes } of cosmetic) classes.forEach(add);
    unattributed = cosmetic.length === 0 && !functionalExplains;
  }

  const defects: FindingDefect[] = [];
  for (const severity of DEFECT_SEVERITIES) {
    const keys = bySeverity.get(severity);
    if (keys) defects.push({ severity, source: "cosmetic", label: `grade ${grade.finalGrade} (promised ${promised}): ${[...keys].map(label).join(", ")}` });
  }
  if (unattributed && !bySeverity.has("major")) {
    defects.push({ severity: "major", source: "cosmetic", label: `grade ${grade.finalGrade} (promised ${promised}): overridden with no defect class to go by` });
  }
  return defects;
}
