/** Rubric diff sentences (our own wording spec from the grading brief). */
import { describe, expect, it } from "vitest";
import { diffRubrics } from "@/lib/grading/diff";
import type { Rubric, Rule } from "@/lib/grading/rubric-schema";

const labels = { zones: { "lens-window": "lens window" }, views: { lens: "Lens" } };
const lensB: Rule = { id: "lens-b", metric: "share", defect: "scratch", zone: "lens-window", comparison: ">", threshold: 0.5, grade: "B" };
const dust: Rule = { id: "dust-c", metric: "count", defect: "dust", view: "lens", comparison: ">", threshold: 2, grade: "C" };
const failures: Rule = { id: "f", metric: "functionalFailures", severity: "critical", comparison: ">", threshold: 0, grade: "Reject" };
const v1: Rubric = { rules: [lensB, dust, failures], notes: ["Example rubric."] };

const texts = (before: Rubric, after: Rubric) => diffRubrics(before, after, labels).changes.map((c) => c.text);

describe("diffRubrics", () => {
  it("reports nothing for identical rubrics, even reordered", () => {
    expect(diffRubrics(v1, { ...v1, rules: [failures, dust, lensB] })).toEqual({ added: [], removed: [], changed: [], changes: [], unchanged: true });
  });

  it("writes one sentence for a threshold change", () => {
    const v2: Rubric = { ...v1, rules: [{ ...lensB, threshold: 0.3 }, dust, failures] };
    const diff = diffRubrics(v1, v2, labels);
    expect(diff.changed).toEqual(["lens-b"]);
    expect(diff.changes).toEqual([{ kind: "changed", ruleId: "lens-b", text: "scratch on lens window: threshold for B changed from 0.5 % to 0.3 %" }]);
  });

  it("describes grade, comparison, selector and metric changes", () => {
    expect(texts(v1, { ...v1, rules: [{ ...lensB, grade: "C" }, dust, failures] })).toEqual(["scratch on lens window: grade changed from B to C"]);
    expect(texts(v1, { ...v1, rules: [lensB, { ...dust, comparison: ">=", threshold: 3 }, failures] })).toEqual(["dust in the Lens view: condition for C changed from > 2 to ≥ 3"]);
    expect(texts(v1, { ...v1, rules: [{ ...lensB, defect: "dust" }, dust, failures] })).toEqual(["scratch on lens window: now applies to dust on lens window"]);
    expect(texts(v1, { ...v1, rules: [lensB, dust, { ...failures, severity: "major", grade: "C" }] })).toEqual([
      "critical functional failures: now applies to major functional failures",
      "major functional failures: grade changed from Reject to C",
    ]);
    const lengthRule: Rule = { id: "lens-b", metric: "maxLengthMm", defect: "scratch", comparison: ">", threshold: 2, grade: "B" };
    expect(texts(v1, { ...v1, rules: [lengthRule, dust, failures] })).toEqual(['Rule "lens-b" changed from "scratch on lens window, share > 0.5 % → B" to "scratch, longest > 2.0 mm → B"']);
  });

  it("lists removed, changed, added rules and notes in that order", () => {
    const pixel: Rule = { id: "px", metric: "pixelFaultClass", comparison: "worse-than", threshold: "II", grade: "C" };
    const v2: Rubric = { rules: [pixel, { ...lensB, threshold: 1 }, failures], notes: ["Adapted for Korvo X2 lots."] };
    const diff = diffRubrics(v1, v2, labels);
    expect(diff).toMatchObject({ added: ["px"], removed: ["dust-c"], changed: ["lens-b"], unchanged: false });
    expect(diff.changes).toEqual([
      { kind: "removed", ruleId: "dust-c", text: 'Removed rule "dust-c": dust in the Lens view, count > 2 → C' },
      { kind: "changed", ruleId: "lens-b", text: "scratch on lens window: threshold for B changed from 0.5 % to 1.0 %" },
      { kind: "added", ruleId: "px", text: 'Added rule "px": pixel faults, worse than class II → C' },
      { kind: "notes", ruleId: null, text: 'Note removed: "Example rubric."' },
      { kind: "notes", ruleId: null, text: 'Note added: "Adapted for Korvo X2 lots."' },
    ]);
  });
});
