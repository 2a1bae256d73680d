import "server-only";
/**
 * The scorecards of a period, read for the screen and the CSV: the SQL sums grades per grader
 * and week (from the per-day counts kept as grades are recorded), and counts the period's
 * submitted rechecks per grader, week and grade pair, with class IoU sums (db/queries/rechecks.ts); the figures come from
 * the pure cores (scorecard.ts per grader and week, team.ts for alpha and AC1). The read's cost
 * is measured by bench/scorecards-api.ts.
 *
 * Decisions:
 * - Default period: the 12 weeks up to today (the week in progress included), local dates in
 *   the workspace's time zone.
 * - Alpha (ordinal) and AC1 are over the period's rechecked units, each unit with its first grade,
 *   its blind recheck grade and any adjudicated grade (not-blind rechecks left out, as in the
 *   scorecards). The adjudication saw both earlier grades (team.ts): the screen says so.
 * - Calibration: the attempts submitted on a local day of the period, per person: set, day, the
 *   share of items graded as the key, pass/fail and the failed checks (nothing of the key itself).
 *   Alpha and AC1 are also given over the period's calibration items (key + each taker's grade as
 *   one unit), apart from the rechecked units' figures (team.ts `calibrationGradeSets` says why).
 * - The 95 % intervals are the analytic ones of lib/agreement (Fleiss–Cohen–Everitt standard
 *   error for kappa, Wilson for shares), not a bootstrap.
 */
import { listAttemptResultsInPeriod, listCalibrationGradeSetsInPeriod } from "@/db/queries/calibration";
import { countGradesByGraderAndWeek, countRechecksByGraderAndWeek, listWorkspaceUserNames, sumClassIouByGraderAndWeek } from "@/db/queries/rechecks";
import type { SessionUser } from "@/lib/auth/require-user";
import { localDate, nextPeriod, periodOfDate } from "@/lib/time/periods";
import { recheckSettings } from "./recording";
import type { ScorecardQuery } from "./schemas";
import { buildScorecards } from "./scorecard";
import { calibrationGradeSets, gradeSetsOf, multiRaterAgreement } from "./team";

const DAY_MS = 86_400_000;

export function defaultPeriod(now: Date, timeZone: string): { from: string; to: string } {
  const to = localDate(now, timeZone);
  let from = periodOfDate(to, "week");
  for (let i = 0; i < 11; i++) from = new Date(Date.parse(`${from}T00:00:00Z`) - 7 * DAY_MS).toISOString().slice(0, 10);
  return { from, to };
}

export async function readScorecards(actor: Pick<SessionUser, "workspaceId">, query: ScorecardQuery, now = new Date()) {
  const { settings, timeZone } = await recheckSettings(actor);
  const fallback = defaultPeriod(now, timeZone);
  const from = query.from ?? (query.to ? periodOfDate(query.to, "week") : fallback.from);
  const to = query.to ?? fallback.to;
  const key = { workspaceId: actor.workspaceId, from, to, timeZone };
  // Counted in SQL (db/queries/rechecks.ts): hundreds of rows come back, not one per grade or recheck,
  // so the work here does not grow with the period's grades and rechecks.
  const [graded, recheckCounts, classIouSums, calibration, calibrationItems, names] = await Promise.all([
    countGradesByGraderAndWeek(key),
    countRechecksByGraderAndWeek(key),
    sumClassIouByGraderAndWeek(key),
    listAttemptResultsInPeriod(key),
    listCalibrationGradeSetsInPeriod(key),
    listWorkspaceUserNames(actor),
  ]);
  const cards = buildScorecards({ from, to, timeZone, graded, settings, recheckCounts, classIouSums });
  // Each counted grade set stands for `count` units graded alike (alpha and AC1 take the counts as weights).
  const { units, counts } = gradeSetsOf(recheckCounts);
  const team = multiRaterAgreement(units, { counts });
  const people = new Set([...cards.graders.map((g) => g.graderId), ...calibration.map((a) => a.userId)]);
  return {
    ...cards,
    settings,
    names: Object.fromEntries([...people].map((id) => [id, names.get(id) ?? "someone no longer listed"])),
    multiRater: team,
    calibration,
    calibrationMultiRater: multiRaterAgreement(calibrationGradeSets(calibrationItems)),
    timeZone,
    nextWeek: nextPeriod(periodOfDate(to, "week"), "week"),
  };
}
export type ScorecardsView = Awaited<ReturnType<typeof readScorecards>>;
