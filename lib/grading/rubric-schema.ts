/**
 * A part type's cosmetic grading rubric as data, and its validation.
 *
 * A rule reads one number of a unit (a *metric* of a defect class, optionally restricted to a
 * photo view and/or an inspection zone), compares it with a threshold and, when the comparison
 * holds, lowers the grade to B, C or Reject. A unit starts at A; the worst fired rule wins.
 *
 * Units (chosen once, used everywhere):
 * - `share` thresholds are **percentages** 0–100 of the part's surface, or of the zone when the
 *   rule names one (measurements store a fraction; lib/grading/unit-metrics converts).
 * - lengths and diameters in mm, areas in mm², counts and failures as whole numbers.
 * - `pixelFaultClass` compares ISO 13406-2 classes: the rule fires when the unit's class is
 *   *worse than* the threshold class (I best … IV, then "beyond").
 * Only "more is worse" comparisons exist (`>` and `>=`): a `<` rule on a defect measure would
 * downgrade every clean unit, which is never what a rubric author means.
 */
import { z } from "zod";
import type { PixelFaultClass } from "@/lib/measure/types";
import { DEFECT_SEVERITIES } from "@/lib/part-types/severity";

export const GRADES = ["A", "B", "C", "Reject"] as const;
export type Grade = (typeof GRADES)[number];
/** Grades a rule may assign; A is the default, never a rule's result. */
export const RULE_GRADES = ["B", "C", "Reject"] as const;
export type RuleGrade = (typeof RULE_GRADES)[number];

export const PIXEL_FAULT_CLASSES = ["I", "II", "III", "IV", "beyond"] as const satisfies readonly PixelFaultClass[];

/** Metrics read per defect class; only share and areaMm2 exist per zone (zones record area). */
export const DEFECT_METRICS = ["share", "count", "maxLengthMm", "totalLengthMm", "areaMm2", "maxDiameterMm"] as const;
export type DefectMetric = (typeof DEFECT_METRICS)[number];
export const ZONED_METRICS: readonly DefectMetric[] = ["share", "areaMm2"];
export const METRICS = [...DEFECT_METRICS, "pixelFaultClass", "functionalFailures"] as const;
export type Metric = (typeof METRICS)[number];

export const MAX_RULES = 200;
export const MAX_NOTES = 20;

/** Worse grades have higher ranks: A 0, B 1, C 2, Reject 3. */
export const gradeRank = (grade: Grade): number => GRADES.indexOf(grade);
export const worseGrade = (a: Grade, b: Grade): Grade => (gradeRank(b) > gradeRank(a) ? b : a);
export const pixelClassRank = (cls: PixelFaultClass): number => PIXEL_FAULT_CLASSES.indexOf(cls);

const KEY_PATTERN = /^[a-z0-9][a-z0-9-]{0,63}$/;
/** Rule ids are stable across versions (the diff matches on them); ":" is reserved for built-ins. */
const RULE_ID_PATTERN = /^[a-z0-9][a-z0-9._-]{0,63}$/;

const describeInput = (input: unknown): string => (typeof input === "string" ? JSON.stringify(input) : String(input));
/** zod error callback: "is required" for a missing field, else the given message. */
const requiredOr = (message: (input: unknown) => string) => (iss: { input?: unknown }) => (iss.input === undefined ? "is required" : message(iss.input));

const keyField = (what: string) =>
  z
    .string({ error: (iss) => (iss.input === undefined ? "is required" : `must be a ${what} key (text)`) })
    .regex(KEY_PATTERN, `must be a ${what} key: lower-case letters, digits and "-", at most 64 characters`);

const ruleIdField = z
  .string({ error: (iss) => (iss.input === undefined ? "is required" : "must be text") })
  .regex(RULE_ID_PATTERN, 'must be 1–64 characters of lower-case letters, digits, ".", "_" or "-", starting with a letter or digit');

const gradeField = z.enum(RULE_GRADES, {
  error: requiredOr((input) => (input === "A" ? "cannot be A: A is the default grade, a rule can only lower it to B, C or Reject" : `must be B, C or Reject, not ${describeInput(input)}`)),
});

const comparisonField = z.enum([">", ">="], {
  error: requiredOr((input) => `must be ">" or ">=", not ${describeInput(input)} (rules fire when a measure exceeds its limit)`),
});

const numberField = z
  .number({
    error: (iss) => (iss.input === undefined ? "is required" : typeof iss.input === "number" ? `must be a finite number, not ${iss.input}` : `must be a number, not ${describeInput(iss.input)}`),
  })
  .min(0, "cannot be negative");

const unknownFieldError = (metric: string) => (iss: { code?: string; keys?: string[] }) => {
  if (iss.code !== "unrecognized_keys") return undefined;
  const keys = (iss.keys ?? []).map((key) => `"${key}"`).join(", ");
  const zoneHint = iss.keys?.includes("zone") ? " Zones record covered area only, so only share and areaMm2 rules take a zone." : "";
  return `unknown field ${keys} for a ${metric} rule.${zoneHint}`;
};

const defectRuleShape = <M extends DefectMetric, T extends z.ZodType<number>>(metric: M, threshold: T) => ({
  id: ruleIdField,
  metric: z.literal(metric),
  defect: keyField("defect class"),
  view: keyField("view").optional(),
  comparison: comparisonField,
  threshold,
  grade: gradeField,
});

const wholeNumber = numberField.int("must be a whole number");

const shareRule = z.strictObject(
  {
    ...defectRuleShape("share", numberField.max(100, "is a percentage and cannot exceed 100 %")),
    zone: keyField("zone").optional(),
  },
  { error: unknownFieldError("share") },
);
const areaRule = z.strictObject({ ...defectRuleShape("areaMm2", numberField), zone: keyField("zone").optional() }, { error: unknownFieldError("areaMm2") });
const countRule = z.strictObject(defectRuleShape("count", wholeNumber), { error: unknownFieldError("count") });
const maxLengthRule = z.strictObject(defectRuleShape("maxLengthMm", numberField), { error: unknownFieldError("maxLengthMm") });
const totalLengthRule = z.strictObject(defectRuleShape("totalLengthMm", numberField), { error: unknownFieldError("totalLengthMm") });
const maxDiameterRule = z.strictObject(defectRuleShape("maxDiameterMm", numberField), { error: unknownFieldError("maxDiameterMm") });

const pixelFaultRule = z.strictObject(
  {
    id: ruleIdField,
    metric: z.literal("pixelFaultClass"),
    view: keyField("view").optional(),
    comparison: z.literal("worse-than", { error: requiredOr(() => 'must be "worse-than" for a pixelFaultClass rule') }),
    threshold: z.enum(["I", "II", "III", "IV"], {
      error: requiredOr((input) =>
        input === "beyond" ? 'cannot be "beyond": no class is worse; use "IV" to mean "beyond class IV"' : `must be an ISO 13406-2 class I, II, III or IV, not ${describeInput(input)}`,
      ),
    }),
    grade: gradeField,
  },
  { error: unknownFieldError("pixelFaultClass") },
);

const functionalRule = z.strictObject(
  {
    id: ruleIdField,
    metric: z.literal("functionalFailures"),
    severity: z.enum(DEFECT_SEVERITIES, {
      error: requiredOr((input) => `must be critical, major or minor, not ${describeInput(input)}`),
    }),
    comparison: comparisonField,
    threshold: wholeNumber,
    grade: gradeField,
  },
  { error: unknownFieldError("functionalFailures") },
);

export const ruleSchema = z
  .discriminatedUnion("metric", [shareRule, countRule, maxLengthRule, totalLengthRule, areaRule, maxDiameterRule, pixelFaultRule, functionalRule], {
    error: (iss) => (iss.code === "invalid_union" ? `unknown metric ${describeInput((iss.input as { metric?: unknown } | undefined)?.metric)}; use one of ${METRICS.join(", ")}` : undefined),
  })
  .superRefine((rule, ctx) => {
    // ">= 0" holds for every unit, clean ones included: certainly a mistake for "> 0".
    if (rule.comparison === ">=" && rule.threshold === 0) {
      ctx.addIssue({
        code: "custom",
        path: ["threshold"],
        message: 'with ">=" a threshold of 0 always fires, even on a clean unit; use "> 0" to mean "any"',
      });
    }
  });

export type Rule = z.infer<typeof ruleSchema>;
export type DefectRule = Extract<Rule, { metric: DefectMetric }>;
export type PixelFaultRule = Extract<Rule, { metric: "pixelFaultClass" }>;
export type FunctionalRule = Extract<Rule, { metric: "functionalFailures" }>;

export const isDefectRule = (rule: Rule): rule is DefectRule => (DEFECT_METRICS as readonly string[]).includes(rule.metric);
/** The zone of a share/areaMm2 rule, undefined otherwise. */
export const ruleZone = (rule: Rule): string | undefined => ("zone" in rule ? rule.zone : undefined);

export const rubricSchema = z
  .strictObject(
    {
      rules: z.array(ruleSchema, { error: requiredOr(() => "must be a list of rules") }).max(MAX_RULES, `has too many rules: at most ${MAX_RULES} are allowed`),
      notes: z
        .array(z.string({ error: "must be text" }).trim().min(1, "cannot be empty").max(1000, "is longer than 1000 characters"), {
          error: "must be a list of texts",
        })
        .max(MAX_NOTES, `has too many notes: at most ${MAX_NOTES}`)
        .optional(),
    },
    {
      error: (iss) =>
        iss.code === "unrecognized_keys"
          ? `unknown field ${iss.keys.map((key) => `"${key}"`).join(", ")} in a rubric (fields: rules, notes)`
          : iss.code === "invalid_type"
            ? "must be an object with a rules list"
            : undefined,
    },
  )
  .superRefine((rubric, ctx) => {
    const seen = new Map<string, number>();
    rubric.rules.forEach((rule, index) => {
      const first = seen.get(rule.id);
      if (first === undefined) seen.set(rule.id, index);
      else ctx.addIssue({ code: "custom", path: ["rules", index, "id"], message: `"${rule.id}" is already used by rule ${first + 1}; rule ids must be unique` });
    });
  });

export type Rubric = z.infer<typeof rubricSchema>;

/** What a part type allows; lists that are absent are not checked. */
export type PartTypeLists = { defects: readonly string[]; zones?: readonly string[]; views?: readonly string[] };
export type RubricIssue = { path: (string | number)[]; message: string };

const allowedList = (values: readonly string[]) => (values.length === 0 ? "this part type has none" : `allowed: ${values.slice(0, 20).join(", ")}${values.length > 20 ? ", …" : ""}`);

/** Checks a (structurally valid) rubric's defect classes, zones and views against a part type. */
export function validateRubricAgainstPartType(rubric: Rubric, partType: PartTypeLists): RubricIssue[] {
  const issues: RubricIssue[] = [];
  const check = (index: number, field: string, value: string | undefined, allowed: readonly string[] | undefined, what: string, whats: string) => {
    if (value === undefined || allowed === undefined || allowed.includes(value)) return;
    issues.push({ path: ["rules", index, field], message: `${what} "${value}" is not one of this part type's ${whats} (${allowedList(allowed)})` });
  };
  rubric.rules.forEach((rule, index) => {
    if (isDefectRule(rule)) check(index, "defect", rule.defect, partType.defects, "defect class", "defect classes");
    check(index, "zone", ruleZone(rule), partType.zones, "zone", "zones");
    if (rule.metric !== "functionalFailures") check(index, "view", rule.view, partType.views, "view", "views");
  });
  return issues;
}

/** The rubric schema plus the part type's lists, for forms and the publish action. */
export const rubricSchemaFor = (partType: PartTypeLists) =>
  rubricSchema.superRefine((rubric, ctx) => {
    for (const issue of validateRubricAgainstPartType(rubric, partType)) ctx.addIssue({ code: "custom", ...issue });
  });

/** Turns issues into sentences that name the rule by position and id, e.g. `Rule 3 ("lens-b"), threshold: cannot be negative`. */
export function formatRubricIssues(issues: readonly { path: PropertyKey[]; message: string }[], input: unknown): string[] {
  const rules = (input as { rules?: unknown } | null)?.rules;
  return issues.map(({ path, message }) => {
    if (path[0] === "rules" && typeof path[1] === "number") {
      const id = Array.isArray(rules) ? (rules[path[1]] as { id?: unknown } | null)?.id : undefined;
      const name = `Rule ${path[1] + 1}${typeof id === "string" && id !== "" ? ` ("${id}")` : ""}`;
      const field = path.slice(2).map(String).join(".");
      return `${name}${field ? `, ${field}` : ""}: ${message}`;
    }
    const where = path.map(String).join(".");
    return where ? `Rubric ${where}: ${message}` : `Rubric: ${message}`;
  });
}

export type ParseRubricResult = { ok: true; rubric: Rubric } | { ok: false; errors: string[]; fieldErrors: Record<string, string> };

/** Validates unknown input (e.g. a trainer's JSON) into a rubric, with human error sentences. */
export function parseRubric(input: unknown, partType?: PartTypeLists): ParseRubricResult {
  const result = (partType ? rubricSchemaFor(partType) : rubricSchema).safeParse(input);
  if (result.success) return { ok: true, rubric: result.data };
  const errors = formatRubricIssues(result.error.issues, input);
  const fieldErrors: Record<string, string> = {};
  result.error.issues.forEach((issue, index) => {
    const key = issue.path.map(String).join(".") || "rubric";
    fieldErrors[key] ??= errors[index];
  });
  return { ok: false, errors, fieldErrors };
}
