/**
 * Grader scorecards: bucketing by the week of the rechecked grade in the workspace's time zone,
 * blind-only figures, trend, team and drift. The rules are ours (c, lib/recheck/scorecard.ts);
 * counts by hand (HAND).
 * EU    Berlin is UTC+2 in June 2026 (EU summer time, Directive 2000/84/EC, a); ISO 8601 weeks
 *       start on Monday (a).
 */
import { describe, expect, it } from "vitest";
import type { Grade } from "@/lib/grading/rubric-schema";
import { buildScorecards, type ClassIouSum, type RecheckCount, type ScorecardRecheck } from "@/lib/recheck/scorecard";
import { localDate, parseDateKey, periodOfDate } from "@/lib/time/periods";
import { DEFAULT_RECHECK_SETTINGS } from "@/lib/recheck/settings";

const recheck = (graderId: string, gradedAt: string, firstGrade: Grade, recheckGrade: Grade, extra: Partial<ScorecardRecheck> = {}): ScorecardRecheck => ({
  graderId,
  gradedAt,
  firstGrade,
  recheckGrade,
  blind: true,
  ...extra,
});

/** Ten of bo's grades, Monday 15 to Friday 19 June, three of them confirmed. */
const boWeek = Array.from({ length: 10 }, (_, i) => recheck("bo", `2026-06-${15 + (i % 5)}T09:00:00Z`, "B", i < 3 ? "B" : "C"));

const input = {
  from: "2026-06-01",
  to: "2026-06-28",
  timeZone: "Europe/Berlin",
  settings: DEFAULT_RECHECK_SETTINGS,
  graded: [
    { graderId: "ann", day: "2026-06-01", count: 10 },
    { graderId: "ann", day: "2026-06-08", count: 12 },
    { graderId: "ann", day: "2026-05-31", count: 99 },
    { graderId: "bo", day: "2026-06-20", count: 5 },
  ],
  rechecks: [
    // 22:30 UTC on Sunday the 7th is 00:30 on Monday the 8th in Berlin: the week of the 8th.
    recheck("ann", "2026-06-07T22:30:00Z", "B", "B", { classes: { scratch: { iou: 0.6, unionPx: 300 } } }),
    // 21:30 UTC is 23:30 on Sunday the 7th in Berlin: still the week of the 1st.
    recheck("ann", "2026-06-07T21:30:00Z", "B", "C", { classes: { scratch: { iou: 0.2, unionPx: 100 }, dent: { iou: 1, unionPx: 0 } } }),
    recheck("ann", "2026-06-02T10:00:00Z", "A", "A", { blind: false }),
    // 23:59 on 31 May in Berlin, and 00:30 on 29 June: outside the period.
    recheck("ann", "2026-05-31T21:59:00Z", "A", "Reject"),
    recheck("ann", "2026-06-28T22:30:00Z", "A", "Reject"),
    recheck("ann", "2026-06-28T21:00:00Z", "C", "C"),
    ...boWeek,
  ],
};

describe("buildScorecards", () => {
  const cards = buildScorecards(input);
  const ann = cards.graders.find((card) => card.graderId === "ann")!;
  const bo = cards.graders.find((card) => card.graderId === "bo")!;

  it("lists every week of the period by its Monday, empty weeks included (EU a, HAND)", () => {
    expect(cards.weeks).toEqual(["2026-06-01", "2026-06-08", "2026-06-15", "2026-06-22"]);
    expect(ann.weeks.map((week) => [week.week, week.graded, week.rechecked, week.figures.n, week.notBlind])).toEqual([
      ["2026-06-01", 10, 2, 1, 1],
      ["2026-06-08", 12, 1, 1, 0],
      ["2026-06-15", 0, 0, 0, 0],
      ["2026-06-22", 0, 1, 1, 0],
    ]);
    expect(ann.weeks[2].figures.exact.share).toBeNaN();
  });

  it("counts a recheck in the local week of the grade it rechecks, leaves out 'not blind' ones and rows outside the period (HAND)", () => {
    expect(ann).toMatchObject({ graded: 22, rechecked: 4, notBlind: 1 });
    expect(ann.figures.n).toBe(3);
    expect(ann.figures.exact.share).toBeCloseTo(2 / 3, 15);
    expect(ann.weeks[0].figures.exact.share).toBe(0);
    expect(ann.weeks[1].figures.exact.share).toBe(1);
    // Scratch in play on two rechecks: (0.6 + 0.2) / 2; dent had no area on either side.
    expect(ann.figures.meanIou.scratch.mean).toBeCloseTo(0.4, 15);
    expect(ann.figures.meanIou).not.toHaveProperty("dent");
  });

  it("adds the graders up into the team, week by week (HAND)", () => {
    expect(cards.team).toMatchObject({ graded: 27, rechecked: 14, notBlind: 1 });
    expect(cards.team.figures.n).toBe(13);
    // Exact: ann 2 + bo 3 = 5 of 13.
    expect(cards.team.figures.exact.share).toBeCloseTo(5 / 13, 15);
    expect(cards.team.weeks.map((week) => week.figures.n)).toEqual([1, 1, 10, 1]);
    expect(cards.team.weeks[2].graded).toBe(5);
  });

  it("flags bo's drift (3 of 10 under 80 %) and not ann's (3 rechecks, under the minimum of 5)", () => {
    expect(bo.drift).toMatchObject({ flagged: true, reasons: ["below_threshold"], weeks: cards.weeks });
    expect(bo.drift.agreement.share).toBeCloseTo(0.3, 15);
    // The others of bo are ann alone: 3 rechecks, fewer than the minimum, so no comparison with the team.
    expect(bo.drift.others.n).toBe(3);
    expect(ann.drift.flagged).toBe(false);
    expect(ann.drift.others.n).toBe(10);
  });

  it("looks back only over the last driftWeeks weeks", () => {
    const lastTwo = buildScorecards({ ...input, settings: { ...DEFAULT_RECHECK_SETTINGS, driftWeeks: 2 } });
    const boLastTwo = lastTwo.graders.find((card) => card.graderId === "bo")!;
    // bo's rechecks are all in the week of the 15th, inside the last two weeks.
    expect(boLastTwo.drift).toMatchObject({ flagged: true, weeks: ["2026-06-15", "2026-06-22"] });
    const lastOne = buildScorecards({ ...input, settings: { ...DEFAULT_RECHECK_SETTINGS, driftWeeks: 1 } });
    expect(lastOne.graders.find((card) => card.graderId === "bo")!.drift).toMatchObject({ flagged: false, weeks: ["2026-06-22"] });
  });

  it("lists graders in id order and refuses bad counts, dates and zones", () => {
    expect(cards.graders.map((card) => card.graderId)).toEqual(["ann", "bo"]);
    expect(() => buildScorecards({ ...input, graded: [{ graderId: "ann", day: "2026-06-01", count: -1 }] })).toThrow(/whole number >= 0/);
    expect(() => buildScorecards({ ...input, from: "2026-06-31" })).toThrow(/Not a calendar date/);
    expect(() => buildScorecards({ ...input, from: "2026-07-01" })).toThrow(/starts .* after it ends/);
    expect(() => buildScorecards({ ...input, timeZone: "Mars/Olympus" })).toThrow(RangeError);
  });
});

/**
 * What the scorecards SQL does (db/queries/rechecks.ts): keep the rechecks of the period's local
 * days, count them per grader, local week, grade pair and blind mark, and sum the blind ones'
 * class IoU where the class was in play. Written out here so the two forms can be compared.
 */
function countedLikeTheDatabase(rows: readonly ScorecardRecheck[], from: string, to: string, timeZone: string) {
  const counts = new Map<string, RecheckCount>();
  const sums = new Map<string, ClassIouSum>();
  for (const row of rows) {
    const day = localDate(row.gradedAt, timeZone);
    if (parseDateKey(day) < parseDateKey(from) || parseDateKey(day) > parseDateKey(to)) continue;
    const week = periodOfDate(day, "week");
    const key = [row.graderId, week, row.firstGrade, row.recheckGrade, row.blind].join("|");
    const count = counts.get(key) ?? { graderId: row.graderId, week, firstGrade: row.firstGrade, recheckGrade: row.recheckGrade, blind: row.blind, count: 0 };
    count.count++;
    counts.set(key, count);
    if (!row.blind) continue;
    for (const [defect, { iou, unionPx }] of Object.entries(row.classes ?? {})) {
      if (!(unionPx > 0)) continue;
      const sum = sums.get(`${row.graderId}|${week}|${defect}`) ?? { graderId: row.graderId, week, defect, sum: 0, n: 0 };
      sum.sum += iou;
      sum.n++;
      sums.set(`${row.graderId}|${week}|${defect}`, sum);
    }
  }
  return { recheckCounts: [...counts.values()], classIouSums: [...sums.values()] };
}

describe("buildScorecards from counted rows", () => {
  it("gives the same scorecards as the rows it counts (every figure, trend and drift flag)", () => {
    const counted = countedLikeTheDatabase(input.rechecks, input.from, input.to, input.timeZone);
    // Fewer rows than rechecks: bo's ten are two counted rows (3 B→B and 7 B→C, all in one week).
    expect(counted.recheckCounts.length).toBeLessThan(input.rechecks.length);
    const fromCounts = buildScorecards({ ...input, rechecks: undefined, ...counted });
    expect(fromCounts).toEqual(buildScorecards(input));
    // And mixed: half as rows, half counted.
    const half = Math.floor(input.rechecks.length / 2);
    const mixed = buildScorecards({ ...input, rechecks: input.rechecks.slice(0, half), ...countedLikeTheDatabase(input.rechecks.slice(half), input.from, input.to, input.timeZone) });
    expect(mixed).toEqual(buildScorecards(input));
  });

  it("ignores a counted week outside the period and refuses impossible counts and sums", () => {
    const outside: RecheckCount = { graderId: "ann", week: "2026-05-25", firstGrade: "A", recheckGrade: "Reject", blind: true, count: 4 };
    expect(buildScorecards({ ...input, recheckCounts: [outside] })).toEqual(buildScorecards(input));
    expect(() => buildScorecards({ ...input, recheckCounts: [{ ...outside, week: "2026-06-01", count: 1.5 }] })).toThrow(/whole number >= 0/);
    expect(() => buildScorecards({ ...input, classIouSums: [{ graderId: "ann", week: "2026-06-01", defect: "scratch", sum: 3, n: 2 }] })).toThrow(/sum to between 0 and 2/);
  });
});
