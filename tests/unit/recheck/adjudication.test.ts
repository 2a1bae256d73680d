/**
 * The adjudication trigger (our rule, c, stated in lib/recheck/adjudication.ts), at its
 * boundaries; areas and thresholds by hand (HAND).
 */
import { describe, expect, it } from "vitest";
import { adjudicationDecision, adjudicationReasonsText, meaningfulAreaPx } from "@/lib/recheck/adjudication";
import type { RecheckClassComparison, RecheckComparison } from "@/lib/recheck/compare";
import { DEFAULT_RECHECK_SETTINGS } from "@/lib/recheck/settings";
import type { Grade } from "@/lib/grading/rubric-schema";
import { gradeAgreement, gradeSteps } from "@/lib/grading/grade-steps";

function classes(firstPx: number, recheckPx: number, iou: number): RecheckClassComparison {
  return { firstPx, recheckPx, sharedPx: 0, unionPx: firstPx + recheckPx, iou, dice: 0, firstDefects: 1, recheckDefects: 1, matched: 0, onlyFirst: 0, onlyRecheck: 0 };
}
function comparison(first: Grade, recheck: Grade, photos: { photoId: string; surfacePx: number; classes: Record<string, RecheckClassComparison> }[]): RecheckComparison {
  return { photos, classes: {}, grade: { first, recheck, steps: gradeSteps(first, recheck), agreement: gradeAgreement(first, recheck) } };
}

describe("meaningfulAreaPx", () => {
  it("is the larger of 100 px and 0.05 % of the Surface, rounded up (defaults, HAND)", () => {
    expect(meaningfulAreaPx(1_000_000, DEFAULT_RECHECK_SETTINGS)).toBe(500);
    expect(meaningfulAreaPx(12_000_000, DEFAULT_RECHECK_SETTINGS)).toBe(6000);
    expect(meaningfulAreaPx(10_000, DEFAULT_RECHECK_SETTINGS)).toBe(100);
    expect(meaningfulAreaPx(1_000_001, DEFAULT_RECHECK_SETTINGS)).toBe(501);
  });
});

describe("adjudicationDecision", () => {
  it("does not trigger when grades agree and every class overlaps enough", () => {
    const decision = adjudicationDecision(comparison("B", "B", [{ photoId: "p", surfacePx: 1_000_000, classes: { dent: classes(2000, 2100, 0.8) } }]), DEFAULT_RECHECK_SETTINGS);
    expect(decision).toEqual({ required: false, reasons: [] });
  });

  it("triggers on any grade difference, one step included", () => {
    const decision = adjudicationDecision(comparison("B", "C", []), DEFAULT_RECHECK_SETTINGS);
    expect(decision).toEqual({ required: true, reasons: [{ kind: "grade_differs", first: "B", recheck: "C", steps: 1 }] });
  });

  it("triggers on low IoU only when the larger side's area is meaningful: 499 px no, 500 px yes on a 1 MP Surface", () => {
    const at = (px: number, iou: number) => adjudicationDecision(comparison("A", "A", [{ photoId: "p", surfacePx: 1_000_000, classes: { dust: classes(px, 40, iou) } }]), DEFAULT_RECHECK_SETTINGS);
    expect(at(499, 0.1).required).toBe(false);
    expect(at(500, 0.1)).toEqual({ required: true, reasons: [{ kind: "regions_differ", photoId: "p", defect: "dust", iou: 0.1, largerPx: 500, meaningfulPx: 500 }] });
    // IoU exactly at the threshold does not trigger ("under the threshold").
    expect(at(5000, 0.5).required).toBe(false);
    expect(at(5000, 0.4999).required).toBe(true);
  });

  it("triggers when only one side marked a meaningful area (IoU 0), and lists every reason", () => {
    const decision = adjudicationDecision(
      comparison("C", "Reject", [
        { photoId: "front", surfacePx: 1_000_000, classes: { crack: classes(0, 800, 0), dust: classes(0, 60, 0) } },
        { photoId: "back", surfacePx: 1_000_000, classes: { dent: classes(3000, 0, 0) } },
      ]),
      DEFAULT_RECHECK_SETTINGS,
    );
    expect(decision.reasons.map((reason) => (reason.kind === "regions_differ" ? `${reason.photoId}/${reason.defect}` : reason.kind))).toEqual(["grade_differs", "front/crack", "back/dent"]);
  });

  it("follows the workspace's own threshold", () => {
    const strict = { ...DEFAULT_RECHECK_SETTINGS, iouThreshold: 0.9 };
    const input = comparison("A", "A", [{ photoId: "p", surfacePx: 1_000_000, classes: { dent: classes(2000, 2000, 0.8) } }]);
    expect(adjudicationDecision(input, DEFAULT_RECHECK_SETTINGS).required).toBe(false);
    expect(adjudicationDecision(input, strict).required).toBe(true);
  });
});

describe("adjudicationReasonsText", () => {
  it("says what differs when the grades agree, one class's photos told together (HAND)", () => {
    const decision = adjudicationDecision(
      comparison("Reject", "Reject", [
        { photoId: "p1", surfacePx: 1_000_000, classes: { swelling: classes(5000, 0, 0), dent: classes(2000, 2100, 0.8) } },
        { photoId: "p2", surfacePx: 1_000_000, classes: { swelling: classes(4000, 1000, 0.25) } },
      ]),
      DEFAULT_RECHECK_SETTINGS,
    );
    expect(adjudicationReasonsText(decision.reasons)).toBe("the swelling regions overlap 0 % to 25 % (IoU) on 2 photos");
    expect(adjudicationReasonsText(decision.reasons, (d) => (d === "swelling" ? "Swelling" : d))).toBe("the Swelling regions overlap 0 % to 25 % (IoU) on 2 photos");
  });

  it("names both grades when they differ, and a single photo as one", () => {
    const decision = adjudicationDecision(comparison("A", "C", [{ photoId: "p", surfacePx: 1_000_000, classes: { scratch: classes(900, 600, 0.1) } }]), DEFAULT_RECHECK_SETTINGS);
    expect(adjudicationReasonsText(decision.reasons)).toBe("the grades differ by 2 steps (A first, C on recheck); the scratch regions overlap 10 % (IoU) on one photo");
  });
});
