/**
 * Issue 19, item 1: a grader whose agreement drifts, or whose last calibration attempt failed, is
 * drawn at the raised rate (the scorecards' drift rule over the weeks up to the grade, and the
 * stored verdict of the last submitted attempt, lib/recheck/raised-rate.ts); everyone else keeps
 * the normal rate. Against the test server and its PostgreSQL. The drifting grader's submitted
 * recheck is stored directly (the auditor's steps are recheck-blind.test.ts's subject); the
 * calibration attempts are taken and scored through the API.
 */
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { recheckDraws, rechecks } from "@/db/schema";
import { gradeAgreement, gradeSteps } from "@/lib/grading/grade-steps";
import type { Grade } from "@/lib/grading/rubric-schema";
import { drawRechecks } from "@/lib/recheck/draw";
import { createCalibrationItems, takeAssignedSet } from "../support/calibration";
import { gradedUnit, RECHECK_DEFAULTS, recheckWorld, type RecheckWorld } from "../support/recheck";

const rechecksOf = (workspaceId: string) => db().select().from(rechecks).where(eq(rechecks.workspaceId, workspaceId));

let world: RecheckWorld;
beforeAll(async () => {
  // 10 %: after a week's first grade (⌈0.1 × 1⌉ = 1, always drawn) the second adds nothing (⌈0.2⌉ = 1);
  // at the raised 100 % it is drawn. One blind recheck in the window is enough to judge here.
  world = await recheckWorld({ ...RECHECK_DEFAULTS, rate: 0.1, raisedRate: 1, driftMinRechecks: 1, driftAgreement: 0.8 });
});

describe("the raised rate for a drifting grader", () => {
  it("draws the drifting grader's next grade at the raised rate and records why; the others keep the normal rate", async () => {
    const first = await gradedUnit(world, world.inspector);
    const [drawn] = await rechecksOf(world.workspaceId);
    expect(drawn).toMatchObject({ gradeId: first.grade.id, reason: "rate" });
    // The auditor disagreed: 0 of 1 rechecks agree, under the 80 % threshold.
    const firstGrade = first.grade.finalGrade as Grade;
    const other: Grade = firstGrade === "Reject" ? "A" : "Reject";
    await db()
      .update(rechecks)
      .set({
        status: "adjudication",
        submittedAt: new Date(),
        auditorId: world.auditor.id,
        proposedGrade: other,
        recheckGrade: other,
        comparison: { photos: [], classes: {}, grade: { first: firstGrade, recheck: other, steps: gradeSteps(firstGrade, other), agreement: gradeAgreement(firstGrade, other) } },
        adjudicationReasons: [],
      })
      .where(eq(rechecks.id, drawn.id));

    const second = await gradedUnit(world, world.inspector);
    const raised = (await rechecksOf(world.workspaceId)).find((r) => r.gradeId === second.grade.id);
    expect(raised, "the drifting grader's second grade of the week is drawn").toBeDefined();
    expect(raised!.reason).toBe("raised_rate");
    const [draw] = await db().select().from(recheckDraws).where(eq(recheckDraws.id, raised!.drawId!));
    expect(draw.input.graderRates).toEqual({ [world.inspector.id]: 1 });
    expect(draw.input.raisedFor?.[world.inspector.id]).toMatchObject({ drifting: true, reasons: ["below_threshold"], n: 1 });
    // The record still reproduces the draw.
    expect(drawRechecks({ seed: draw.seed, ...draw.input }).drawn.map((d) => d.gradeId)).toEqual(draw.outcome.drawn);

    // A grader with no drift: the week's first grade is drawn, the second is not (⌈0.1 × 2⌉ = 1).
    const other1 = await gradedUnit(world, world.inspector2);
    const other2 = await gradedUnit(world, world.inspector2);
    const theirs = (await rechecksOf(world.workspaceId)).filter((r) => r.firstGraderId === world.inspector2.id);
    expect(theirs.map((r) => [r.gradeId, r.reason])).toEqual([[other1.grade.id, "rate"]]);
    expect(theirs.map((r) => r.gradeId)).not.toContain(other2.grade.id);
  });
});

describe("the raised rate after a failed calibration", () => {
  it("draws a grader whose last calibration attempt failed at the raised rate and names the attempt; a passing grader keeps the normal rate", async () => {
    const calWorld = await recheckWorld({ ...RECHECK_DEFAULTS, rate: 0.1, raisedRate: 1, driftMinRechecks: 50 });
    const items = await createCalibrationItems(calWorld.lead);
    const itemIds = items.published.map((p) => p.id);
    const failed = await takeAssignedSet(calWorld.lead, calWorld.inspector, itemIds, "all wrong");
    const passed = await takeAssignedSet(calWorld.lead, calWorld.inspector2, itemIds, "as the key");
    expect([failed.passed, passed.passed]).toEqual([false, true]);

    // Week's first grade: drawn either way (⌈rate × 1⌉ = 1). The second shows the rate.
    await gradedUnit(calWorld, calWorld.inspector);
    const second = await gradedUnit(calWorld, calWorld.inspector);
    const raised = (await rechecksOf(calWorld.workspaceId)).find((r) => r.gradeId === second.grade.id);
    expect(raised, "the failed grader's second grade of the week is drawn").toBeDefined();
    expect(raised!.reason).toBe("raised_rate");
    const [draw] = await db().select().from(recheckDraws).where(eq(recheckDraws.id, raised!.drawId!));
    expect(draw.input.graderRates).toEqual({ [calWorld.inspector.id]: 1 });
    expect(draw.input.raisedFor?.[calWorld.inspector.id]).toMatchObject({ drifting: false, reasons: ["calibration_failed"], lastCalibration: { attemptId: failed.attemptId, passed: false } });
    expect(drawRechecks({ seed: draw.seed, ...draw.input }).drawn.map((d) => d.gradeId)).toEqual(draw.outcome.drawn);

    const theirFirst = await gradedUnit(calWorld, calWorld.inspector2);
    const theirSecond = await gradedUnit(calWorld, calWorld.inspector2);
    const theirs = (await rechecksOf(calWorld.workspaceId)).filter((r) => r.firstGraderId === calWorld.inspector2.id);
    expect(theirs.map((r) => [r.gradeId, r.reason])).toEqual([[theirFirst.grade.id, "rate"]]);
    expect(theirs.map((r) => r.gradeId)).not.toContain(theirSecond.grade.id);
  });
});
