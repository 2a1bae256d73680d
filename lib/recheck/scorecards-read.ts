import "server-only";
/**
 * The scorecards of a period, read for the screen and the CSV: the SQL counts grades per grader
 * and day and lists the period's submitted rechecks (db/queries/rechecks.ts); the figures come
 * from the pure cores (scorecard.ts per grader and week, team.ts for alpha and AC1).
 *
 * Decisions:
 * - Default period: the 12 weeks up to today (the week in progress included), local dates in
 *   the workspace's time zone.
 * - Alpha (ordinal) and AC1 are over the period's rechecked units, each unit with its first grade,
 *   its blind recheck grade and any adjudicated grade (not-blind rechecks left out, as in the
 *   scorecards). The adjudication saw both earlier grades (team.ts): the screen says so.
 * - The 95 % intervals are the analytic ones of lib/agreement (Fleiss–Cohen–Everitt standard
 *   error for kappa, Wilson for shares), not a bootstrap.
 */
import { countGradesByGraderAndDay, listSubmittedRechecksForPeriod, listWorkspaceUserNames } from "@/db/queries/rechecks";
import type { SessionUser } from "@/lib/auth/require-user";
import type { Grade } from "@/lib/grading/rubric-schema";
import { localDate, nextPeriod, periodOfDate } from "@/lib/time/periods";
import { recheckSettings } from "./recording";
import type { ScorecardQuery } from "./schemas";
import { buildScorecards } from "./scorecard";
import { multiRaterAgreement } from "./team";

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
  const [graded, rows, names] = await Promise.all([countGradesByGraderAndDay({ workspaceId: actor.workspaceId, from, to }), listSubmittedRechecksForPeriod(key), listWorkspaceUserNames(actor)]);
  const cards = buildScorecards({
    from,
    to,
    timeZone,
    graded,
    settings,
    rechecks: rows.map((row) => ({ graderId: row.grader_id, gradedAt: row.graded_at, firstGrade: row.first_grade as Grade, recheckGrade: row.recheck_grade as Grade, blind: !row.not_blind, classes: row.classes ?? undefined })),
  });
  const team = multiRaterAgreement(rows.filter((row) => !row.not_blind).map((row) => [row.first_grade, row.recheck_grade, ...(row.adjudicated_grade ? [row.adjudicated_grade] : [])] as Grade[]));
  return { ...cards, settings, names: Object.fromEntries(cards.graders.map((g) => [g.graderId, names.get(g.graderId) ?? "someone no longer listed"])), multiRater: team, timeZone, nextWeek: nextPeriod(periodOfDate(to, "week"), "week") };
}
export type ScorecardsView = Awaited<ReturnType<typeof readScorecards>>;
