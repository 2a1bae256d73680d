/**
 * Rubric evaluation: worst grade wins (docs/contracts.md scale A < B < C < Reject), one explanation line
 * per fired rule, "could not evaluate" notes instead of silent passes. Thresholds in these
 * rubrics are (c) invented examples; expected numbers are hand computations noted beside them.
 */
import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors";
import { evaluateRubric, ruleFires } from "@/lib/grading/evaluate";
import type { Rubric, Rule } from "@/lib/grading/rubric-schema";
import { buildUnitMetrics } from "@/lib/grading/unit-metrics";
import { noFailures, photo } from "./fixtures";

const labels = {
  zones: { "lens-window": "lens window" },
  views: { back: "Back", lens: "Lens", "screen-white": "Screen white" },
};

const unit = (photos: Parameters<typeof photo>[0][], functionalFailures = noFailures) => buildUnitMetrics({ photos: photos.map(photo), functionalFailures });

const grade = (rules: Rule[], metrics: ReturnType<typeof unit>, defectSeverities = {}) => evaluateRubric({ rubric: { rules }, metrics, defectSeverities, labels });

const lensShare: Rule = { id: "lens-b", metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 0.5, grade: "B" };
const lensUnit = (share: number) => unit([{ photoId: "l1", viewKey: "lens", zones: { "lens-window": { byDefect: { scratch: { share } } } } }]);

describe("evaluateRubric", () => {
  it("grades a clean unit A with a single line saying so", () => {
    expect(grade([lensShare], lensUnit(0))).toEqual({
      grade: "A",
      lines: [{ ruleId: "builtin:none", grade: "A", text: "No rule fired: grade A", value: null, threshold: null }],
      notes: [],
      unevaluatedRuleIds: [],
    });
  });

  it("writes the explanation line of a share rule in percent", () => {
    // 0.008 of the zone = 0.8 %.
    const result = grade([lensShare], lensUnit(0.008));
    expect(result.grade).toBe("B");
    expect(result.lines).toEqual([{ ruleId: "lens-b", grade: "B", text: "scratch covers 0.8 % of lens window > 0.5 % allowed for A → B", value: 0.8, threshold: 0.5 }]);
  });

  it("does not fire '>' at exactly the threshold but fires '>='; 7/100 equals a 7 % threshold", () => {
    const at7 = lensUnit(7 / 100);
    expect(grade([{ ...lensShare, threshold: 7 }], at7).grade).toBe("A");
    const atOrOver = grade([{ ...lensShare, threshold: 7, comparison: ">=" }], at7);
    expect(atOrOver.lines[0].text).toBe("scratch covers 7.0 % of lens window ≥ 7.0 % limit for A → B");
    // 0.504 % against 0.5 %: printed with enough decimals to differ.
    expect(grade([lensShare], lensUnit(0.00504)).lines[0].text).toBe("scratch covers 0.504 % of lens window > 0.5 % allowed for A → B");
  });

  it("lets the worst grade win and orders lines worst first, then rubric order", () => {
    const rules: Rule[] = [
      { id: "count-b", metric: "count", defect: "scratch", view: "back", comparison: ">", threshold: 1, grade: "B" },
      { id: "length-c", metric: "maxLengthMm", defect: "scratch", comparison: ">", threshold: 3, grade: "C" },
      { id: "total-b", metric: "totalLengthMm", defect: "scratch", comparison: ">", threshold: 5, grade: "B" },
      { id: "area-reject", metric: "areaMm2", defect: "dent", comparison: ">=", threshold: 2, grade: "Reject" },
      { id: "diam-c", metric: "maxDiameterMm", defect: "dust", comparison: ">", threshold: 0.2, grade: "C" },
      { id: "not-fired", metric: "count", defect: "crack", comparison: ">", threshold: 0, grade: "Reject" },
    ];
    const metrics = unit([
      { photoId: "b1", viewKey: "back", defects: { scratch: { share: 0.01, count: 2, maxLengthMm: 4.24, totalLengthMm: 6.5 }, dent: { share: 0.01, areaMm2: 1.25 } } },
      { photoId: "b2", viewKey: "back", defects: { dent: { share: 0.01, areaMm2: 0.75 }, dust: { share: 0.001, maxDiameterMm: 0.35 } } },
    ]);
    const result = grade(rules, metrics);
    expect(result.grade).toBe("Reject");
    expect(result.lines.map((l) => [l.ruleId, l.text])).toEqual([
      // 1.25 + 0.75 = 2.0 mm² of dent, ">=" 2.
      ["area-reject", "dent area 2.0 mm² ≥ 2.0 mm² limit for C → Reject"],
      ["length-c", "longest scratch 4.2 mm > 3.0 mm allowed for B → C"],
      ["diam-c", "largest dust 0.3 mm across > 0.2 mm allowed for B → C"],
      ["count-b", "scratch count 2 in the Back view > 1 allowed for A → B"],
      ["total-b", "scratch total length 6.5 mm > 5.0 mm allowed for A → B"],
    ]);
    expect(result.notes).toEqual([]);
  });

  it("grades pixel-fault classes as 'worse than' a class", () => {
    const rules: Rule[] = [
      { id: "px-b", metric: "pixelFaultClass", view: "screen-white", comparison: "worse-than", threshold: "I", grade: "B" },
      { id: "px-c", metric: "pixelFaultClass", comparison: "worse-than", threshold: "II", grade: "C" },
      { id: "px-reject", metric: "pixelFaultClass", comparison: "worse-than", threshold: "IV", grade: "Reject" },
    ];
    const classII = grade(rules, unit([{ photoId: "w", viewKey: "screen-white", pixelClass: "II" }]));
    expect(classII.grade).toBe("B"); // II is worse than I, not worse than II.
    expect(classII.lines[0].text).toBe("pixel faults in the Screen white view are class II (ISO 13406-2), worse than class I allowed for A → B");
    const beyond = grade(rules, unit([{ photoId: "w", viewKey: "screen-white", pixelClass: "beyond" }]));
    expect(beyond.grade).toBe("Reject");
    expect(beyond.lines[0]).toEqual({
      ruleId: "px-reject",
      grade: "Reject",
      text: "pixel faults are beyond class IV (ISO 13406-2), worse than class IV allowed for C → Reject",
      value: "beyond",
      threshold: "IV",
    });
    expect(grade(rules, unit([{ photoId: "w", viewKey: "screen-white", pixelClass: "I" }])).grade).toBe("A");
  });

  it("grades functional failures by severity", () => {
    const rules: Rule[] = [
      { id: "f-critical", metric: "functionalFailures", severity: "critical", comparison: ">", threshold: 0, grade: "Reject" },
      { id: "f-minor", metric: "functionalFailures", severity: "minor", comparison: ">", threshold: 1, grade: "B" },
    ];
    const result = grade(rules, unit([], { critical: 1, major: 0, minor: 2 }));
    expect(result.grade).toBe("Reject");
    expect(result.lines.map((l) => l.text)).toEqual(["critical functional failures 1 > 0 allowed for C → Reject", "minor functional failures 2 > 1 allowed for A → B"]);
    expect(grade(rules, unit([], { critical: 0, major: 5, minor: 1 })).grade).toBe("A");
  });

  it("writes a 'could not evaluate' note for a mm rule on an uncalibrated photo instead of passing", () => {
    const length: Rule = { id: "len-b", metric: "maxLengthMm", defect: "scratch", view: "back", comparison: ">", threshold: 3, grade: "B" };
    const result = grade([length], unit([{ photoId: "p7", viewKey: "back", pxPerMm: null, defects: { scratch: { share: 0.01 } } }]));
    expect(result).toEqual({
      grade: "A",
      lines: [
        {
          ruleId: "builtin:none",
          grade: "A",
          text: "No rule fired: grade A; 1 rule could not be evaluated (see notes)",
          value: null,
          threshold: null,
        },
      ],
      notes: ['Could not evaluate "len-b" (scratch in the Back view, longest > 3.0 mm → B) on photo p7 (Back): not calibrated, so millimetres are unknown.'],
      unevaluatedRuleIds: ["len-b"],
    });
  });

  it("still fires on calibrated photos when another photo is uncalibrated, and notes only when it could not decide", () => {
    const total: Rule = { id: "total-c", metric: "totalLengthMm", defect: "scratch", comparison: ">", threshold: 10, grade: "C" };
    const over = unit([
      { photoId: "a", viewKey: "back", defects: { scratch: { share: 0.01, totalLengthMm: 12 } } },
      { photoId: "b", viewKey: "back", pxPerMm: null, defects: { scratch: { share: 0.01 } } },
    ]);
    expect(grade([total], over)).toMatchObject({ grade: "C", notes: [], unevaluatedRuleIds: [] });
    const under = unit([
      { photoId: "a", viewKey: "back", defects: { scratch: { share: 0.01, totalLengthMm: 4 } } },
      { photoId: "b", viewKey: "back", pxPerMm: null, defects: { scratch: { share: 0.01 } } },
    ]);
    expect(grade([total], under)).toMatchObject({
      grade: "A",
      notes: ['Could not evaluate "total-c" (scratch, total length > 10.0 mm → C) on photo b (Back): not calibrated, so millimetres are unknown.'],
    });
    // A calibrated photo showing scratches but no Line regions: nothing to measure a length from.
    const noLines = unit([{ photoId: "c", viewKey: "back", defects: { scratch: { share: 0.01 } } }]);
    expect(grade([total], noLines).notes).toEqual(['Could not evaluate "total-c" (scratch, total length > 10.0 mm → C) on photo c (Back): no length was measured (lengths come from Line regions).']);
  });

  it("notes rules whose view, zone or pixel count is missing", () => {
    const metrics = unit([{ photoId: "b", viewKey: "back" }]);
    const result = grade(
      [
        { ...lensShare, view: "lens" },
        { id: "zone-only", metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 1, grade: "C" },
        { id: "px", metric: "pixelFaultClass", comparison: "worse-than", threshold: "II", grade: "C" },
      ],
      metrics,
    );
    expect(result.notes).toEqual([
      'Could not evaluate "lens-b" (scratch on lens window in the Lens view, share > 0.5 % → B): no photo of the Lens view was measured.',
      'Could not evaluate "zone-only" (scratch on lens window, share > 1.0 % → C): zone lens window is not on any measured photo.',
      'Could not evaluate "px" (pixel faults, worse than class II → C): no measured photo has a pixel-fault count.',
    ]);
    expect(result.unevaluatedRuleIds).toEqual(["lens-b", "zone-only", "px"]);
    expect(result.lines[0].text).toBe("No rule fired: grade A; 3 rules could not be evaluated (see notes)");
  });

  it("rejects a unit showing a critical defect class with its own line, before rule lines", () => {
    const metrics = unit([
      { photoId: "f", viewKey: "front", defects: { swelling: { share: 0.2, count: 1 } } },
      { photoId: "b", viewKey: "back", defects: { swelling: { share: 0.1, count: 2 }, dent: { share: 0.01, count: 1 } } },
    ]);
    const rules: Rule[] = [{ id: "dent-reject", metric: "count", defect: "dent", comparison: ">", threshold: 0, grade: "Reject" }];
    const result = evaluateRubric({
      rubric: { rules },
      metrics,
      defectSeverities: { dent: "major", swelling: "critical" },
      labels: { defects: { swelling: "Swelling" } },
    });
    expect(result.grade).toBe("Reject");
    expect(result.lines).toEqual([
      { ruleId: "builtin:critical:swelling", grade: "Reject", text: "Swelling found (3 regions): a critical defect for this part type → Reject", value: 3, threshold: 0 },
      { ruleId: "dent-reject", grade: "Reject", text: "dent count 1 > 0 allowed for C → Reject", value: 1, threshold: 0 },
    ]);
    // Major severities do not grade by themselves.
    expect(evaluateRubric({ rubric: { rules: [] }, metrics, defectSeverities: { dent: "major" } }).grade).toBe("A");
  });

  it("is deterministic whatever the key order of the severities", () => {
    const metrics = unit([{ photoId: "f", viewKey: "front", defects: { crack: { share: 0.01 }, moisture: { share: 0.01 } } }]);
    const a = evaluateRubric({ rubric: { rules: [] }, metrics, defectSeverities: { moisture: "critical", crack: "critical" } });
    const b = evaluateRubric({ rubric: { rules: [] }, metrics, defectSeverities: { crack: "critical", moisture: "critical" } });
    expect(a).toEqual(b);
    expect(a.lines.map((l) => l.ruleId)).toEqual(["builtin:critical:crack", "builtin:critical:moisture"]);
  });

  it("refuses an invalid rubric with a clear error", () => {
    const bad = { rules: [{ ...lensShare, threshold: -1 }] } as Rubric;
    expect(() => grade(bad.rules, lensUnit(0))).toThrowError(new AppError("bad_request", 'The rubric is not valid: Rule 1 ("lens-b"), threshold: cannot be negative'));
  });
});

describe("ruleFires", () => {
  it("compares with a tolerance only at the threshold", () => {
    const gt: Rule = { ...lensShare, threshold: 0.3 };
    expect(ruleFires(gt, 0.1 + 0.2)).toBe(false); // 0.30000000000000004 is "equal" to 0.3
    expect(ruleFires({ ...gt, comparison: ">=" }, 0.1 + 0.2)).toBe(true);
    expect(ruleFires(gt, 0.3001)).toBe(true);
  });
});
