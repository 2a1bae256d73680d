/**
 * The drift flag (our rule, c, in lib/recheck/drift.ts).
 * SCIPY Wilson 95 % intervals from SciPy 1.17.1 `binomtest(k, n).proportion_ci(method="wilson")`
 *       (reference library, run here): 6/10 → high 0.8318196703, 3/10 → high 0.6032218525, 0/4 → high 0.4898908365,
 *       40/50 → 0.6696289407–0.8875624998.
 */
import { describe, expect, it } from "vitest";
import type { Grade } from "@/lib/grading/rubric-schema";
import { driftFlag } from "@/lib/recheck/drift";
import { DEFAULT_RECHECK_SETTINGS } from "@/lib/recheck/settings";
import { AgreementTally } from "@/lib/recheck/tally";

/** A tally of `n` rechecks, `agreeing` of them confirmed (B → B), the rest one step off (B → C). */
function tally(agreeing: number, n: number): AgreementTally {
  const result = new AgreementTally();
  for (let i = 0; i < n; i++) result.add("B", (i < agreeing ? "B" : "C") as Grade);
  return result;
}
const WEEKS = ["2026-06-01", "2026-06-08", "2026-06-15", "2026-06-22"];

describe("driftFlag", () => {
  it("flags below the threshold (6 of 10 < 80 %) but not below the team while the grader's interval still reaches the team (SCIPY)", () => {
    const flag = driftFlag(tally(6, 10), tally(40, 50), WEEKS, DEFAULT_RECHECK_SETTINGS);
    expect(flag).toMatchObject({ flagged: true, reasons: ["below_threshold"], weeks: WEEKS, threshold: 0.8 });
    expect(flag.agreement.high).toBeCloseTo(0.8318196703, 9);
    expect(flag.others.share).toBe(0.8);
    expect(flag.others.low).toBeCloseTo(0.6696289407, 9);
  });

  it("flags clearly below the team when even the top of the grader's interval is under the others' share (3 of 10; SCIPY)", () => {
    const flag = driftFlag(tally(3, 10), tally(40, 50), WEEKS, DEFAULT_RECHECK_SETTINGS);
    expect(flag.agreement.high).toBeCloseTo(0.6032218525, 9);
    expect(flag.reasons).toEqual(["below_threshold", "below_team"]);
  });

  it("does not flag on the threshold with fewer rechecks than the minimum, but a grader far below the team still shows", () => {
    expect(driftFlag(tally(3, 4), tally(40, 50), WEEKS, DEFAULT_RECHECK_SETTINGS).flagged).toBe(false);
    // 0 of 4: Wilson high 0.4899 < 0.8 — clearly below the team even on four rechecks.
    const fewButFarBelow = driftFlag(tally(0, 4), tally(40, 50), WEEKS, DEFAULT_RECHECK_SETTINGS);
    expect(fewButFarBelow.agreement.high).toBeCloseTo(0.4898908365, 9);
    expect(fewButFarBelow.reasons).toEqual(["below_team"]);
  });

  it("does not compare with a team of fewer rechecks than the minimum, nor flag a grader with no rechecks", () => {
    expect(driftFlag(tally(0, 10), tally(4, 4), WEEKS, DEFAULT_RECHECK_SETTINGS).reasons).toEqual(["below_threshold"]);
    const none = driftFlag(new AgreementTally(), tally(40, 50), WEEKS, DEFAULT_RECHECK_SETTINGS);
    expect(none).toMatchObject({ flagged: false, reasons: [] });
    expect(none.agreement.share).toBeNaN();
  });

  it("reads the workspace's threshold and minimum", () => {
    const settings = { ...DEFAULT_RECHECK_SETTINGS, driftAgreement: 0.55, driftMinRechecks: 3 };
    expect(driftFlag(tally(6, 10), tally(40, 50), WEEKS, settings).flagged).toBe(false);
    expect(driftFlag(tally(1, 3), tally(2, 2), WEEKS, settings).reasons).toEqual(["below_threshold"]);
  });
});
