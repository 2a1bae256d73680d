/**
 * Issue 19, step 4: adjudication, against the test server and its PostgreSQL.
 * - Either grader is refused (403); bad input gets a clear 4xx and stores nothing.
 * - The decision appends a grades row of kind "adjudication", which becomes the current grade.
 * - A decided lot is not rewritten: the recheck is marked and the lot's activity log says so.
 */
import { and, desc, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { activityLog, grades, lots, rechecks, units } from "@/db/schema";
import { createUser, TEST_PASSWORD, uniqueEmail } from "../support/db";
import { api, signIn } from "../support/http";
import { gradedUnit, RECHECK_DEFAULTS, recheckWorld, type Person, type RecheckWorld } from "../support/recheck";

type ErrorBody = { error: { code: string; message: string } };
const ALWAYS = { ...RECHECK_DEFAULTS, rate: 1, raisedRate: 1 };
const SURFACE = {
  id: "audit-surface",
  shape: {
    kind: "polygon",
    points: [
      [50, 50],
      [250, 50],
      [250, 150],
      [50, 150],
    ],
  },
};

/** A unit graded C by `grader`, rechecked A by world.auditor: waiting for adjudication. */
async function disagreement(world: RecheckWorld, grader: Person) {
  const made = await gradedUnit(world, grader);
  const taken = await api<{ recheck: { id: string } }>(world.auditor, "POST", "/api/rechecks/next");
  expect(taken.status).toBe(200);
  const id = taken.body.recheck.id;
  const regions = { regions: [{ id: "a1", defect: "scratch", shape: { kind: "rect", x: 60, y: 60, width: 10, height: 4 } }], surfaces: [SURFACE], ruler: null };
  expect((await api(world.auditor, "PUT", `/api/rechecks/${id}/regions`, { photoId: made.photo.id, baseVersion: 0, regions })).status).toBe(200);
  const submitted = await api<{ recheck: { status: string } }>(world.auditor, "POST", `/api/rechecks/${id}/submission`, { decision: "accept", proposedGrade: "A" });
  expect(submitted.body.recheck?.status, JSON.stringify(submitted.body)).toBe("adjudication");
  return { ...made, recheckId: id };
}

describe("adjudication", () => {
  it("refuses either grader; the decision becomes the unit's current grade", async () => {
    const world = await recheckWorld(ALWAYS);
    const user = await createUser({ workspaceId: world.workspaceId, roles: ["inspector", "auditor"], email: uniqueEmail("rc-both") });
    const both: Person = { ...(await signIn(user.email, TEST_PASSWORD)), id: user.id };
    const { unit, recheckId } = await disagreement(world, both);

    for (const [who, message] of [
      [both, /gave the first grade/],
      [world.auditor, /rechecked this unit/],
    ] as const) {
      const view = await api<ErrorBody>(who, "GET", `/api/rechecks/${recheckId}/adjudication`);
      expect(view.status).toBe(403);
      expect(view.body.error.message).toMatch(message);
      const post = await api<ErrorBody>(who, "POST", `/api/rechecks/${recheckId}/adjudication`, { choice: "first", reason: "Mine stands." });
      expect(post.status).toBe(403);
    }
    // The inspector role alone cannot adjudicate at all.
    expect((await api(world.inspector, "GET", `/api/rechecks/${recheckId}/adjudication`)).status).toBe(403);

    const listed = await api<{ adjudications: { id: string }[] }>(world.auditor2, "GET", "/api/rechecks/adjudications");
    expect(listed.body.adjudications.map((a) => a.id)).toContain(recheckId);
    expect((await api<{ adjudications: { id: string }[] }>(world.auditor, "GET", "/api/rechecks/adjudications")).body.adjudications.map((a) => a.id)).not.toContain(recheckId);

    const view = await api<{ first: { grade: string }; second: { grade: string }; photos: { comparison: { areas: Record<string, { onlyFirst: unknown[] }> } }[] }>(
      world.auditor2,
      "GET",
      `/api/rechecks/${recheckId}/adjudication`,
    );
    expect(view.status, JSON.stringify(view.body)).toBe(200);
    expect(view.body.first.grade).toBe("C");
    expect(view.body.second.grade).toBe("A");
    expect(view.body.photos[0].comparison.areas.scratch.onlyFirst.length).toBeGreaterThan(0);

    const before = await db().select().from(grades).where(eq(grades.unitId, unit.id));
    const bad: [unknown, number, RegExp][] = [
      [{ choice: "recheck" }, 400, /Say why this grade stands/],
      [{ choice: "recheck", reason: "   " }, 400, /Say why this grade stands/],
      [{ choice: "own", reason: "Both missed the dent." }, 400, /must be A, B, C or Reject/],
      [{ choice: "own", finalGrade: "D", reason: "x" }, 400, /must be A, B, C or Reject/],
      [{ choice: "second", reason: "x" }, 400, /choice must be/],
    ];
    for (const [body, status, message] of bad) {
      const res = await api<ErrorBody>(world.auditor2, "POST", `/api/rechecks/${recheckId}/adjudication`, body);
      expect(res.status, JSON.stringify(body)).toBe(status);
      expect(res.body.error.message).toMatch(message);
    }
    expect((await api(world.auditor2, "POST", "/api/rechecks/00000000-0000-4000-8000-000000000000/adjudication", { choice: "first", reason: "x" })).status).toBe(404);
    expect(await db().select().from(grades).where(eq(grades.unitId, unit.id))).toHaveLength(before.length);

    const settled = await api<{ adjudication: { finalGrade: string; decidedLotAffected: boolean } }>(world.auditor2, "POST", `/api/rechecks/${recheckId}/adjudication`, {
      choice: "recheck",
      reason: "The scratch is shorter than first marked.",
    });
    expect(settled.status, JSON.stringify(settled.body)).toBe(201);
    expect(settled.body.adjudication).toEqual(expect.objectContaining({ finalGrade: "A", decidedLotAffected: false }));
    const history = await api<{ current: { kind: string; finalGrade: string; overrideReason: string } }>(world.lead, "GET", `/api/units/${unit.id}/grades`);
    expect(history.body.current).toMatchObject({ kind: "adjudication", finalGrade: "A", overrideReason: "The scratch is shorter than first marked." });
    expect((await api(world.lead, "POST", `/api/rechecks/${recheckId}/adjudication`, { choice: "first", reason: "again" })).status).toBe(409);
  });

  it("a decided lot is not rewritten: the lead is told in the lot's activity log", async () => {
    const world = await recheckWorld(ALWAYS);
    const { unit, recheckId } = await disagreement(world, world.inspector);
    const [row] = await db().select({ lotId: units.lotId }).from(units).where(eq(units.id, unit.id));
    // The lot was decided (on the first grade) before the disagreement was settled.
    await db()
      .update(lots)
      .set({ status: "decided", verdict: "accept", disposition: "to_stock", dispositionReason: "Accepted on the first grades.", decidedAt: new Date(), decidedBy: world.lead.id })
      .where(eq(lots.id, row.lotId));
    const settled = await api<{ adjudication: { decidedLotAffected: boolean } }>(world.lead, "POST", `/api/rechecks/${recheckId}/adjudication`, {
      choice: "own",
      finalGrade: "B",
      reason: "Between the two: a B.",
    });
    expect(settled.status, JSON.stringify(settled.body)).toBe(201);
    expect(settled.body.adjudication.decidedLotAffected).toBe(true);
    const [lot] = await db().select().from(lots).where(eq(lots.id, row.lotId));
    expect(lot).toMatchObject({ status: "decided", verdict: "accept", disposition: "to_stock" });
    const [entry] = await db()
      .select()
      .from(activityLog)
      .where(and(eq(activityLog.subjectType, "lot"), eq(activityLog.subjectId, row.lotId)))
      .orderBy(desc(activityLog.createdAt))
      .limit(1);
    expect(entry).toMatchObject({ action: "lot.decided_lot_affected" });
    const [recheck] = await db().select().from(rechecks).where(eq(rechecks.id, recheckId));
    // The scorecards read the adjudicated grade from the recheck row (migration scorecard_reads).
    expect(recheck).toMatchObject({ status: "settled", adjudicationChoice: "own", adjudicatedGrade: "B", decidedLotAffected: true });
  });
});
