/**
 * The plan stored with a lot, built from ISO 2859-1 single sampling plans per defect severity.
 * Cells (sources as named in tests/unit/sampling/iso2859.test.ts, marks as in docs/references.md):
 * - Lot 120, level II → F (Table 1, REF a). Normal: F at 1.0 ↑ E n 13 0/1 (N1, N3); F at 2.5 n 20 1/2 (N1, N2).
 *   Tightened: F at 1.0 n 20 0/1 (T1, T2); F at 2.5 ↓ G n 32 1/2 (T1).
 * - Lot 4, II → A. A at 0.65 ↓ F n 20 (N1, N3) ≥ lot size → 100 % (table footnote, REF a); A at 6.5 n 2 0/1 (N1, N2).
 * - Zero acceptance for critical defects (Ac 0 / Re 1 on every unit): common practice (c).
 */
import { describe, expect, it } from "vitest";
import { buildLotPlan, judgedOnText } from "@/lib/lots/plan";
import { SamplingInputError } from "@/lib/sampling/iso2859";

const base = { level: "II" as const, aqls: { critical: null, major: 1.0, minor: 2.5 }, severity: "normal" as const, inspectAll: false, switchingReason: "starting state" };

describe("buildLotPlan", () => {
  it("lot 120 at II, normal: each class its own plan; the largest sample is inspected", () => {
    const plan = buildLotPlan({ ...base, lotSize: 120 });
    expect(plan).toMatchObject({ lotSize: 120, level: "II", severity: "normal", sampleSize: 20, hundredPercent: false, switchingReason: "starting state" });
    expect(plan.byDefectSeverity).toEqual({
      critical: { aql: null, codeLetter: "F", planLetter: "F", sampleSize: 20, accept: 0, reject: 1 },
      major: { aql: 1.0, codeLetter: "F", planLetter: "E", sampleSize: 13, accept: 0, reject: 1 },
      minor: { aql: 2.5, codeLetter: "F", planLetter: "F", sampleSize: 20, accept: 1, reject: 2 },
    });
    expect(judgedOnText(plan, "major")).toBe("the first 13 units of the sample order");
    expect(judgedOnText(plan, "critical")).toBe("every sampled unit");
  });

  it("lot 120 at II, tightened: F at 1.0 → n 20 0/1, F at 2.5 → G n 32 1/2 (T1, T2)", () => {
    const plan = buildLotPlan({ ...base, lotSize: 120, severity: "tightened" });
    expect(plan.sampleSize).toBe(32);
    expect(plan.byDefectSeverity.major).toMatchObject({ planLetter: "F", sampleSize: 20, accept: 0, reject: 1 });
    expect(plan.byDefectSeverity.minor).toMatchObject({ planLetter: "G", sampleSize: 32, accept: 1, reject: 2 });
    expect(plan.byDefectSeverity.critical).toMatchObject({ sampleSize: 32, accept: 0, reject: 1 });
  });

  it("a plan whose sample reaches the lot size inspects every unit (lot 4: A at 0.65 → n 20 ≥ 4)", () => {
    const plan = buildLotPlan({ ...base, lotSize: 4, aqls: { critical: null, major: 0.65, minor: 6.5 } });
    expect(plan).toMatchObject({ sampleSize: 4, hundredPercent: true });
    expect(plan.byDefectSeverity.major).toMatchObject({ sampleSize: 4, accept: 0, reject: 1 });
    expect(plan.byDefectSeverity.minor).toMatchObject({ planLetter: "A", sampleSize: 2, accept: 0, reject: 1 });
    expect(judgedOnText(plan, "major")).toBe("every unit of the lot");
  });

  it("a part type inspected 100 % makes every unit a sample unit; classes keep their own n", () => {
    const plan = buildLotPlan({ ...base, lotSize: 120, inspectAll: true });
    expect(plan).toMatchObject({ sampleSize: 120, hundredPercent: true });
    expect(plan.byDefectSeverity.critical.sampleSize).toBe(120);
    expect(plan.byDefectSeverity.major.sampleSize).toBe(13);
  });

  it("uses a critical AQL when one is given (F at 0.65 → n 20 0/1; N1, N2)", () => {
    const plan = buildLotPlan({ ...base, lotSize: 120, aqls: { critical: 0.65, major: 1.0, minor: 2.5 } });
    expect(plan.byDefectSeverity.critical).toEqual({ aql: 0.65, codeLetter: "F", planLetter: "F", sampleSize: 20, accept: 0, reject: 1 });
  });

  it("refuses AQLs outside the preferred series and impossible lot sizes", () => {
    expect(() => buildLotPlan({ ...base, lotSize: 120, aqls: { critical: null, major: 2, minor: 2.5 } })).toThrow(SamplingInputError);
    expect(() => buildLotPlan({ ...base, lotSize: 0 })).toThrow(SamplingInputError);
  });
});
