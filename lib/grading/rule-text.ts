/**
 * Human wording of rules, shared by the explanation lines (evaluate.ts) and the rubric diff.
 * Numbers: percent with 1–2 decimals ("0.8 %", "0.75 %"), mm and mm² with 1 decimal, counts as
 * whole numbers; a value that would print the same as its threshold gets more decimals so a
 * fired line never reads "0.5 % > 0.5 %". Formatting does not depend on the server's locale.
 */
import type { PixelFaultClass } from "@/lib/measure/types";
import type { Grade, Rule, RuleGrade } from "./rubric-schema";
import { ruleZone } from "./rubric-schema";

/** Human names for keys; any key without a label prints as itself. */
export type GradingLabels = {
  defects?: Record<string, string>;
  zones?: Record<string, string>;
  views?: Record<string, string>;
};

const label = (names: Record<string, string> | undefined, key: string) => names?.[key] ?? key;

/** The grade just above a rule's grade: a B rule's threshold is what A allows. */
export const betterGrade: Record<RuleGrade, Exclude<Grade, "Reject">> = { B: "A", C: "B", Reject: "C" };

/** Fixed decimals, trailing zeros trimmed down to `minDecimals`. */
function fixed(value: number, minDecimals: number, maxDecimals: number): string {
  let text = value.toFixed(maxDecimals);
  if (maxDecimals > minDecimals) {
    text = text.replace(/0+$/, "");
    const decimals = text.split(".")[1]?.length ?? 0;
    if (decimals < minDecimals) text = value.toFixed(minDecimals);
  }
  return text.endsWith(".") ? text.slice(0, -1) : text;
}

export type Unit = "percent" | "mm" | "mm2" | "count" | "class";

export const unitOf = (rule: Rule): Unit =>
  rule.metric === "share"
    ? "percent"
    : rule.metric === "areaMm2"
      ? "mm2"
      : rule.metric === "maxLengthMm" || rule.metric === "totalLengthMm" || rule.metric === "maxDiameterMm"
        ? "mm"
        : rule.metric === "pixelFaultClass"
          ? "class"
          : "count";

const classText = (cls: PixelFaultClass | string) => (cls === "beyond" ? "beyond class IV" : `class ${cls}`);

/** Formats a value of the rule's unit; `extraDecimals` sharpens it against a nearby threshold. */
export function formatValue(unit: Unit, value: number | string, extraDecimals = 0): string {
  if (typeof value === "string") return classText(value);
  switch (unit) {
    case "percent": {
      // Tiny shares keep one significant digit instead of printing as "0.0 %".
      if (value !== 0 && Math.abs(value) < 0.01 && extraDecimals === 0) return `${Number(value.toPrecision(1))} %`;
      return `${fixed(value, 1, 2 + extraDecimals)} %`;
    }
    case "mm":
    case "mm2": {
      const small = value !== 0 && Math.abs(value) < 0.1 ? 1 : 0;
      return `${fixed(value, 1, 1 + small + extraDecimals)} ${unit === "mm" ? "mm" : "mm²"}`;
    }
    default:
      return Number.isInteger(value) ? String(value) : fixed(value, 0, 2 + extraDecimals);
  }
}

/** Value and threshold texts that differ whenever the numbers differ (up to 4 extra decimals). */
export function formatPair(unit: Unit, value: number | string, threshold: number | string): [string, string] {
  for (let extra = 0; extra <= 4; extra += 1) {
    const pair: [string, string] = [formatValue(unit, value, extra), formatValue(unit, threshold, extra)];
    if (pair[0] !== pair[1] || value === threshold) return pair;
  }
  return [formatValue(unit, value, 4), formatValue(unit, threshold, 4)];
}

const inView = (rule: Rule, labels: GradingLabels) => (rule.metric !== "functionalFailures" && rule.view !== undefined ? ` in the ${label(labels.views, rule.view)} view` : "");

/** Who a rule is about, without numbers: "scratch on lens window", "pixel faults in the Screen white view". */
export function ruleSubject(rule: Rule, labels: GradingLabels = {}): string {
  if (rule.metric === "functionalFailures") return `${rule.severity} functional failures`;
  if (rule.metric === "pixelFaultClass") return `pixel faults${inView(rule, labels)}`;
  const zone = ruleZone(rule);
  return `${label(labels.defects, rule.defect)}${zone === undefined ? "" : ` on ${label(labels.zones, zone)}`}${inView(rule, labels)}`;
}

const metricWord: Record<Rule["metric"], string> = {
  share: "share",
  count: "count",
  maxLengthMm: "longest",
  totalLengthMm: "total length",
  areaMm2: "area",
  maxDiameterMm: "largest diameter",
  pixelFaultClass: "",
  functionalFailures: "count",
};

const opText = (comparison: string) => (comparison === ">=" ? "≥" : comparison);

/** The condition alone: "share > 0.5 %", "longest ≥ 3.0 mm", "worse than class II". */
export const ruleCondition = (rule: Rule): string =>
  rule.metric === "pixelFaultClass" ? `worse than ${classText(rule.threshold)}` : `${metricWord[rule.metric]} ${opText(rule.comparison)} ${formatValue(unitOf(rule), rule.threshold)}`;

/** A whole rule in one phrase: "scratch on lens window, share > 0.5 % → B". */
export const describeRule = (rule: Rule, labels: GradingLabels = {}): string => `${ruleSubject(rule, labels)}, ${ruleCondition(rule)} → ${rule.grade}`;

/** The explanation line of a fired rule, e.g. "scratch covers 0.8 % of lens window > 0.5 % allowed for A → B". */
export function explainFiredRule(rule: Rule, value: number | PixelFaultClass, labels: GradingLabels = {}): string {
  const [valueText, thresholdText] = formatPair(unitOf(rule), value, rule.threshold);
  const better = betterGrade[rule.grade];
  const view = inView(rule, labels);
  const limit = rule.comparison === ">=" ? `≥ ${thresholdText} limit for ${better}` : `> ${thresholdText} allowed for ${better}`;
  if (rule.metric === "pixelFaultClass") {
    return `pixel faults${view} are ${valueText} (ISO 13406-2), worse than ${thresholdText} allowed for ${better} → ${rule.grade}`;
  }
  if (rule.metric === "functionalFailures") return `${rule.severity} functional failures ${valueText} ${limit} → ${rule.grade}`;
  const defect = label(labels.defects, rule.defect);
  const zone = ruleZone(rule);
  const zoneText = zone === undefined ? undefined : label(labels.zones, zone);
  const measured: Record<typeof rule.metric, string> = {
    share: `${defect} covers ${valueText} of ${zoneText ?? "the surface"}${view}`,
    count: `${defect} count ${valueText}${view}`,
    maxLengthMm: `longest ${defect} ${valueText}${view}`,
    totalLengthMm: `${defect} total length ${valueText}${view}`,
    areaMm2: `${defect} area ${valueText}${zoneText === undefined ? "" : ` on ${zoneText}`}${view}`,
    maxDiameterMm: `largest ${defect} ${valueText} across${view}`,
  };
  return `${measured[rule.metric]} ${limit} → ${rule.grade}`;
}

/** The line of the built-in rule: a part type's critical defect class is present. */
export const explainCriticalDefect = (defect: string, count: number, labels: GradingLabels = {}): string =>
  `${label(labels.defects, defect)} found (${count} region${count === 1 ? "" : "s"}): a critical defect for this part type → Reject`;

export const viewLabel = (viewKey: string, labels: GradingLabels = {}) => label(labels.views, viewKey);
export const zoneLabel = (zone: string, labels: GradingLabels = {}) => label(labels.zones, zone);
