/**
 * Cosmetic nonconformities and the lot counts they feed. Sources:
 * CLS  ISO 2859-1 classified nonconformities: a nonconforming unit is counted per class of
 *      nonconformity it has, and Ac/Re apply per class; a unit counts once in a class however many
 *      nonconformities of that class it has (b, from memory; docs/contracts.md "Lot verdict counting").
 * AR   Accept when defectives <= Ac, reject when >= Re (a, docs/references.md). Plan: lot 120, II,
 *      critical 0/1 on 20, major 0/1 on 13, minor 1/2 on 20 (Table 2-A, as in plan.test.ts).
 * Our rule (lib/lots/cosmetic.ts): which fired rubric lines name the classes that broke the
 * promise, the unattributed override, and "critical always counts" are our choices (c).
 */
import { describe, expect, it } from "vitest";
import type { Rule } from "@/lib/grading/rubric-schema";
import { cosmeticNonconformities, lineDefectClasses, type GradeEvidence } from "@/lib/lots/cosmetic";
import { unitFindings } from "@/lib/lots/findings";
import { buildLotPlan } from "@/lib/lots/plan";
import { lotVerdict } from "@/lib/lots/verdict";

const rules = new Map<string, Rule>(
  [
    { id: "scratch-b", metric: "maxLengthMm", defect: "scratch", comparison: ">", threshold: 3, grade: "B" },
    { id: "scratch-c", metric: "totalLengthMm", defect: "scratch", comparison: ">", threshold: 10, grade: "C" },
    { id: "dent-c", metric: "count", defect: "dent", comparison: ">", threshold: 0, grade: "C" },
    { id: "stain-b", metric: "share", defect: "stain", comparison: ">", threshold: 1, grade: "B" },
    { id: "pixels", metric: "pixelFaultClass", comparison: "worse-than", threshold: "II", grade: "C" },
    { id: "func-major", metric: "functionalFailures", severity: "major", comparison: ">", threshold: 0, grade: "C" },
  ].map((rule) => [rule.id, rule as Rule]),
);
const severities = { scratch: "major", dent: "minor", stain: "minor", crack: "critical", "pixel-lit": "major", "pixel-subpixel": "minor" } as const;
const labels = { scratch: "Scratch", dent: "Dent", stain: "Stain", crack: "Crack" };
const grade = (finalGrade: GradeEvidence["finalGrade"], lines: [string, GradeEvidence["finalGrade"]][]): GradeEvidence => ({
  finalGrade,
  lines: lines.map(([ruleId, g]) => ({ ruleId, grade: g })),
  rules,
  severities,
  labels,
});
const severitiesOf = (defects: { severity: string }[]) => defects.map((d) => d.severity);

describe("which classes a fired line stands for", () => {
  it("names the built-in critical class, a defect rule's class, and no class for a functional rule", () => {
    expect(lineDefectClasses("builtin:critical:crack", rules, severities)).toEqual(["crack"]);
    expect(lineDefectClasses("scratch-c", rules, severities)).toEqual(["scratch"]);
    expect(lineDefectClasses("func-major", rules, severities)).toEqual([]);
    expect(lineDefectClasses("builtin:none", rules, severities)).toEqual([]);
  });
  it("reads a pixel-fault class rule as its most severe pixel-fault class", () => {
    expect(lineDefectClasses("pixels", rules, severities)).toEqual(["pixel-lit"]);
  });
});

describe("cosmeticNonconformities", () => {
  it("adds nothing while the grade keeps the promise", () => {
    expect(cosmeticNonconformities("B", grade("B", [["scratch-b", "B"]]))).toEqual([]);
    expect(
      cosmeticNonconformities(
        "C",
        grade("C", [
          ["scratch-c", "C"],
          ["dent-c", "C"],
        ]),
      ),
    ).toEqual([]);
  });

  it("counts the severity of the class whose rule broke the promise, with a reason", () => {
    expect(cosmeticNonconformities("A", grade("C", [["scratch-c", "C"]]))).toEqual([{ severity: "major", source: "cosmetic", label: "grade C (promised A): Scratch" }]);
  });

  it("only lines worse than the promise count: a B stain under a C scratch does not, when B was promised", () => {
    expect(
      severitiesOf(
        cosmeticNonconformities(
          "B",
          grade("C", [
            ["scratch-c", "C"],
            ["stain-b", "B"],
          ]),
        ),
      ),
    ).toEqual(["major"]);
  });

  it("counts once per severity class, whatever the number of classes in it (CLS)", () => {
    const defects = cosmeticNonconformities(
      "A",
      grade("C", [
        ["scratch-c", "C"],
        ["dent-c", "C"],
        ["stain-b", "B"],
      ]),
    );
    expect(defects).toEqual([
      { severity: "major", source: "cosmetic", label: "grade C (promised A): Scratch" },
      { severity: "minor", source: "cosmetic", label: "grade C (promised A): Dent, Stain" },
    ]);
  });

  it("a critical class counts as critical whatever the promise or an override says", () => {
    const lines: [string, "Reject"][] = [["builtin:critical:crack", "Reject"]];
    expect(severitiesOf(cosmeticNonconformities("C", grade("Reject", lines)))).toEqual(["critical"]);
    expect(severitiesOf(cosmeticNonconformities("A", grade("A", lines)))).toEqual(["critical"]);
  });

  it("an override below the promise with no line below it counts the fired cosmetic classes", () => {
    expect(cosmeticNonconformities("A", grade("C", [["stain-b", "B"]]))).toEqual([{ severity: "minor", source: "cosmetic", label: "grade C (promised A): Stain" }]);
    // B promised, B-rule fired, overridden to C: the stain is what the grader judged worse.
    expect(severitiesOf(cosmeticNonconformities("B", grade("C", [["stain-b", "B"]])))).toEqual(["minor"]);
  });

  it("an override below the promise with nothing fired counts as major, named as such", () => {
    expect(cosmeticNonconformities("A", grade("B", [["builtin:none", "A"]]))).toEqual([
      { severity: "major", source: "cosmetic", label: "grade B (promised A): overridden with no defect class to go by" },
    ]);
  });

  it("a grade below the promise only through a functional rule adds nothing cosmetic (the failure counts)", () => {
    expect(cosmeticNonconformities("A", grade("C", [["func-major", "C"]]))).toEqual([]);
    // A stain within the promise beside it is not what broke the promise either.
    expect(
      cosmeticNonconformities(
        "B",
        grade("C", [
          ["func-major", "C"],
          ["stain-b", "B"],
        ]),
      ),
    ).toEqual([]);
  });

  it("a line of a rule the rubric version does not have names no class", () => {
    expect(cosmeticNonconformities("A", grade("C", [["gone", "C"]]))).toEqual([{ severity: "major", source: "cosmetic", label: "grade C (promised A): overridden with no defect class to go by" }]);
  });
});

describe("the lot counts: units defective cosmetically only, functionally only, and both (CLS, AR)", () => {
  const plan = buildLotPlan({ lotSize: 120, level: "II", aqls: { critical: null, major: 1.0, minor: 2.5 }, severity: "normal", inspectAll: false, switchingReason: "" });
  const units = Array.from({ length: 20 }, (_, i) => ({ id: `u${i + 1}`, sampleIndex: i + 1, status: "graded" as const }));
  const items = ["power", "audio"];
  const passing = units.flatMap((u) => items.map((itemId) => ({ unitId: u.id, itemId, passed: true, severityOnFail: "major" as const })));
  const fail = (unitId: string, itemId: string, severityOnFail: "major" | "minor") => passing.map((r) => (r.unitId === unitId && r.itemId === itemId ? { ...r, passed: false, severityOnFail } : r));

  it("a cosmetic-only defective counts in its class and rejects the lot at Re", () => {
    const cosmeticDefects = new Map([["u2", cosmeticNonconformities("A", grade("C", [["scratch-c", "C"]]))]]);
    const verdict = lotVerdict(plan, unitFindings({ units, results: passing, checklistItemIds: items, cosmeticGrading: true, cosmeticDefects }));
    expect(verdict.classes.major.found).toBe(1);
    expect(verdict.classes.minor.found).toBe(0);
    expect(verdict.verdict).toBe("reject");
  });

  it("a functional-only defective counts as before", () => {
    const verdict = lotVerdict(plan, unitFindings({ units, results: fail("u3", "audio", "minor"), checklistItemIds: items, cosmeticGrading: true }));
    expect(verdict.classes.minor.found).toBe(1);
    expect(verdict.verdict).toBe("accept"); // minor 1 <= Ac 1
  });

  it("a unit defective both ways counts once per class: a major failure and a major scratch are one major", () => {
    const cosmeticDefects = new Map([
      [
        "u4",
        cosmeticNonconformities(
          "A",
          grade("C", [
            ["scratch-c", "C"],
            ["dent-c", "C"],
          ]),
        ),
      ],
    ]);
    const verdict = lotVerdict(plan, unitFindings({ units, results: fail("u4", "power", "major"), checklistItemIds: items, cosmeticGrading: true, cosmeticDefects }));
    expect(verdict.classes.major.found).toBe(1);
    expect(verdict.classes.minor.found).toBe(1);
    expect(verdict.classes.critical.found).toBe(0);
  });

  it("two cosmetic-only minor units reach the minor Re (2) and reject", () => {
    const minor = cosmeticNonconformities("A", grade("C", [["dent-c", "C"]]));
    const cosmeticDefects = new Map([
      ["u5", minor],
      ["u6", minor],
    ]);
    const verdict = lotVerdict(plan, unitFindings({ units, results: passing, checklistItemIds: items, cosmeticGrading: true, cosmeticDefects }));
    expect(verdict.classes.minor).toMatchObject({ found: 2, status: "reject" });
  });
});

describe("when a unit is inspected", () => {
  const units = [
    { id: "a", sampleIndex: 1, status: "on_bench" as const },
    { id: "b", sampleIndex: 2, status: "graded" as const },
  ];
  const results = [{ unitId: "a", itemId: "power", passed: true, severityOnFail: "major" as const }];
  it("with a published rubric, only a graded unit is inspected: a finished checklist is not enough", () => {
    expect(unitFindings({ units, results, checklistItemIds: ["power"], cosmeticGrading: true }).map((f) => f.inspected)).toEqual([false, true]);
  });
  it("without one, a finished checklist is enough", () => {
    expect(unitFindings({ units, results, checklistItemIds: ["power"], cosmeticGrading: false }).map((f) => f.inspected)).toEqual([true, true]);
  });
});
