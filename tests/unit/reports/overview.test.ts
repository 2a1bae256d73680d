/** How the Reports screen reads its rows (lib/reports/overview.ts): claim history → bench events, lot rows → scorecard input. */
import { describe, expect, it } from "vitest";
import { benchEventOf, scorecardInput } from "@/lib/reports/overview";

const at = new Date("2026-11-02T09:00:00Z");

describe("benchEventOf", () => {
  it("a claim is the actor's; a lead's hand-over is a claim by the new holder; releases and expiries end a session", () => {
    expect(benchEventOf({ action: "unit.claimed", actorId: "u1", detail: {}, at })).toEqual({ at, kind: "claimed", userId: "u1" });
    expect(benchEventOf({ action: "unit.reassigned", actorId: "lead", detail: { from: "u1", to: "u2" }, at })).toEqual({ at, kind: "claimed", userId: "u2" });
    expect(benchEventOf({ action: "unit.released", actorId: "u1", detail: {}, at })).toEqual({ at, kind: "released" });
    expect(benchEventOf({ action: "unit.lease_expired", actorId: null, detail: {}, at })).toEqual({ at, kind: "lease_expired" });
    expect(benchEventOf({ action: "unit.reassigned", actorId: "lead", detail: {}, at })).toBeNull();
    expect(benchEventOf({ action: "unit.serial_changed", actorId: "u1", detail: {}, at })).toBeNull();
  });
});

describe("scorecardInput", () => {
  const base = { lotId: "l1", supplierId: "s1", receivedOn: "2026-10-14", inspected: 5, classes: { scratch: { units: 2, defects: 3 } } };
  it("a decided lot brings the counts its decision recorded", () => {
    const row = scorecardInput({
      ...base,
      status: "decided",
      verdict: "reject",
      decisionCounts: { critical: { found: 0, inspected: 5, sampleSize: 5 }, major: { found: 2, inspected: 5, sampleSize: 5 }, minor: { found: 1, inspected: 3, sampleSize: 3 } },
    });
    expect(row.bySeverity).toEqual({ critical: { inspected: 5, defectives: 0 }, major: { inspected: 5, defectives: 2 }, minor: { inspected: 3, defectives: 1 } });
    expect(row.classes).toEqual(base.classes);
  });
  it("defectives found before every check was done count as examined units (never more defectives than inspected)", () => {
    const row = scorecardInput({
      ...base,
      status: "decided",
      verdict: "reject",
      decisionCounts: { critical: { found: 1, inspected: 0, sampleSize: 5 }, major: { found: 0, inspected: 0, sampleSize: 5 }, minor: { found: 0, inspected: 0, sampleSize: 5 } },
    });
    expect(row.bySeverity.critical).toEqual({ inspected: 1, defectives: 1 });
  });
  it("an open lot adds nothing per severity yet, but its graded units' classes", () => {
    const row = scorecardInput({ ...base, status: "open", verdict: null, decisionCounts: null });
    expect(row.bySeverity.major).toEqual({ inspected: 0, defectives: 0 });
    expect(row.inspected).toBe(5);
  });
});
