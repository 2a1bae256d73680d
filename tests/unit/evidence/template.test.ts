/**
 * The evidence e-mail's template: placeholders checked before anything is sent, filled from the
 * lot report's data (the counts the decision rested on). Expected texts are written out by hand
 * from the fixture (support/fixtures/report-data.ts), not produced by the code under test.
 */
import { describe, expect, it } from "vitest";
import { checkTemplate, DEFAULT_EVIDENCE_BODY, DEFAULT_EVIDENCE_SUBJECT, evidenceValues, fillTemplate, templateProblemMessage } from "@/lib/evidence/template";
import { lotReportFixture } from "@/support/fixtures/report-data";

const report = lotReportFixture({ units: 32, defective: 6 });

describe("evidenceValues", () => {
  it("states the decision, the plan's Ac/Re and the defectives found per severity", () => {
    const values = evidenceValues(report, "CLM-2026-0007");
    expect(values.decision).toBe("rejected — return to vendor");
    expect(values.plan).toBe("critical 32 units, Ac 0 / Re 1; major 32 units, Ac 1 / Re 2; minor 32 units, Ac 3 / Re 4");
    expect(values.defectives).toBe("critical 0 of 32; major 3 of 32; minor 6 of 32");
    expect(values.lot).toBe("PO-2026-0417");
    expect(values.supplier).toBe("Ørjan Brændøy Komponenter");
    expect(values.claimRef).toBe("CLM-2026-0007");
  });

  it("writes a dash for a decision without a reason", () => {
    expect(evidenceValues({ ...report, decision: { ...report.decision!, reason: "  " } }, "X").reason).toBe("—");
  });
});

describe("checkTemplate and fillTemplate", () => {
  it("the default subject and body use only known placeholders and fill completely", () => {
    const values = evidenceValues(report, "CLM-2026-0007");
    expect(checkTemplate(DEFAULT_EVIDENCE_SUBJECT).problems).toEqual([]);
    expect(checkTemplate(DEFAULT_EVIDENCE_BODY).problems).toEqual([]);
    expect(fillTemplate(DEFAULT_EVIDENCE_SUBJECT, values)).toBe("Lot PO-2026-0417: rejected — return to vendor (claim CLM-2026-0007)");
    const body = fillTemplate(DEFAULT_EVIDENCE_BODY, values);
    expect(body).not.toMatch(/\{\{|\}\}/);
    expect(body).toContain("Reason: Crack rate far above the contract");
  });

  it("allows spaces inside the braces and a value holding $& or braces stays as it is", () => {
    const values = { ...evidenceValues(report, "A"), reason: "costs $& {{lot}}" };
    expect(fillTemplate("Why: {{ reason }}.", values)).toBe("Why: costs $& {{lot}}.");
  });

  it("names an unknown placeholder and an unclosed one in a sentence", () => {
    expect(checkTemplate("Hi {{supplierName}} and {{lot").problems).toEqual([
      { kind: "unknown", name: "supplierName" },
      { kind: "unclosed", at: 24 },
    ]);
    expect(templateProblemMessage("body", "Hi {{supplierName}}")).toMatch(/names \{\{supplierName\}\}, which is not a placeholder\. Use one of \{\{lot\}\}, /);
    expect(templateProblemMessage("subject", "Lot {{lot")).toBe('The subject has a "{{" without its closing "}}" (at character 5).');
    expect(templateProblemMessage("body", "Lot {{lot}}")).toBeNull();
    expect(() => fillTemplate("{{nope}}", evidenceValues(report, "A"))).toThrow(RangeError);
  });
});
