/**
 * Rubric validation. The rules checked here are our own product spec (the grading brief and
 * docs/contracts.md: grade scale A, B, C, Reject; share as a percentage), not a standard.
 */
import { describe, expect, it } from "vitest";
import { MAX_RULES, gradeRank, parseRubric, rubricSchemaFor, worseGrade, type Rule } from "@/lib/grading/rubric-schema";

const share = (over: Partial<Record<string, unknown>> = {}) => ({
  id: "lens-scratch-b",
  metric: "share",
  defect: "scratch",
  zone: "lens-window",
  comparison: ">",
  threshold: 0.5,
  grade: "B",
  ...over,
});

const errorsOf = (input: unknown, partType?: Parameters<typeof parseRubric>[1]) => {
  const result = parseRubric(input, partType);
  if (result.ok) throw new Error("expected the rubric to be rejected");
  return result.errors;
};

describe("rubric schema", () => {
  it("accepts a rubric using every metric kind", () => {
    const rules: Rule[] = [
      { id: "s", metric: "share", defect: "scratch", zone: "lens-window", view: "lens", comparison: ">", threshold: 0.5, grade: "B" },
      { id: "c", metric: "count", defect: "dust", comparison: ">=", threshold: 3, grade: "C" },
      { id: "l", metric: "maxLengthMm", defect: "scratch", comparison: ">", threshold: 3, grade: "B" },
      { id: "t", metric: "totalLengthMm", defect: "scratch", comparison: ">", threshold: 10, grade: "C" },
      { id: "a", metric: "areaMm2", defect: "dent", zone: "body", comparison: ">", threshold: 1, grade: "B" },
      { id: "d", metric: "maxDiameterMm", defect: "dust", comparison: ">", threshold: 0.2, grade: "C" },
      { id: "p", metric: "pixelFaultClass", view: "screen-white", comparison: "worse-than", threshold: "II", grade: "C" },
      { id: "f", metric: "functionalFailures", severity: "critical", comparison: ">", threshold: 0, grade: "Reject" },
    ];
    const result = parseRubric({ rules, notes: ["Example."] });
    expect(result).toEqual({ ok: true, rubric: { rules, notes: ["Example."] } });
  });

  it("names the rule and field in each error, in plain words", () => {
    expect(errorsOf({ rules: [share({ threshold: 150 })] })).toEqual(['Rule 1 ("lens-scratch-b"), threshold: is a percentage and cannot exceed 100 %']);
    expect(errorsOf({ rules: [share({ threshold: -1 })] })).toEqual(['Rule 1 ("lens-scratch-b"), threshold: cannot be negative']);
    expect(errorsOf({ rules: [share({ threshold: Number.POSITIVE_INFINITY })] })).toEqual(['Rule 1 ("lens-scratch-b"), threshold: must be a finite number, not Infinity']);
    expect(errorsOf({ rules: [share({ threshold: Number.NaN })] })).toEqual(['Rule 1 ("lens-scratch-b"), threshold: must be a finite number, not NaN']);
    expect(errorsOf({ rules: [share({ metric: "sharpness" })] })).toEqual([
      'Rule 1 ("lens-scratch-b"), metric: unknown metric "sharpness"; use one of share, count, maxLengthMm, totalLengthMm, areaMm2, maxDiameterMm, pixelFaultClass, functionalFailures',
    ]);
    expect(errorsOf({ rules: [share({ grade: "A" })] })).toEqual(['Rule 1 ("lens-scratch-b"), grade: cannot be A: A is the default grade, a rule can only lower it to B, C or Reject']);
    expect(errorsOf({ rules: [share({ grade: "D" })] })).toEqual(['Rule 1 ("lens-scratch-b"), grade: must be B, C or Reject, not "D"']);
    expect(errorsOf({ rules: [share({ grade: undefined })] })).toEqual(['Rule 1 ("lens-scratch-b"), grade: is required']);
    expect(errorsOf({ rules: [share({ comparison: "<" })] })).toEqual(['Rule 1 ("lens-scratch-b"), comparison: must be ">" or ">=", not "<" (rules fire when a measure exceeds its limit)']);
  });

  it("rejects a zone on metrics that zones do not record, and fractional counts", () => {
    expect(errorsOf({ rules: [share({ metric: "count", threshold: 2 })] })).toEqual([
      'Rule 1 ("lens-scratch-b"): unknown field "zone" for a count rule. Zones record covered area only, so only share and areaMm2 rules take a zone.',
    ]);
    const { zone: _zone, ...unzoned } = share({ metric: "count", threshold: 1.5 });
    expect(errorsOf({ rules: [unzoned] })).toEqual(['Rule 1 ("lens-scratch-b"), threshold: must be a whole number']);
  });

  it('rejects ">= 0", which would fire on a clean unit', () => {
    expect(errorsOf({ rules: [share({ comparison: ">=", threshold: 0 })] })).toEqual([
      'Rule 1 ("lens-scratch-b"), threshold: with ">=" a threshold of 0 always fires, even on a clean unit; use "> 0" to mean "any"',
    ]);
    expect(parseRubric({ rules: [share({ comparison: ">", threshold: 0 })] }).ok).toBe(true);
  });

  it("checks pixel-fault classes and failure severities", () => {
    const pixel = { id: "px", metric: "pixelFaultClass", comparison: "worse-than", threshold: "beyond", grade: "C" };
    expect(errorsOf({ rules: [pixel] })).toEqual(['Rule 1 ("px"), threshold: cannot be "beyond": no class is worse; use "IV" to mean "beyond class IV"']);
    expect(errorsOf({ rules: [{ ...pixel, threshold: "V" }] })).toEqual(['Rule 1 ("px"), threshold: must be an ISO 13406-2 class I, II, III or IV, not "V"']);
    expect(errorsOf({ rules: [{ ...pixel, threshold: "II", comparison: ">" }] })).toEqual(['Rule 1 ("px"), comparison: must be "worse-than" for a pixelFaultClass rule']);
    const failures = { id: "f", metric: "functionalFailures", severity: "fatal", comparison: ">", threshold: 0, grade: "Reject" };
    expect(errorsOf({ rules: [failures] })).toEqual(['Rule 1 ("f"), severity: must be critical, major or minor, not "fatal"']);
  });

  it("rejects duplicate ids, bad ids, too many rules and unknown rubric fields", () => {
    expect(errorsOf({ rules: [share(), share()] })).toEqual(['Rule 2 ("lens-scratch-b"), id: "lens-scratch-b" is already used by rule 1; rule ids must be unique']);
    expect(errorsOf({ rules: [share({ id: "builtin:x" })] })).toEqual([
      'Rule 1 ("builtin:x"), id: must be 1–64 characters of lower-case letters, digits, ".", "_" or "-", starting with a letter or digit',
    ]);
    const many = Array.from({ length: MAX_RULES + 1 }, (_, i) => share({ id: `r${i}` }));
    expect(errorsOf({ rules: many })).toEqual(["Rubric rules: has too many rules: at most 200 are allowed"]);
    expect(parseRubric({ rules: many.slice(0, MAX_RULES) }).ok).toBe(true);
    expect(errorsOf({ rules: [], extra: 1 })).toEqual(['Rubric: unknown field "extra" in a rubric (fields: rules, notes)']);
    expect(errorsOf(null)).toEqual(["Rubric: must be an object with a rules list"]);
    expect(errorsOf({})).toEqual(["Rubric rules: is required"]);
  });

  it("checks defect classes, zones and views against the part type when given", () => {
    const partType = { defects: ["scratch", "dust"], zones: ["body"], views: ["front"] };
    expect(errorsOf({ rules: [share({ defect: "scrach", view: "top" })] }, partType)).toEqual([
      `Rule 1 ("lens-scratch-b"), defect: defect class "scrach" is not one of this part type's defect classes (allowed: scratch, dust)`,
      `Rule 1 ("lens-scratch-b"), zone: zone "lens-window" is not one of this part type's zones (allowed: body)`,
      `Rule 1 ("lens-scratch-b"), view: view "top" is not one of this part type's views (allowed: front)`,
    ]);
    expect(errorsOf({ rules: [share({ zone: "body" })] }, { defects: ["scratch"], zones: [] })).toEqual([
      `Rule 1 ("lens-scratch-b"), zone: zone "body" is not one of this part type's zones (this part type has none)`,
    ]);
    // Lists that are not given are not checked.
    expect(parseRubric({ rules: [share()] }, { defects: ["scratch"] }).ok).toBe(true);
    expect(rubricSchemaFor(partType).safeParse({ rules: [share({ zone: "body", view: "front" })] }).success).toBe(true);
  });

  it("orders grades A < B < C < Reject", () => {
    expect(["Reject", "A", "C", "B"].sort((a, b) => gradeRank(a as never) - gradeRank(b as never))).toEqual(["A", "B", "C", "Reject"]);
    expect(worseGrade("B", "C")).toBe("C");
    expect(worseGrade("Reject", "A")).toBe("Reject");
  });
});
