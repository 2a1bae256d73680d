/**
 * The evidence e-mail's template: placeholders checked before anything is sent, filled from the
 * lot report's data (the counts the decision rested on). Expected texts are written out by hand
 * from the fixture (support/fixtures/report-data.ts), not produced by the code under test.
 */
import { describe, expect, it } from "vitest";
import { checkTemplate, DEFAULT_EVIDENCE_BODY, DEFAULT_EVIDENCE_SUBJECT, evidenceText, evidenceValues, fillTemplate, templateProblemMessage, type FilesDelivery } from "@/lib/evidence/template";
import { lotReportFixture } from "@/support/fixtures/report-data";

const report = lotReportFixture({ units: 32, defective: 6 });
const attached: FilesDelivery = { kind: "attached" };
const byLink: FilesDelivery = { kind: "link", url: "https://qc.example/evidence/tok", files: 9, totalBytes: 12_582_912, expiresAt: "2 Jan 2027, 14:00" };

describe("evidenceValues", () => {
  it("states the decision, the plan's Ac/Re and the defectives found per severity", () => {
    const values = evidenceValues(report, "CLM-2026-0007", attached);
    expect(values.decision).toBe("rejected — return to vendor");
    expect(values.plan).toBe("critical 32 units, Ac 0 / Re 1; major 32 units, Ac 1 / Re 2; minor 32 units, Ac 3 / Re 4");
    expect(values.defectives).toBe("critical 0 of 32; major 3 of 32; minor 6 of 32");
    expect(values.lot).toBe("PO-2026-0417");
    expect(values.supplier).toBe("Ørjan Brændøy Komponenter");
    expect(values.claimRef).toBe("CLM-2026-0007");
  });

  it("writes a dash for a decision without a reason", () => {
    expect(evidenceValues({ ...report, decision: { ...report.decision!, reason: "  " } }, "X", attached).reason).toBe("—");
  });
});

describe("checkTemplate and fillTemplate", () => {
  it("the default subject and body use only known placeholders and fill completely", () => {
    const values = evidenceValues(report, "CLM-2026-0007", attached);
    expect(checkTemplate(DEFAULT_EVIDENCE_SUBJECT).problems).toEqual([]);
    expect(checkTemplate(DEFAULT_EVIDENCE_BODY).problems).toEqual([]);
    expect(fillTemplate(DEFAULT_EVIDENCE_SUBJECT, values)).toBe("Lot PO-2026-0417: rejected — return to vendor (claim CLM-2026-0007)");
    const body = fillTemplate(DEFAULT_EVIDENCE_BODY, values);
    expect(body).not.toMatch(/\{\{|\}\}/);
    expect(body).toContain("Reason: Crack rate far above the contract");
  });

  it("allows spaces inside the braces and a value holding $& or braces stays as it is", () => {
    const values = { ...evidenceValues(report, "A", attached), reason: "costs $& {{lot}}" };
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
    expect(() => fillTemplate("{{nope}}", evidenceValues(report, "A", attached))).toThrow(RangeError);
  });
});

describe("what the e-mail says about the files", () => {
  const filesLine = "The lot inspection report (PDF), the photos of the defective units with their defects marked, and a table of the sampled units";

  it("attached: says they are attached, and nothing of a link", () => {
    const body = evidenceText(DEFAULT_EVIDENCE_BODY, evidenceValues(report, "CLM-2026-0007", attached), attached);
    expect(body).toContain(`Please quote claim CLM-2026-0007 in your reply. ${filesLine} are attached.`);
    expect(body).not.toMatch(/link|too large/);
  });

  it("by link: says they are too large to attach and gives the link with its expiry, before the sign-off, never 'attached'", () => {
    const body = evidenceText(DEFAULT_EVIDENCE_BODY, evidenceValues(report, "CLM-2026-0007", byLink), byLink);
    // 12 582 912 bytes = 12 × 1 048 576 (12.0 MB, binary megabytes as the Preview's sizes).
    expect(body).toContain(
      `Please quote claim CLM-2026-0007 in your reply. ${filesLine} (9 files, 12.0 MB) are too large to attach; they are on a read-only page you can open until 2 Jan 2027, 14:00:\nhttps://qc.example/evidence/tok\n\nRegards,`,
    );
    expect(body).not.toContain("are attached");
    expect(body.match(/https:\/\/qc\.example\/evidence\/tok/g)).toHaveLength(1);
  });

  it("a body without {{files}} gets the link at the end when the files go by link, and is left as written when they are attached", () => {
    const own = "Hello,\n\nsee claim {{claimRef}}.\n\nRegards";
    expect(evidenceText(own, evidenceValues(report, "R-1", attached), attached)).toBe("Hello,\n\nsee claim R-1.\n\nRegards");
    expect(evidenceText(own, evidenceValues(report, "R-1", byLink), byLink)).toBe(
      `Hello,\n\nsee claim R-1.\n\nRegards\n\n${filesLine} (9 files, 12.0 MB) are too large to attach; they are on a read-only page you can open until 2 Jan 2027, 14:00:\nhttps://qc.example/evidence/tok`,
    );
  });
});
