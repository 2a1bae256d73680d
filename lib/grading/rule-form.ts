/**
 * Between the rule editor's form values (every field a string, so inputs stay controlled) and a
 * Rubric. `toRubric` keeps only the fields the rule's metric takes and turns the threshold text
 * into a number where it is one; anything else is passed through so the rubric schema's own
 * message ("must be a number, not "abc"") reaches the person. `rubricFormErrors` places the
 * schema's messages on the fields they are about, for react-hook-form.
 */
import { DEFECT_METRICS, ZONED_METRICS, parseRubric, type Metric, type PartTypeLists, type Rubric, type Rule, type RuleGrade } from "./rubric-schema";
import type { DefectSeverity } from "@/lib/part-types/severity";

export type RuleFormValues = {
  id: string;
  metric: Metric;
  defect: string;
  /** "" = any view. */
  view: string;
  /** "" = the whole surface. */
  zone: string;
  severity: DefectSeverity;
  comparison: ">" | ">=";
  /** A number as text; a class I–IV for pixelFaultClass rules. */
  threshold: string;
  grade: RuleGrade;
};
export type RubricFormValues = { rules: RuleFormValues[]; notes: { text: string }[] };

export const takesDefect = (metric: Metric) => (DEFECT_METRICS as readonly string[]).includes(metric);
export const takesZone = (metric: Metric) => ZONED_METRICS.includes(metric as (typeof ZONED_METRICS)[number]);
export const takesView = (metric: Metric) => metric !== "functionalFailures";

function thresholdValue(text: string): number | string | undefined {
  const trimmed = text.trim();
  if (trimmed === "") return undefined;
  const number = Number(trimmed.replace(",", "."));
  return Number.isFinite(number) ? number : trimmed;
}

/** One form row as the rubric schema's input (not yet validated). */
export function toRule(values: RuleFormValues): Record<string, unknown> {
  const rule: Record<string, unknown> = { id: values.id.trim(), metric: values.metric };
  if (values.metric === "functionalFailures") {
    Object.assign(rule, { severity: values.severity, comparison: values.comparison, threshold: thresholdValue(values.threshold) });
  } else if (values.metric === "pixelFaultClass") {
    Object.assign(rule, { comparison: "worse-than", threshold: values.threshold.trim() || undefined });
  } else {
    Object.assign(rule, { defect: values.defect || undefined, comparison: values.comparison, threshold: thresholdValue(values.threshold) });
    if (takesZone(values.metric) && values.zone) rule.zone = values.zone;
  }
  if (takesView(values.metric) && values.view) rule.view = values.view;
  rule.grade = values.grade;
  return rule;
}

export function toRubric(values: RubricFormValues): Record<string, unknown> {
  const notes = values.notes.map((note) => note.text);
  return { rules: values.rules.map(toRule), ...(notes.length > 0 ? { notes } : {}) };
}

export function fromRule(rule: Rule): RuleFormValues {
  return {
    id: rule.id,
    metric: rule.metric,
    defect: "defect" in rule ? rule.defect : "",
    view: rule.metric !== "functionalFailures" ? (rule.view ?? "") : "",
    zone: "zone" in rule ? (rule.zone ?? "") : "",
    severity: rule.metric === "functionalFailures" ? rule.severity : "major",
    comparison: rule.metric === "pixelFaultClass" ? ">" : rule.comparison,
    threshold: String(rule.threshold),
    grade: rule.grade,
  };
}

export function fromRubric(rubric: Rubric): RubricFormValues {
  return { rules: rubric.rules.map(fromRule), notes: (rubric.notes ?? []).map((text) => ({ text })) };
}

/** A fresh row: an id not used yet, the part type's first defect class, an "any" count rule. */
export function newRule(existing: readonly { id: string }[], lists: PartTypeLists): RuleFormValues {
  const used = new Set(existing.map((rule) => rule.id));
  let n = existing.length + 1;
  while (used.has(`rule-${n}`)) n += 1;
  return { id: `rule-${n}`, metric: "count", defect: lists.defects[0] ?? "", view: "", zone: "", severity: "major", comparison: ">", threshold: "0", grade: "B" };
}

export type FormError = { type: string; message: string };
type ErrorTree = { [key: string]: ErrorTree | FormError | ErrorTree[] };

function place(tree: ErrorTree, path: string[], error: FormError) {
  let node: ErrorTree = tree;
  for (const key of path.slice(0, -1)) node = (node[key] ??= {}) as ErrorTree;
  const last = path[path.length - 1];
  if (!(last in node)) node[last] = error;
}

/**
 * The rubric's validation errors shaped as react-hook-form field errors. A message about a whole
 * rule (e.g. an unknown metric) goes on its metric field; one about the whole rubric on `root`.
 */
export function rubricFormErrors(values: RubricFormValues, lists: PartTypeLists): { ok: true; rubric: Rubric } | { ok: false; errors: ErrorTree; messages: string[] } {
  const parsed = parseRubric(toRubric(values), lists);
  if (parsed.ok) return parsed;
  const errors: ErrorTree = {};
  for (const [key, message] of Object.entries(parsed.fieldErrors)) {
    const path = key.split(".");
    if (path[0] === "rules" && path.length >= 3) place(errors, path.slice(0, 3), { type: "rubric", message: stripRulePrefix(message) });
    else if (path[0] === "rules" && path.length === 2) place(errors, [...path, "metric"], { type: "rubric", message: stripRulePrefix(message) });
    else if (path[0] === "notes" && path.length >= 2) place(errors, [path[0], path[1], "text"], { type: "rubric", message: stripRulePrefix(message) });
    else place(errors, ["root"], { type: "rubric", message });
  }
  return { ok: false, errors, messages: parsed.errors };
}

/** Field messages sit beside their field, so the "Rule 3 ("id"), threshold: " prefix is dropped. */
const stripRulePrefix = (message: string) => message.replace(/^Rule \d+(?: \("[^"]*"\))?(?:, [\w.]+)?: /, "").replace(/^Rubric [\w.]+: /, "");
