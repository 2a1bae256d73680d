/**
 * A readable diff between two versions of a rubric. Rules are matched by id (ids are stable
 * strings in the data), so a rule whose threshold was edited is "changed", not removed + added.
 * Each change is one human sentence, e.g. "scratch on lens window: threshold for B changed from
 * 0.5 % to 0.3 %". Rule order is not compared: the grade does not depend on it.
 *
 * Order of changes: removed rules (old order), changed rules (new order), added rules (new
 * order), then notes.
 */
import type { Rubric, Rule } from "./rubric-schema";
import { ruleZone } from "./rubric-schema";
import { describeRule, formatValue, ruleSubject, unitOf, type GradingLabels } from "./rule-text";

export type RubricChange = {
  kind: "added" | "removed" | "changed" | "notes";
  /** The rule concerned; null for notes. */
  ruleId: string | null;
  text: string;
};

export type RubricDiff = {
  added: string[];
  removed: string[];
  changed: string[];
  changes: RubricChange[];
  unchanged: boolean;
};

const selectorOf = (rule: Rule) => ({
  defect: "defect" in rule ? rule.defect : undefined,
  view: rule.metric === "functionalFailures" ? undefined : rule.view,
  zone: ruleZone(rule),
  severity: rule.metric === "functionalFailures" ? rule.severity : undefined,
});

const sameSelector = (a: Rule, b: Rule) => {
  const [x, y] = [selectorOf(a), selectorOf(b)];
  return x.defect === y.defect && x.view === y.view && x.zone === y.zone && x.severity === y.severity;
};

const conditionValue = (rule: Rule) => {
  const threshold = formatValue(unitOf(rule), rule.threshold);
  if (rule.metric === "pixelFaultClass") return `worse than ${threshold}`;
  return `${rule.comparison === ">=" ? "≥" : ">"} ${threshold}`;
};

/** Sentences for one rule present in both versions; empty when nothing changed. */
function ruleChangeSentences(before: Rule, after: Rule, labels: GradingLabels): string[] {
  if (before.metric !== after.metric) {
    return [`Rule "${after.id}" changed from "${describeRule(before, labels)}" to "${describeRule(after, labels)}"`];
  }
  const sentences: string[] = [];
  const subject = ruleSubject(after, labels);
  if (!sameSelector(before, after)) sentences.push(`${ruleSubject(before, labels)}: now applies to ${subject}`);
  if (before.grade !== after.grade) sentences.push(`${subject}: grade changed from ${before.grade} to ${after.grade}`);
  if (before.comparison !== after.comparison) {
    sentences.push(`${subject}: condition for ${after.grade} changed from ${conditionValue(before)} to ${conditionValue(after)}`);
  } else if (before.threshold !== after.threshold) {
    const unit = unitOf(after);
    sentences.push(`${subject}: threshold for ${after.grade} changed from ${formatValue(unit, before.threshold)} to ${formatValue(unit, after.threshold)}`);
  }
  return sentences;
}

const shortNote = (note: string) => (note.length > 80 ? `${note.slice(0, 79)}…` : note);

export function diffRubrics(before: Rubric, after: Rubric, labels: GradingLabels = {}): RubricDiff {
  const beforeById = new Map(before.rules.map((rule) => [rule.id, rule]));
  const afterById = new Map(after.rules.map((rule) => [rule.id, rule]));
  const changes: RubricChange[] = [];
  const removed: string[] = [];
  const changed: string[] = [];
  const added: string[] = [];

  for (const rule of before.rules) {
    if (afterById.has(rule.id)) continue;
    removed.push(rule.id);
    changes.push({ kind: "removed", ruleId: rule.id, text: `Removed rule "${rule.id}": ${describeRule(rule, labels)}` });
  }
  for (const rule of after.rules) {
    const old = beforeById.get(rule.id);
    if (old === undefined) continue;
    const sentences = ruleChangeSentences(old, rule, labels);
    if (sentences.length === 0) continue;
    changed.push(rule.id);
    for (const text of sentences) changes.push({ kind: "changed", ruleId: rule.id, text });
  }
  for (const rule of after.rules) {
    if (beforeById.has(rule.id)) continue;
    added.push(rule.id);
    changes.push({ kind: "added", ruleId: rule.id, text: `Added rule "${rule.id}": ${describeRule(rule, labels)}` });
  }

  const beforeNotes = before.notes ?? [];
  const afterNotes = after.notes ?? [];
  for (const note of beforeNotes) {
    if (!afterNotes.includes(note)) changes.push({ kind: "notes", ruleId: null, text: `Note removed: "${shortNote(note)}"` });
  }
  for (const note of afterNotes) {
    if (!beforeNotes.includes(note)) changes.push({ kind: "notes", ruleId: null, text: `Note added: "${shortNote(note)}"` });
  }
  return { added, removed, changed, changes, unchanged: changes.length === 0 };
}
