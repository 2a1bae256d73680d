import "server-only";
/**
 * Whose grades are drawn at the raised rate (issue 19, item 1):
 * - a grader whose agreement with the blind rechecks drifts, by the scorecards' own rule (drift.ts)
 *   over the `driftWeeks` weeks up to the grade being recorded, in the workspace's time zone. The
 *   counts come from SQL as a 4 × 4 table per side (the grader's own rechecks, everyone else's), so
 *   the check costs one grouped read inside the grade's transaction however many rechecks there are;
 * - a grader whose last calibration attempt submitted up to the grade failed its set's thresholds
 *   (issue 18's attempts, `passed` as stored when it was scored). A later passing attempt lowers
 *   the rate again; a grader who never took a set keeps the normal rate.
 */
import { getLastSubmittedAttempt } from "@/db/queries/calibration";
import { countDriftWindow } from "@/db/queries/rechecks";
import type { Tx } from "@/db/client";
import type { RaisedRateReason } from "@/db/schema";
import { GRADES, type Grade } from "@/lib/grading/rubric-schema";
import { periodOf } from "@/lib/time/periods";
import { driftFlag, type DriftFlag } from "./drift";
import type { RecheckSettings } from "./settings";
import { AgreementTally } from "./tally";

const DAY_MS = 86_400_000;
const isGrade = (value: string): value is Grade => (GRADES as readonly string[]).includes(value);

/** The Mondays (local dates) of the `count` weeks ending with the week of `at`. */
export function driftWeeksUpTo(at: Date, count: number, timeZone: string): string[] {
  const last = Date.parse(`${periodOf(at, "week", timeZone)}T00:00:00Z`);
  return Array.from({ length: count }, (_, i) => new Date(last - (count - 1 - i) * 7 * DAY_MS).toISOString().slice(0, 10));
}

export async function graderDrift(
  tx: Tx,
  { workspaceId, graderId, at, settings, timeZone }: { workspaceId: string; graderId: string; at: Date; settings: RecheckSettings; timeZone: string },
): Promise<DriftFlag> {
  const weeks = driftWeeksUpTo(at, settings.driftWeeks, timeZone);
  const rows = await countDriftWindow({ workspaceId, graderId, fromDay: weeks[0], until: at, timeZone }, tx);
  const mine = new AgreementTally();
  const others = new AgreementTally();
  for (const row of rows) {
    if (!isGrade(row.firstGrade) || !isGrade(row.recheckGrade)) continue;
    const tally = row.mine ? mine : others;
    for (let i = 0; i < row.count; i++) tally.add(row.firstGrade, row.recheckGrade);
  }
  return driftFlag(mine, others, weeks, settings);
}

/**
 * Whether the grader's rate is raised when a grade of theirs is recorded at `at`, and why (kept in
 * the draw record as `input.raisedFor`): `reason` is null when neither drift nor a failed
 * calibration applies.
 */
export async function raisedRateReason(tx: Tx, input: { workspaceId: string; graderId: string; at: Date; settings: RecheckSettings; timeZone: string }): Promise<RaisedRateReason | null> {
  const drift = await graderDrift(tx, input);
  const attempt = await getLastSubmittedAttempt({ workspaceId: input.workspaceId, userId: input.graderId, at: input.at }, tx);
  const calibrationFailed = attempt?.passed === false;
  if (!drift.flagged && !calibrationFailed) return null;
  return {
    drifting: drift.flagged,
    reasons: [...drift.reasons, ...(calibrationFailed ? ["calibration_failed"] : [])],
    agreement: Number.isNaN(drift.agreement.share) ? null : drift.agreement.share,
    n: drift.agreement.n,
    weeks: drift.weeks,
    ...(attempt?.submittedAt ? { lastCalibration: { attemptId: attempt.id, setId: attempt.setId, submittedAt: attempt.submittedAt.toISOString(), passed: attempt.passed ?? false } } : {}),
  };
}
