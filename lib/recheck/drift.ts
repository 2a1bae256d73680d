/**
 * The drift flag of a grader's scorecard: over the last `driftWeeks` weeks of the scorecard's
 * period (the week in progress included), is the grader's agreement with the auditors below the
 * workspace's threshold, or clearly below the rest of the team?
 *
 * Decisions (ours, c):
 * - The measure is exact agreement (share of rechecks whose grade the auditor confirmed), not
 *   kappa: on four weeks of one grader's rechecks kappa is often undefined or wild (every unit an
 *   "A" makes chance agreement near 1), while a share has a sound interval at any n.
 * - Below the threshold: at least `driftMinRechecks` rechecks in the window and the share under
 *   `driftAgreement`. Fewer rechecks never flag on the threshold (one miss in two is 50 %).
 * - Clearly below the team: the upper end of the grader's Wilson 95 % interval is under the share
 *   of everyone else in the team over the same weeks (the grader left out, so a drifting grader
 *   does not drag the comparison down). Even the most favourable plausible value of the grader's
 *   agreement is then below what the others achieve. Needs at least `driftMinRechecks` rechecks
 *   of the others; the grader's own small n is already in the width of their interval.
 */
import { wilsonInterval, type ShareInterval } from "@/lib/agreement";
import type { RecheckSettings } from "./settings";
import type { AgreementTally } from "./tally";

export type DriftReason = "below_threshold" | "below_team";
export type DriftFlag = {
  flagged: boolean;
  reasons: DriftReason[];
  /** The weeks looked at (Mondays, local dates). */
  weeks: string[];
  agreement: ShareInterval;
  /** Everyone else's agreement over the same weeks. */
  others: ShareInterval;
  threshold: number;
};

export type DriftSettings = Pick<RecheckSettings, "driftAgreement" | "driftWeeks" | "driftMinRechecks">;

export function driftFlag(grader: AgreementTally, others: AgreementTally, weeks: string[], settings: DriftSettings): DriftFlag {
  const agreement = wilsonInterval(grader.agreeing(0), grader.n);
  const team = wilsonInterval(others.agreeing(0), others.n);
  const reasons: DriftReason[] = [];
  if (grader.n >= settings.driftMinRechecks && agreement.share < settings.driftAgreement) reasons.push("below_threshold");
  if (grader.n > 0 && others.n >= settings.driftMinRechecks && agreement.high < team.share) reasons.push("below_team");
  return { flagged: reasons.length > 0, reasons, weeks, agreement, others: team, threshold: settings.driftAgreement };
}
