/**
 * Issue 19, item 6: the scorecards API and its CSV against the test server and its PostgreSQL.
 * Grades go through the real API (so the SQL counts real grade rows per grader and day); the
 * auditors' submissions are stored directly (their steps are recheck-blind.test.ts's subject).
 * Figures by hand (HAND); kappa itself is checked against published examples in the unit tests.
 */
import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { grades, rechecks } from "@/db/schema";
import { gradeAgreement, gradeSteps } from "@/lib/grading/grade-steps";
import type { Grade } from "@/lib/grading/rubric-schema";
import type { RecheckComparison } from "@/lib/recheck/compare";
import { createCalibrationItems, takeAssignedSet } from "../support/calibration";
import { createPartType, createUnit, insertRubricVersion } from "../support/grading";
import { api } from "../support/http";
import { gradedUnit, RECHECK_DEFAULTS, recheckWorld, type RecheckWorld } from "../support/recheck";

type ErrorBody = { error: { code: string; message: string; fieldErrors?: Record<string, string> } };
type Counts = {
  graded: number;
  rechecked: number;
  notBlind: number;
  figures: { n: number; exact: { share: number | null }; withinOne: number | null; meanIou: Record<string, { mean: number; n: number }> };
};
type View = {
  from: string;
  to: string;
  weeks: string[];
  graders: (Counts & { graderId: string; drift: { flagged: boolean } })[];
  team: Counts;
  names: Record<string, string>;
  multiRater: { units: number };
};

let world: RecheckWorld;
const firstGrades: Grade[] = [];
let notBlindGradeId: string;

type ClassFigures = RecheckComparison["classes"];
/** A unit-level class comparison with the given IoU and union (Dice = 2J / (1 + J), as compare.ts pools them). */
const cls = (iou: number, unionPx: number): ClassFigures[string] => ({
  firstPx: unionPx,
  recheckPx: Math.round(iou * unionPx),
  sharedPx: Math.round(iou * unionPx),
  unionPx,
  iou,
  dice: (2 * iou) / (1 + iou),
  firstDefects: 1,
  recheckDefects: 1,
  matched: 1,
  onlyFirst: 0,
  onlyRecheck: 0,
});

/** Stores the auditor's grade on the recheck of `gradeId` as if submitted. */
async function submit(gradeId: string, firstGrade: Grade, recheckGrade: Grade, notBlind = false, classes: ClassFigures = {}) {
  const steps = gradeSteps(firstGrade, recheckGrade);
  await db()
    .update(rechecks)
    .set({
      status: steps === 0 ? "agreed" : "adjudication",
      submittedAt: new Date(),
      auditorId: world.auditor.id,
      proposedGrade: recheckGrade,
      recheckGrade,
      notBlind,
      comparison: { photos: [], classes, grade: { first: firstGrade, recheck: recheckGrade, steps, agreement: gradeAgreement(firstGrade, recheckGrade) } },
      adjudicationReasons: [],
    })
    .where(eq(rechecks.gradeId, gradeId));
}

beforeAll(async () => {
  // Every grade drawn, so each of the three grades below has a recheck to submit.
  world = await recheckWorld({ ...RECHECK_DEFAULTS, rate: 1, raisedRate: 1 });
  const made = [await gradedUnit(world, world.inspector), await gradedUnit(world, world.inspector), await gradedUnit(world, world.inspector)];
  for (const m of made) firstGrades.push(m.grade.finalGrade as Grade);
  const other = (g: Grade): Grade => (g === "Reject" ? "C" : g === "C" ? "Reject" : g === "B" ? "C" : "B");
  // HAND: the first agrees, the second is one step off, the third agrees but was not blind.
  // Scratch IoU 0.5 and 0.25 on the blind two (0.9 on the not-blind one); dent in play on the
  // first only; a class with an empty union (marked by neither side) on the second.
  await submit(made[0].grade.id, firstGrades[0], firstGrades[0], false, { scratch: cls(0.5, 120), dent: cls(0.2, 30) });
  await submit(made[1].grade.id, firstGrades[1], other(firstGrades[1]), false, { scratch: cls(0.25, 80), crack: { ...cls(1, 0), firstPx: 0, recheckPx: 0, sharedPx: 0 } });
  await submit(made[2].grade.id, firstGrades[2], firstGrades[2], true, { scratch: cls(0.9, 50) });
  notBlindGradeId = made[2].grade.id;
});

describe("GET /api/recheck/scorecards", () => {
  it("counts the grader's grades and blind rechecks of the period; not-blind rechecks are counted apart", async () => {
    const res = await api<View>(world.lead, "GET", "/api/recheck/scorecards");
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.weeks).toHaveLength(12);
    const card = res.body.graders.find((g) => g.graderId === world.inspector.id)!;
    expect(card).toBeDefined();
    expect(res.body.names[world.inspector.id]).toBeTruthy();
    // HAND: 3 graded, 3 rechecked of which 1 not blind; 2 blind, 1 the same grade → 0.5, both within one step → 1.
    expect(card).toMatchObject({ graded: 3, rechecked: 3, notBlind: 1 });
    expect(card.figures.n).toBe(2);
    expect(card.figures.exact.share).toBeCloseTo(0.5, 10);
    expect(card.figures.withinOne).toBeCloseTo(1, 10);
    // The week in progress holds them all.
    const lastWeek = (card as unknown as { weeks: Counts[] }).weeks.at(-1)!;
    expect(lastWeek).toMatchObject({ graded: 3, rechecked: 3, notBlind: 1 });
    // The team is this one grader here; alpha and AC1 over the two blind units.
    expect(res.body.team).toMatchObject({ graded: 3, rechecked: 3 });
    expect(res.body.multiRater.units).toBe(2);
  });

  it("gives the mean IoU per class over the blind rechecks where the class was in play", async () => {
    const res = await api<View>(world.lead, "GET", "/api/recheck/scorecards");
    const card = res.body.graders.find((g) => g.graderId === world.inspector.id)!;
    // HAND: scratch (0.5 + 0.25) / 2 = 0.375 over 2 (the not-blind 0.9 left out); dent 0.2 over 1;
    // crack had an empty union (neither side marked it) and says nothing.
    expect(Object.keys(card.figures.meanIou).sort()).toEqual(["dent", "scratch"]);
    expect(card.figures.meanIou.scratch.n).toBe(2);
    expect(card.figures.meanIou.scratch.mean).toBeCloseTo(0.375, 12);
    expect(card.figures.meanIou.dent).toEqual({ mean: expect.closeTo(0.2, 12), n: 1 });
  });

  it("a period without the grades has no scorecards for them", async () => {
    const res = await api<View>(world.auditor, "GET", "/api/recheck/scorecards?from=2020-01-06&to=2020-02-02");
    expect(res.status).toBe(200);
    expect(res.body.weeks).toEqual(["2020-01-06", "2020-01-13", "2020-01-20", "2020-01-27"]);
    expect(res.body.graders).toEqual([]);
  });

  it("refuses a bad period with a message a person understands", async () => {
    const cases: [string, RegExp][] = [
      ["from=2026-02-30", /not a calendar date/],
      ["from=yesterday", /must be a date like/],
      ["from=2026-03-01&to=2026-02-01", /starts after it ends/],
      ["from=2020-01-01&to=2026-01-01", /at most a year/],
      ["grader=x", /grader/i],
    ];
    for (const [query, message] of cases) {
      const res = await api<ErrorBody>(world.lead, "GET", `/api/recheck/scorecards?${query}`);
      expect(res.status, query).toBe(400);
      expect(JSON.stringify(res.body.error), query).toMatch(message);
    }
  });

  it("is for auditors and leads only", async () => {
    expect((await api(world.inspector, "GET", "/api/recheck/scorecards")).status).toBe(403);
    expect((await api(world.inspector, "GET", "/api/recheck/scorecards/csv")).status).toBe(403);
  });
});

/** grader_day_counts as stored, and as counted from the grades themselves in the workspace's time zone now. */
async function dayCounts(workspaceId: string) {
  const stored = await db().execute<{ grader_id: string; day: string; graded: number }>(
    sql`SELECT grader_id, to_char(day, 'YYYY-MM-DD') AS day, graded FROM grader_day_counts WHERE workspace_id = ${workspaceId} ORDER BY day, grader_id`,
  );
  const counted = await db().execute<{ grader_id: string; day: string; graded: number }>(sql`
    SELECT g.graded_by AS grader_id, to_char((g.created_at AT TIME ZONE w.time_zone)::date, 'YYYY-MM-DD') AS day, count(*)::int AS graded
    FROM grades g JOIN workspaces w ON w.id = g.workspace_id
    WHERE g.workspace_id = ${workspaceId} AND g.kind = 'inspection' GROUP BY 1, 2 ORDER BY 2, 1`);
  return { stored: stored.rows, counted: counted.rows };
}

describe("what the scorecards read instead of every grade (migration scorecard_reads)", () => {
  it("the per-day counts equal the grades' own count, and recheck rows carry their grade's facts", async () => {
    const { stored, counted } = await dayCounts(world.workspaceId);
    expect(counted.reduce((n, row) => n + row.graded, 0)).toBe(3);
    expect(stored).toEqual(counted);
    const copies = await db().execute<{ same: boolean }>(sql`
      SELECT r.first_grade = g.final_grade AND r.first_graded_at = g.created_at AND r.first_grader_id = g.graded_by AS same
      FROM rechecks r JOIN grades g ON g.id = r.grade_id WHERE r.workspace_id = ${world.workspaceId}`);
    expect(copies.rows.map((row) => row.same)).toEqual([true, true, true]);
  });

  it("only inspection grades count, on their local day, and a change of time zone recounts the days", async () => {
    const other = await recheckWorld();
    const partType = await createPartType(other.workspaceId);
    const v1 = await insertRubricVersion({ workspaceId: other.workspaceId, partTypeId: partType.id, version: 1, status: "published" });
    const unit = await createUnit({ workspaceId: other.workspaceId, partTypeId: partType.id, createdBy: other.lead.id });
    const grade = (kind: "inspection" | "adjudication", gradedBy: string, at: string) => ({
      workspaceId: other.workspaceId,
      unitId: unit.id,
      kind,
      proposedGrade: "A" as const,
      finalGrade: "A" as const,
      rubricVersionId: v1.id,
      measurementIds: [],
      explanation: { lines: [], notes: [] },
      regionsVersions: {},
      gradedBy,
      createdAt: new Date(at),
    });
    // HAND: 23:30 UTC on 5 January is 6 January in Kiritimati (UTC+14) and still 5 January in UTC.
    await db()
      .insert(grades)
      .values([
        grade("inspection", other.inspector.id, "2026-01-05T23:30:00Z"),
        grade("inspection", other.inspector.id, "2026-01-05T08:00:00Z"),
        grade("inspection", other.inspector2.id, "2026-01-05T23:45:00Z"),
        grade("adjudication", other.lead.id, "2026-01-05T12:00:00Z"),
      ]);
    const inspector = other.inspector.id;
    const inspector2 = other.inspector2.id;
    const byDay = (rows: { grader_id: string; day: string; graded: number }[]) =>
      rows.map((row) => [row.grader_id === inspector ? "inspector" : row.grader_id === inspector2 ? "inspector2" : row.grader_id, row.day, row.graded]);
    let counts = await dayCounts(other.workspaceId);
    expect(counts.stored).toEqual(counts.counted);
    expect(byDay(counts.stored)).toEqual(
      expect.arrayContaining([
        ["inspector", "2026-01-05", 2],
        ["inspector2", "2026-01-05", 1],
      ]),
    );
    expect(counts.stored).toHaveLength(2);

    const changed = await api(other.lead, "PATCH", "/api/workspace", { timeZone: "Pacific/Kiritimati" });
    expect(changed.status, JSON.stringify(changed.body)).toBe(200);
    counts = await dayCounts(other.workspaceId);
    expect(counts.stored).toEqual(counts.counted);
    expect(byDay(counts.stored)).toEqual(
      expect.arrayContaining([
        ["inspector", "2026-01-05", 1],
        ["inspector", "2026-01-06", 1],
        ["inspector2", "2026-01-06", 1],
      ]),
    );
    expect(counts.stored).toHaveLength(3);
    // And the scorecards read them in the new zone.
    const res = await api<View>(other.lead, "GET", "/api/recheck/scorecards?from=2026-01-05&to=2026-01-11");
    expect(res.status).toBe(200);
    expect(Object.fromEntries(res.body.graders.map((g) => [g.graderId, g.graded]))).toEqual({ [inspector]: 2, [inspector2]: 1 });
    // Days are summed per week in SQL; a period starting mid-week counts only its own days of that week.
    const midWeek = await api<View>(other.lead, "GET", "/api/recheck/scorecards?from=2026-01-06&to=2026-01-11");
    expect(midWeek.body.weeks).toEqual(["2026-01-05"]);
    expect(Object.fromEntries(midWeek.body.graders.map((g) => [g.graderId, g.graded]))).toEqual({ [inspector]: 1, [inspector2]: 1 });
  });
});

/** recheck_class_scores as stored, and the stored comparisons' classes expanded from their JSON. */
async function classScores(workspaceId: string) {
  const stored = await db().execute(sql`
    SELECT recheck_id, defect, first_grader_id, first_graded_at, not_blind, union_px, iou, dice
    FROM recheck_class_scores WHERE workspace_id = ${workspaceId} ORDER BY 1, 2`);
  const expanded = await db().execute(sql`
    SELECT r.id AS recheck_id, c.key AS defect, r.first_grader_id, r.first_graded_at, r.not_blind,
           (c.value->>'unionPx')::float8 AS union_px, (c.value->>'iou')::float8 AS iou, (c.value->>'dice')::float8 AS dice
    FROM rechecks r CROSS JOIN LATERAL jsonb_each(r.comparison->'classes') c
    WHERE r.workspace_id = ${workspaceId} AND r.submitted_at IS NOT NULL ORDER BY 1, 2`);
  return { stored: stored.rows, expanded: expanded.rows };
}

describe("the comparisons' class figures as rows (migration recheck_class_scores)", () => {
  it("equal each submitted recheck's stored comparison, and follow it when it is stored again", async () => {
    let { stored, expanded } = await classScores(world.workspaceId);
    // HAND: 2 classes + 2 classes + 1 class on the three submitted rechecks.
    expect(expanded).toHaveLength(5);
    expect(stored).toEqual(expanded);
    // Storing a comparison again (here: the blind mark and the classes change together) replaces the rows.
    const third = { gradeId: notBlindGradeId };
    await db()
      .update(rechecks)
      .set({ notBlind: false, comparison: sql`jsonb_set(comparison, '{classes}', ${JSON.stringify({ dent: cls(0.6, 10) })}::jsonb)` })
      .where(eq(rechecks.gradeId, third.gradeId));
    ({ stored, expanded } = await classScores(world.workspaceId));
    expect(expanded).toHaveLength(5);
    expect(stored).toEqual(expanded);
    expect(stored.filter((row) => row.not_blind)).toEqual([]);
    // Put back as it was for the other tests.
    await db()
      .update(rechecks)
      .set({ notBlind: true, comparison: sql`jsonb_set(comparison, '{classes}', ${JSON.stringify({ scratch: cls(0.9, 50) })}::jsonb)` })
      .where(eq(rechecks.gradeId, third.gradeId));
    ({ stored, expanded } = await classScores(world.workspaceId));
    expect(stored).toEqual(expanded);
  });
});

describe("GET /api/recheck/scorecards/csv", () => {
  it("answers a CSV download with a row per grader and week, their period and the team", async () => {
    const res = await api<string>(world.auditor, "GET", "/api/recheck/scorecards/csv");
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="scorecards-\d{4}-\d{2}-\d{2}-to-\d{4}-\d{2}-\d{2}\.csv"$/);
    const lines = String(res.body)
      .replace(/^\uFEFF/, "")
      .trim()
      .split("\r\n");
    expect(lines[0].split(",").slice(0, 7)).toEqual(["grader", "grader_id", "period", "graded", "rechecked", "not_blind", "n"]);
    // 12 weeks + the period, for the one grader and for the team.
    expect(lines).toHaveLength(1 + 2 * 13);
    const period = lines.find((line) => line.includes(`,${world.inspector.id},`) && !line.includes("week of"))!;
    expect(period.split(",").slice(3, 8)).toEqual(["3", "3", "1", "2", "0.5"]);
  });
});

type Calibration = { attemptId: string; userId: string; setName: string; day: string; items: number; exactShare: number; passed: boolean; failedChecks: { check: string }[] };
type CalibrationView = View & { calibration: Calibration[]; calibrationMultiRater: { units: number; grades: number; unitsWithMoreThanTwo: number; ac1: number } };

describe("calibration results on the scorecards (issue 19, item 6)", () => {
  let passed: { attemptId: string };
  let failed: { attemptId: string };
  beforeAll(async () => {
    const items = await createCalibrationItems(world.lead);
    const itemIds = items.published.map((item) => item.id);
    passed = await takeAssignedSet(world.lead, world.inspector, itemIds, "as the key", { name: "Scorecard set: passed" });
    failed = await takeAssignedSet(world.lead, world.inspector2, itemIds, "all wrong", { name: "Scorecard set: failed" });
    // The lead reads the scorecards while taking a set of the same items, not yet submitted.
    await takeAssignedSet(world.lead, world.lead, itemIds, "as the key", { submit: false, name: "Scorecard set: in progress" });
  });

  it("lists each submitted attempt of the period with its set, day, grade agreement and verdict, and nothing of the key", async () => {
    const res = await api<CalibrationView>(world.lead, "GET", "/api/recheck/scorecards");
    expect(res.status).toBe(200);
    const byAttempt = new Map(res.body.calibration.map((a) => [a.attemptId, a]));
    // HAND: the in-progress attempt is not listed; "as the key" agrees on all 5 items, Reject throughout on none (no key is Reject).
    expect(res.body.calibration).toHaveLength(2);
    expect(byAttempt.get(passed.attemptId)).toMatchObject({ userId: world.inspector.id, setName: "Scorecard set: passed", items: 5, exactShare: 1, passed: true, failedChecks: [] });
    expect(byAttempt.get(failed.attemptId)).toMatchObject({ userId: world.inspector2.id, setName: "Scorecard set: failed", items: 5, exactShare: 0, passed: false });
    expect(byAttempt.get(failed.attemptId)!.failedChecks.map((c) => c.check)).toContain("grade_agreement");
    expect(byAttempt.get(passed.attemptId)!.day).toBe(res.body.to);
    // Only those fields cross: no item, key grade, region or caption.
    for (const attempt of res.body.calibration) expect(Object.keys(attempt).sort()).toEqual(["attemptId", "day", "exactShare", "failedChecks", "items", "passed", "setId", "setName", "userId"]);
    expect(JSON.stringify(res.body)).not.toContain("KEY-CAPTION");
    // inspector2 graded nothing here, so has no scorecard, but is named for their attempt.
    expect(res.body.graders.map((g) => g.graderId)).not.toContain(world.inspector2.id);
    expect(res.body.names[world.inspector2.id]).toBeTruthy();
  });

  it("gives alpha and AC1 over the calibration items apart: each item's key and its two submitted grades (HAND)", async () => {
    const res = await api<CalibrationView>(world.auditor, "GET", "/api/recheck/scorecards");
    // The two takers had a set each, of the same 5 gallery items: 5 units of key + 2 grades; the lead's unsubmitted answers are not counted.
    expect(res.body.calibrationMultiRater).toMatchObject({ units: 5, grades: 15, unitsWithMoreThanTwo: 5 });
    // HAND (AC1, q = 4): per item the key and the passing taker agree, the failing one gave Reject: p_a = 1/3 on every item.
    // Shares: keys C, A, B, C, A each twice over 15 grades, Reject 5: π_A = 4/15, π_B = 2/15, π_C = 4/15, π_R = 5/15;
    // p_e = Σ π(1 − π) / 3 = (44 + 26 + 44 + 50) / 225 / 3 = 164/675; AC1 = (1/3 − 164/675) / (1 − 164/675) = 61/511.
    expect(res.body.calibrationMultiRater.ac1).toBeCloseTo(61 / 511, 10);
    // The rechecked units' figure is unchanged by calibration.
    expect(res.body.multiRater.units).toBe(2);
  });

  it("writes one CSV row per attempt after its grader's rows, and nothing of the key", async () => {
    const res = await api<string>(world.auditor, "GET", "/api/recheck/scorecards/csv");
    const text = String(res.body);
    expect(text).not.toContain("KEY-CAPTION");
    const lines = text
      .replace(/^\uFEFF/, "")
      .trim()
      .split("\r\n");
    const header = lines[0].split(",");
    const rows = lines.filter((line) => line.includes(",calibration on "));
    expect(rows).toHaveLength(2);
    const failedRow = rows.find((line) => line.includes(`,${world.inspector2.id},`))!.split(",");
    expect(failedRow[header.indexOf("calibration_set")]).toBe("Scorecard set: failed");
    expect(failedRow[header.indexOf("calibration_grade_agreement")]).toBe("0");
    expect(failedRow[header.indexOf("calibration_passed")]).toBe("false");
    expect(failedRow[header.indexOf("calibration_failed_checks")]).toMatch(/grade agreement 0 % \(needs 80 %\)/);
  });
});
