/**
 * The rule editor's form mapping and the preview's sample unit. Thresholds are (c) invented
 * examples; every check here is the stated behaviour of the mapping, graded by the real
 * evaluation (lib/grading/evaluate.ts), so a wrong mapping shows up as a wrong grade.
 */
import { describe, expect, it } from "vitest";
import { evaluateRubric } from "@/lib/grading/evaluate";
import { EXAMPLE_PART_TYPES } from "@/lib/grading/example-part-types";
import { EXAMPLE_RUBRICS } from "@/lib/grading/example-rubrics";
import { fromRubric, newRule, rubricFormErrors, toRubric, type RuleFormValues } from "@/lib/grading/rule-form";
import type { Rubric } from "@/lib/grading/rubric-schema";
import { buildSampleUnit, readingKey, sampleReadingsFor } from "@/lib/grading/sample-unit";
import { buildUnitMetrics } from "@/lib/grading/unit-metrics";
import type { ViewDefinition } from "@/lib/part-types/schemas";

const lists = { defects: ["scratch", "dent", "crack"], zones: ["lens-window", "body"], views: ["lens", "back"] };
const row = (over: Partial<RuleFormValues>): RuleFormValues => ({
  id: "r1",
  metric: "count",
  defect: "dent",
  view: "",
  zone: "",
  severity: "major",
  comparison: ">",
  threshold: "0",
  grade: "B",
  ...over,
});

describe("rule form mapping", () => {
  it("round-trips every example rubric unchanged", () => {
    for (const rubric of Object.values(EXAMPLE_RUBRICS)) expect(toRubric(fromRubric(rubric))).toEqual(rubric);
  });

  it("keeps only the fields a metric takes", () => {
    const values = {
      rules: [
        row({ metric: "count", zone: "body", view: "lens" }),
        row({ id: "f", metric: "functionalFailures", defect: "dent", view: "lens", severity: "critical", grade: "Reject" }),
        row({ id: "p", metric: "pixelFaultClass", threshold: "II", comparison: ">=" }),
      ],
      notes: [],
    };
    expect(toRubric(values)).toEqual({
      rules: [
        { id: "r1", metric: "count", defect: "dent", comparison: ">", threshold: 0, view: "lens", grade: "B" },
        { id: "f", metric: "functionalFailures", severity: "critical", comparison: ">", threshold: 0, grade: "Reject" },
        { id: "p", metric: "pixelFaultClass", comparison: "worse-than", threshold: "II", grade: "B" },
      ],
    });
  });

  it("puts the rubric schema's messages on the fields they concern", () => {
    const result = rubricFormErrors({ rules: [row({ threshold: "-2" }), row({ id: "r2", threshold: "abc" })], notes: [{ text: " " }] }, lists);
    if (result.ok) throw new Error("expected errors");
    const rules = result.errors.rules as unknown as Record<string, Record<string, { message: string }>>;
    expect(rules["0"].threshold.message).toBe("cannot be negative");
    expect(rules["1"].threshold.message).toBe('must be a number, not "abc"');
    expect((result.errors.notes as unknown as Record<string, { text: { message: string } }>)["0"].text.message).toBe("cannot be empty");
    expect(result.messages[0]).toBe('Rule 1 ("r1"), threshold: cannot be negative');
    // Checks across rules and against the part type run once every rule is well-formed.
    const second = rubricFormErrors({ rules: [row({}), row({ threshold: "1" }), row({ id: "r3", defect: "swelling" })], notes: [] }, lists);
    if (second.ok) throw new Error("expected errors");
    const rows = second.errors.rules as unknown as Record<string, Record<string, { message: string }>>;
    expect(rows["1"].id.message).toBe('"r1" is already used by rule 1; rule ids must be unique');
    expect(rows["2"].defect.message).toMatch(/^defect class "swelling" is not one of this part type's defect classes/);
    expect(rubricFormErrors({ rules: [row({})], notes: [] }, lists).ok).toBe(true);
  });

  it("a new row gets an unused id and the first defect class", () => {
    expect(newRule([{ id: "rule-2" }, { id: "x" }], lists)).toMatchObject({ id: "rule-3", defect: "scratch", metric: "count" });
    expect(newRule([{ id: "rule-1" }], lists).id).toBe("rule-2");
  });
});

const views: ViewDefinition[] = [
  {
    key: "lens",
    label: "Lens",
    required: true,
    zones: [
      {
        id: "lens-window",
        label: "Lens window",
        polygon: [
          [0, 0],
          [1, 0],
          [1, 1],
        ],
      },
    ],
  },
  {
    key: "back",
    label: "Back",
    required: true,
    zones: [
      {
        id: "body",
        label: "Body",
        polygon: [
          [0, 0],
          [1, 0],
          [1, 1],
        ],
      },
    ],
  },
];
const grade = (rubric: Rubric, readings: Record<string, number>, failures = { critical: 0, major: 0, minor: 0 }) => {
  const sample = buildSampleUnit(views, rubric, { readings, pixelClasses: {}, functionalFailures: failures });
  return evaluateRubric({ rubric, metrics: buildUnitMetrics(sample), defectSeverities: { crack: "critical" } });
};

describe("sample unit", () => {
  const rubric: Rubric = {
    rules: [
      { id: "lens-b", metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 0.5, grade: "B" },
      { id: "len-c", metric: "maxLengthMm", defect: "scratch", view: "back", comparison: ">", threshold: 3, grade: "C" },
      { id: "dent-b", metric: "count", defect: "dent", comparison: ">", threshold: 1, grade: "B" },
      { id: "func", metric: "functionalFailures", severity: "major", comparison: ">", threshold: 0, grade: "C" },
    ],
  };
  const lensKey = readingKey({ metric: "share", defect: "scratch", view: null, zone: "lens-window" });
  const backKey = readingKey({ metric: "maxLengthMm", defect: "scratch", view: "back", zone: null });
  const dentKey = readingKey({ metric: "count", defect: "dent", view: null, zone: null });

  it("lists one reading per selector and the failure severities the rubric reads", () => {
    const { readings, severities } = sampleReadingsFor({
      rules: [...rubric.rules, { id: "lens-c", metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 1, grade: "C" }],
    });
    expect(readings.map((r) => r.key)).toEqual([lensKey, backKey, dentKey]);
    expect(severities).toEqual(["major"]);
  });

  it("grades a clean sample A with no 'could not evaluate' notes", () => {
    const result = grade(rubric, {});
    expect(result.grade).toBe("A");
    expect(result.notes).toEqual([]);
  });

  it("each typed number is exactly what its rule reads", () => {
    expect(grade(rubric, { [lensKey]: 0.8 }).lines.map((l) => l.text)).toEqual(["scratch covers 0.8 % of lens-window > 0.5 % allowed for A → B"]);
    expect(grade(rubric, { [backKey]: 3.5 }).lines[0].text).toBe("longest scratch 3.5 mm in the back view > 3.0 mm allowed for B → C");
    expect(grade(rubric, { [dentKey]: 2 }).lines[0].text).toBe("dent count 2 > 1 allowed for A → B");
    expect(grade(rubric, {}, { critical: 0, major: 1, minor: 0 }).grade).toBe("C");
  });

  it("a critical class in the sample rejects through the built-in rule", () => {
    const withCrack: Rubric = { rules: [{ id: "crack-count", metric: "count", defect: "crack", comparison: ">", threshold: 5, grade: "C" }] };
    expect(grade(withCrack, { [readingKey({ metric: "count", defect: "crack", view: null, zone: null })]: 1 }).grade).toBe("Reject");
  });

  it("works for every example rubric with its example part type's views", () => {
    for (const [slug, example] of Object.entries(EXAMPLE_RUBRICS)) {
      const partViews = EXAMPLE_PART_TYPES[slug as keyof typeof EXAMPLE_PART_TYPES].views!.map((key) => ({
        key,
        label: key,
        required: true,
        zones: EXAMPLE_PART_TYPES[slug as keyof typeof EXAMPLE_PART_TYPES].zones!.map((id) => ({
          id,
          label: id,
          polygon: [
            [0, 0],
            [1, 0],
            [1, 1],
          ] as [number, number][],
        })),
      }));
      const sample = buildSampleUnit(partViews, example, { readings: {}, pixelClasses: {}, functionalFailures: { critical: 0, major: 0, minor: 0 } });
      const result = evaluateRubric({ rubric: example, metrics: buildUnitMetrics(sample), defectSeverities: {} });
      expect(result.grade, slug).toBe("A");
      expect(result.notes, slug).toEqual([]);
    }
  });
});
