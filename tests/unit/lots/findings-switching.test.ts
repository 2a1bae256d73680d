/**
 * From stored units and results to verdict findings, and from decided lots to the switching rules.
 * SW  ISO 2859-1 switching: 2 of 5 or fewer consecutive lots not accepted on normal → tightened
 *     (b, docs/references.md; the same chart on sqconline.com, a).
 */
import { describe, expect, it } from "vitest";
import type { LotDecisionCounts } from "@/db/schema/lots";
import { checklistComplete, unitFindings } from "@/lib/lots/findings";
import { buildLotPlan } from "@/lib/lots/plan";
import { decidedLotForSwitching, switchingInputFor, type DecidedLotRow } from "@/lib/lots/switching-history";
import { nextInspectionState } from "@/lib/sampling/switching";

describe("unitFindings", () => {
  const items = ["ocv", "swelling"];
  it("without a published rubric, a unit is inspected when every current item has a result, or once graded", () => {
    const found = unitFindings({
      units: [
        { id: "a", sampleIndex: 1, status: "on_bench" },
        { id: "b", sampleIndex: 2, status: "on_bench" },
        { id: "c", sampleIndex: 3, status: "graded" },
      ],
      results: [
        { unitId: "a", itemId: "ocv", passed: false, severityOnFail: "major" },
        { unitId: "a", itemId: "swelling", passed: true, severityOnFail: "critical" },
        { unitId: "b", itemId: "swelling", passed: false, severityOnFail: "critical" },
      ],
      checklistItemIds: items,
      cosmeticGrading: false,
    });
    expect(found).toEqual([
      { unitId: "a", sampleIndex: 1, inspected: true, defects: [{ severity: "major", source: "functional", label: "ocv" }] },
      { unitId: "b", sampleIndex: 2, inspected: false, defects: [{ severity: "critical", source: "functional", label: "swelling" }] },
      { unitId: "c", sampleIndex: 3, inspected: true, defects: [] },
    ]);
  });
  it("an empty checklist is never complete on its own", () => {
    expect(checklistComplete([], [])).toBe(false);
    expect(checklistComplete(["a"], [{ itemId: "a" }])).toBe(true);
  });
});

describe("decided lots → switching rules", () => {
  const plan = buildLotPlan({ lotSize: 120, level: "II", aqls: { critical: null, major: 1.0, minor: 2.5 }, severity: "normal", inspectAll: false, switchingReason: "" });
  const counts = (major: number): LotDecisionCounts => ({
    critical: { found: 0, inspected: 20, sampleSize: 20 },
    major: { found: major, inspected: 13, sampleSize: 13 },
    minor: { found: 0, inspected: 20, sampleSize: 20 },
  });
  const lot = (id: string, major: number, purchaseRef = id): DecidedLotRow => ({
    id,
    purchaseRef,
    inspectionSeverity: "normal",
    verdict: major >= 1 ? "reject" : "accept",
    plan,
    decisionCounts: counts(major),
  });

  it("maps classes with their Ac/Re and found counts (critical without an AQL carries none)", () => {
    expect(decidedLotForSwitching(lot("l1", 1))).toEqual({
      lotId: "l1",
      severity: "normal",
      accepted: false,
      classes: [
        { defectClass: "critical", accept: 0, reject: 1, found: 0 },
        { defectClass: "major", aql: 1.0, planLetter: "E", accept: 0, reject: 1, found: 1 },
        { defectClass: "minor", aql: 2.5, planLetter: "F", accept: 1, reject: 2, found: 0 },
      ],
    });
  });

  it("five lots with two rejections switch the next lot to tightened, and say why (SW)", () => {
    const history = [lot("L1", 0), lot("L2", 1), lot("L3", 0), lot("L4", 0), lot("L5", 1)];
    const state = nextInspectionState(switchingInputFor(history, null));
    expect(state.severity).toBe("tightened");
    expect(state.reason).toBe("2 of the last 5 lots on normal inspection were not accepted (L2, L5) → tightened.");
  });

  it("names lots by purchase reference, numbering repeats, also in corrective actions", () => {
    const history = [lot("a", 1, "PO-7"), lot("b", 1, "PO-7")];
    const input = switchingInputFor(history, { reducedAllowed: false, steadyProduction: true, resumedAfterLotIds: ["b"] });
    expect(input.history.map((h) => h.lotId)).toEqual(["PO-7", "PO-7 #2"]);
    expect(input.resumedAfterLotIds).toEqual(["PO-7 #2"]);
    expect(nextInspectionState(input).reason).toBe("2 of the last 2 lots on normal inspection were not accepted (PO-7, PO-7 #2) → tightened.");
  });

  it("an undecided lot cannot enter the history", () => {
    expect(() => decidedLotForSwitching({ ...lot("x", 0), verdict: null })).toThrow(/not decided/);
  });
});
