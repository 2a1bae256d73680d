/**
 * The running verdict against Ac/Re. Plans as in plan.test.ts (lot 120, II: critical 0/1 on 20,
 * major 0/1 on 13, minor 1/2 on 20 — Table 2-A cells N1, N2, N3). Rules:
 * AR   ISO 2859-1 single sampling: accept when defectives <= Ac, reject when >= Re (a, docs/references.md).
 * GAP  Reduced plans with a gap: Ac < found < Re → accept and reinstate normal (Z1.4 §10.1.4, a);
 *      J at 1.5 reduced → n 32, Ac 1, Re 4 (Z1, a).
 * CNT  Each unit counts at most once per severity; each class judged on its own first n units (c).
 */
import { describe, expect, it } from "vitest";
import { buildLotPlan } from "@/lib/lots/plan";
import { lotVerdict, type UnitFinding } from "@/lib/lots/verdict";
import type { DefectSeverity } from "@/lib/part-types/severity";

const plan = buildLotPlan({ lotSize: 120, level: "II", aqls: { critical: null, major: 1.0, minor: 2.5 }, severity: "normal", inspectAll: false, switchingReason: "" });

/** Units 1..inspected done; `defects` maps sample position → severities found there. */
function findings(inspected: number, defects: Record<number, DefectSeverity[]> = {}, total = 20): UnitFinding[] {
  return Array.from({ length: total }, (_, i) => ({
    unitId: `u${i + 1}`,
    sampleIndex: i + 1,
    inspected: i < inspected,
    defects: (defects[i + 1] ?? []).map((severity) => ({ severity, source: "functional" as const })),
  }));
}

describe("lotVerdict", () => {
  it("is pending until the samples are inspected", () => {
    const verdict = lotVerdict(plan, findings(0));
    expect(verdict).toMatchObject({ verdict: "pending", unitsInspected: 0, unitsToInspect: 20 });
    expect(verdict.summary).toBe("Pending: 0 of 20 units inspected; no class has reached its rejection number.");
  });

  it("accepts when every class's sample is inspected and within Ac (AR)", () => {
    const verdict = lotVerdict(plan, findings(20, { 4: ["minor"] }));
    expect(verdict.verdict).toBe("accept");
    expect(verdict.classes.minor).toMatchObject({ found: 1, accept: 1, reject: 2, inspected: 20, status: "accept" });
  });

  it("rejects at Re: two minor defectives among 20 (AR)", () => {
    const verdict = lotVerdict(plan, findings(20, { 4: ["minor"], 17: ["minor"] }));
    expect(verdict.verdict).toBe("reject");
    expect(verdict.summary).toBe("Reject: 2 minor defectives in the first 20 units reach Re 2.");
  });

  it("rejects as soon as a count reaches Re, before the sample is complete (AR)", () => {
    const verdict = lotVerdict(plan, findings(3, { 2: ["major"] }));
    expect(verdict.verdict).toBe("reject");
    expect(verdict.classes.major).toMatchObject({ found: 1, inspected: 3, status: "reject" });
    expect(verdict.classes.minor.status).toBe("pending");
  });

  it("judges each class on its own first n units; finds beyond them are reported, not counted (CNT)", () => {
    const verdict = lotVerdict(plan, findings(20, { 15: ["major"] }));
    expect(verdict.classes.major).toMatchObject({ sampleSize: 13, inspected: 13, found: 0, foundOutsideSample: 1, status: "accept" });
    expect(verdict.verdict).toBe("accept");
  });

  it("a major class can be decided before the minor one (13 of 20 done)", () => {
    const verdict = lotVerdict(plan, findings(13));
    expect(verdict.classes.major.status).toBe("accept");
    expect(verdict.classes.minor.status).toBe("pending");
    expect(verdict.verdict).toBe("pending");
  });

  it("counts a unit once per severity, in each class it has a defect of (CNT)", () => {
    const verdict = lotVerdict(plan, findings(20, { 6: ["critical", "major", "major", "minor"] }));
    expect(verdict.classes.critical.found).toBe(1);
    expect(verdict.classes.major.found).toBe(1);
    expect(verdict.classes.minor.found).toBe(1);
    expect(verdict.summary).toBe("Reject: 1 critical defective in the first 20 units reaches Re 1; 1 major defective in the first 13 units reaches Re 1.");
  });

  it("accepts in a reduced plan's gap and says normal inspection returns (GAP)", () => {
    const reduced = buildLotPlan({ lotSize: 1000, level: "II", aqls: { critical: null, major: 1.5, minor: 1.5 }, severity: "reduced", inspectAll: false, switchingReason: "" });
    expect(reduced.byDefectSeverity.major).toMatchObject({ sampleSize: 32, accept: 1, reject: 4 });
    const verdict = lotVerdict(reduced, findings(32, { 3: ["major"], 9: ["major"] }, 32));
    expect(verdict).toMatchObject({ verdict: "accept", reinstateNormal: true });
    expect(verdict.classes.major.reinstateNormal).toBe(true);
  });

  it("refuses inconsistent findings", () => {
    expect(() => lotVerdict(plan, [...findings(1, {}, 1), ...findings(1, {}, 1)])).toThrow(/appears twice/);
    expect(() => lotVerdict(plan, [{ unitId: "x", sampleIndex: 21, inspected: true, defects: [] }])).toThrow(/outside 1..20/);
  });
});
