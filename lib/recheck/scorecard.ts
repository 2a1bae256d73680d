/**
 * Grader scorecards for a period: per grader and for the team, graded, rechecked, exact and
 * within-one agreement, kappa and quadratic kappa (n, 95 % interval, band), mean IoU per class,
 * a weekly trend and the drift flag. Pure: the database layer hands over plain rows.
 *
 * What it expects to receive (so the SQL does the heavy part):
 * - `graded`: inspection grades counted per grader and local day, e.g.
 *   `GROUP BY graded_by, (created_at AT TIME ZONE tz)::date` — a few thousand rows for 100 000
 *   graded units, however many units there are;
 * - `rechecks`: one row per recheck whose first grade falls in the period: grader, time of the
 *   first grade, both grades, the blind mark and the unit-level class IoU of the stored
 *   comparison (compare.ts `classes`, iou and unionPx are enough);
 * - or, what the API reads (db/queries/rechecks.ts), the same already counted per grader and
 *   local week: `recheckCounts` (rechecks per first grade, recheck grade and blind mark) and
 *   `classIouSums` (per class, the IoU summed over the blind rechecks where it was in play, and
 *   how many). The two forms may be mixed; counted rows give the same scorecards as the rows they
 *   count (tests/unit/recheck/scorecard.test.ts). Counted rows must lie in the period (the SQL
 *   filters by local day); a week outside it is ignored. 5 000 rechecks over 12 weeks and 20
 *   graders come as about a thousand counted rows, however many rechecks there are.
 *
 * Decisions:
 * - A recheck counts in the week (and period) of the grade it rechecks, in the workspace's time
 *   zone: a scorecard judges the grader's work of that week, whenever the auditor got to it.
 *   Rows outside [from, to] are ignored.
 * - Rechecks marked "not blind" (the auditor could have seen the first grade) are left out of
 *   every figure and counted apart (`notBlind`). `rechecked` counts both kinds; the figures' n
 *   counts the blind ones they are computed from.
 * - Weeks run Monday to Sunday (lib/time/periods.ts); the trend lists every week of the period,
 *   empty ones with n = 0 and NaN figures (a gap, not a zero). Figures: tally.ts; drift: drift.ts.
 */
import type { Grade } from "@/lib/grading/rubric-schema";
import { localDate, parseDateKey, periodOfDate, periodsBetween } from "@/lib/time/periods";
import { driftFlag, type DriftFlag, type DriftSettings } from "./drift";
import { AgreementTally, type AgreementFigures, type ClassIou } from "./tally";

export type ScorecardRecheck = {
  graderId: string;
  /** When the rechecked grade was recorded. */
  gradedAt: Date | string | number;
  firstGrade: Grade;
  recheckGrade: Grade;
  blind: boolean;
  classes?: Readonly<Record<string, ClassIou>>;
};
export type GradedCount = { graderId: string; day: string; count: number };
/** Rechecks of one grader's grades of one local week (`week`: its Monday), counted by grade pair and blind mark. */
export type RecheckCount = {
  graderId: string;
  week: string;
  firstGrade: Grade;
  recheckGrade: Grade;
  /** The adjudication's grade where there was one (not used here; alpha and AC1 read it, lib/recheck/team.ts `gradeSetsOf`). */
  adjudicatedGrade?: Grade | null;
  blind: boolean;
  count: number;
};
/** Over one grader's blind rechecks of one local week where `defect` was in play (union > 0): the IoU summed, and how many. */
export type ClassIouSum = { graderId: string; week: string; defect: string; sum: number; n: number };
export type ScorecardInput = {
  /** First and last local day of the period, both included. */
  from: string;
  to: string;
  timeZone: string;
  rechecks?: readonly ScorecardRecheck[];
  recheckCounts?: readonly RecheckCount[];
  classIouSums?: readonly ClassIouSum[];
  graded: readonly GradedCount[];
  settings: DriftSettings;
};
type Counts = { graded: number; rechecked: number; notBlind: number; figures: AgreementFigures };
export type WeekPoint = { week: string } & Counts;
export type GraderScorecard = { graderId: string } & Counts & { weeks: WeekPoint[]; drift: DriftFlag };
export type Scorecards = {
  from: string;
  to: string;
  weeks: string[];
  graders: GraderScorecard[];
  team: Counts & { weeks: WeekPoint[] };
};

type WeekCounts = { tally: AgreementTally; graded: number; notBlind: number };

export function buildScorecards(input: ScorecardInput): Scorecards {
  const { from, to, timeZone } = input;
  const weeks = periodsBetween(from, to, "week");
  const weekIndex = new Map(weeks.map((week, index) => [week, index]));
  const fromMs = parseDateKey(from);
  const toMs = parseDateKey(to);
  const graders = new Map<string, WeekCounts[]>();
  const weeksOf = (graderId: string) => {
    let list = graders.get(graderId);
    if (!list) graders.set(graderId, (list = weeks.map(() => ({ tally: new AgreementTally(), graded: 0, notBlind: 0 }))));
    return list;
  };
  const inPeriod = (day: string) => {
    const ms = parseDateKey(day);
    return ms >= fromMs && ms <= toMs;
  };

  for (const row of input.graded) {
    if (!Number.isInteger(row.count) || row.count < 0) throw new RangeError(`A graded count is a whole number >= 0; ${row.graderId} on ${row.day} has ${row.count}.`);
    if (!inPeriod(row.day)) continue;
    weeksOf(row.graderId)[weekIndex.get(periodOfDate(row.day, "week"))!].graded += row.count;
  }
  for (const recheck of input.rechecks ?? []) {
    const day = localDate(recheck.gradedAt, timeZone);
    if (!inPeriod(day)) continue;
    const week = weeksOf(recheck.graderId)[weekIndex.get(periodOfDate(day, "week"))!];
    if (recheck.blind) week.tally.add(recheck.firstGrade, recheck.recheckGrade, recheck.classes);
    else week.notBlind++;
  }

  for (const row of input.recheckCounts ?? []) {
    const index = weekIndex.get(row.week);
    if (index === undefined) continue;
    const week = weeksOf(row.graderId)[index];
    if (row.blind) week.tally.addCount(row.firstGrade, row.recheckGrade, row.count);
    else week.notBlind += row.count;
  }
  for (const row of input.classIouSums ?? []) {
    const index = weekIndex.get(row.week);
    if (index !== undefined) weeksOf(row.graderId)[index].tally.addClassSum(row.defect, row.sum, row.n);
  }

  const driftWindow = weeks.slice(-input.settings.driftWeeks);
  const windowStart = weeks.length - driftWindow.length;
  const sum = (list: readonly WeekCounts[], start = 0): WeekCounts => {
    const total = { tally: new AgreementTally(), graded: 0, notBlind: 0 };
    for (const week of list.slice(start)) {
      total.tally.addTally(week.tally);
      total.graded += week.graded;
      total.notBlind += week.notBlind;
    }
    return total;
  };
  const counts = ({ tally, graded, notBlind }: WeekCounts): Counts => ({ graded, rechecked: tally.n + notBlind, notBlind, figures: tally.figures() });
  const points = (list: readonly WeekCounts[]): WeekPoint[] => list.map((week, index) => ({ week: weeks[index], ...counts(week) }));

  const ids = [...graders.keys()].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
  const windows = new Map(ids.map((id) => [id, sum(graders.get(id)!, windowStart).tally]));
  const cards = ids.map((graderId): GraderScorecard => {
    const list = graders.get(graderId)!;
    const period = sum(list);
    const others = new AgreementTally();
    for (const [id, window] of windows) if (id !== graderId) others.addTally(window);
    return { graderId, ...counts(period), weeks: points(list), drift: driftFlag(windows.get(graderId)!, others, driftWindow, input.settings) };
  });
  const teamWeeks = weeks.map((_, index) => sum(ids.map((id) => graders.get(id)![index])));
  const team = sum(teamWeeks);
  return { from, to, weeks, graders: cards, team: { ...counts(team), weeks: points(teamWeeks) } };
}
