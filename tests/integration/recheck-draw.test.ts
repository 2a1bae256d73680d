/**
 * Issue 19, step 1: which grades are rechecked. Against the test server and its PostgreSQL.
 * - A grade is drawn in the grade's own transaction, recorded with its seed and whole input, and
 *   running lib/recheck/draw.ts again on the record gives the same grades (reproducible).
 * - Never twice for the same grade: the draw skips drawn grades, a hand cannot send one again,
 *   and the database refuses a second row (rechecks_grade_key).
 * - Settings and sending by hand refuse bad input with a 4xx and store nothing.
 * - Reading a unit's inspection data records who opened it.
 */
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { recheckDraws, rechecks, unitOpenings } from "@/db/schema";
import { drawRechecks } from "@/lib/recheck/draw";
import { createUser, createWorkspace } from "../support/db";
import { createMeasurableUnit } from "../support/grading";
import { api } from "../support/http";
import { gradedUnit, RECHECK_DEFAULTS, recheckWorld, type RecheckWorld } from "../support/recheck";

type ErrorBody = { error: { code: string; message: string; fieldErrors?: Record<string, string> } };
const rechecksOf = (workspaceId: string) => db().select().from(rechecks).where(eq(rechecks.workspaceId, workspaceId));

let world: RecheckWorld;
beforeAll(async () => {
  world = await recheckWorld({ ...RECHECK_DEFAULTS, rate: 0.5, raisedRate: 0.5 });
});

describe("the draw when a grade is recorded", () => {
  it("tops the grader's week up to ⌈rate × grades⌉, records seed and input, and the record reproduces the draw", async () => {
    const first = await gradedUnit(world, world.inspector);
    let rows = await rechecksOf(world.workspaceId);
    // ⌈0.5 × 1⌉ = 1: the week's first grade is drawn (the running draw's known consequence, lib/recheck/recording.ts).
    expect(rows.map((r) => r.gradeId)).toEqual([first.grade.id]);
    expect(rows[0]).toMatchObject({ reason: "rate", status: "waiting", firstGraderId: world.inspector.id, unitId: first.unit.id });

    await gradedUnit(world, world.inspector); // ⌈0.5 × 2⌉ = 1, already drawn: nothing new
    expect(await rechecksOf(world.workspaceId)).toHaveLength(1);
    await gradedUnit(world, world.inspector); // ⌈0.5 × 3⌉ = 2: one more, among the two not drawn
    rows = await rechecksOf(world.workspaceId);
    expect(rows).toHaveLength(2);

    const draws = await db().select().from(recheckDraws).where(eq(recheckDraws.workspaceId, world.workspaceId));
    expect(draws).toHaveLength(2);
    for (const draw of draws) {
      const again = drawRechecks({ seed: draw.seed, ...draw.input });
      expect(again.drawn.map((d) => d.gradeId)).toEqual(draw.outcome.drawn);
      expect(draw.algorithm).toBe(again.algorithm);
    }
    const second = draws.find((d) => d.input.candidates.length === 3)!;
    expect(second.input.alreadyDrawn).toEqual([first.grade.id]);
    expect(second.outcome.drawn).not.toContain(first.grade.id);
    // Each drawn grade points at its draw.
    expect(new Set(rows.map((r) => r.drawId))).toEqual(new Set(draws.map((d) => d.id)));
  });

  it("the database refuses a second recheck of the same grade", async () => {
    const [row] = await rechecksOf(world.workspaceId);
    const { id: _id, createdAt: _c, ...copy } = row;
    await expect(db().insert(rechecks).values(copy)).rejects.toMatchObject({ cause: { constraint: "rechecks_grade_key" } });
  });
});

describe("sending a unit to recheck by hand", () => {
  it("sends the current grade once (201, then 409), for a lead or an auditor", async () => {
    const unit = await gradedUnitNotDrawn();
    const sent = await api<{ recheck: { id: string } }>(world.auditor, "POST", "/api/rechecks", { unitId: unit.id, note: "Looked odd on the lot page." });
    expect(sent.status, JSON.stringify(sent.body)).toBe(201);
    const [row] = await db().select().from(rechecks).where(eq(rechecks.id, sent.body.recheck.id));
    expect(row).toMatchObject({ reason: "by_hand", sentBy: world.auditor.id, sentNote: "Looked odd on the lot page.", drawId: null });
    const again = await api<ErrorBody>(world.lead, "POST", "/api/rechecks", { unitId: unit.id });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already in recheck/);
    expect(await db().select().from(rechecks).where(eq(rechecks.unitId, unit.id))).toHaveLength(1);
  });

  it("refuses bad input with a clear 4xx and stores nothing", async () => {
    const before = (await rechecksOf(world.workspaceId)).length;
    const cases: [unknown, number, RegExp][] = [
      [{}, 400, /unit is required/],
      [{ unitId: "not-an-id" }, 400, /not a valid id/],
      [{ unitId: "00000000-0000-4000-8000-000000000000" }, 404, /unit was not found/],
      [{ unitId: (await otherWorkspaceUnit()).id }, 404, /unit was not found/],
      [{ unitId: (await ungradedUnit()).id }, 409, /no grade yet/],
      [{ unitId: "00000000-0000-4000-8000-000000000000", extra: 1 }, 400, /Unknown field/],
    ];
    for (const [body, status, message] of cases) {
      const res = await api<ErrorBody>(world.lead, "POST", "/api/rechecks", body);
      expect(res.status, JSON.stringify(body)).toBe(status);
      expect(res.body.error.message).toMatch(message);
    }
    expect(await rechecksOf(world.workspaceId)).toHaveLength(before);
  });
});

describe("recheck settings", () => {
  it("a lead saves them; bad values get 400 and leave the stored ones as they were", async () => {
    const own = await recheckWorld();
    const defaults = await api<{ settings: typeof RECHECK_DEFAULTS; isDefault: boolean }>(own.auditor, "GET", "/api/workspace/recheck-settings");
    expect(defaults.body).toEqual({ settings: RECHECK_DEFAULTS, isDefault: true });
    const bad: [Record<string, unknown>, RegExp][] = [
      [{ ...RECHECK_DEFAULTS, rate: 0 }, /rate must be above 0/],
      [{ ...RECHECK_DEFAULTS, rate: 0.3, raisedRate: 0.2 }, /raised rate must be at least the normal rate/],
      [{ ...RECHECK_DEFAULTS, iouThreshold: 1.5 }, /at most 1/],
      [{ ...RECHECK_DEFAULTS, colour: "red" }, /Unknown field/],
      [{ rate: 0.1 }, /not valid/],
    ];
    for (const [body, message] of bad) {
      const res = await api<ErrorBody>(own.lead, "PUT", "/api/workspace/recheck-settings", body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.message).toMatch(message);
    }
    expect((await api(own.auditor, "GET", "/api/workspace/recheck-settings")).body).toEqual({ settings: RECHECK_DEFAULTS, isDefault: true });
    const saved = await api(own.lead, "PUT", "/api/workspace/recheck-settings", { ...RECHECK_DEFAULTS, rate: 0.1, iouThreshold: 0.4 });
    expect(saved.status).toBe(200);
    expect((await api(own.inspector, "GET", "/api/workspace/recheck-settings")).body).toEqual({ settings: { ...RECHECK_DEFAULTS, rate: 0.1, iouThreshold: 0.4 }, isDefault: false });
  });
});

describe("who opened a unit's inspection data", () => {
  it("is recorded when someone reads its grades, and only then", async () => {
    const unit = await gradedUnitNotDrawn();
    const opened = () =>
      db()
        .select()
        .from(unitOpenings)
        .where(and(eq(unitOpenings.unitId, unit.id), eq(unitOpenings.userId, world.inspector2.id)));
    expect(await opened()).toHaveLength(0);
    expect((await api(world.inspector2, "GET", `/api/units/${unit.id}/grades`)).status).toBe(200);
    expect(await opened()).toHaveLength(1);
  });
});

/** A graded unit whose grade the draw left alone (another inspector's later grades leave a high enough count). */
async function gradedUnitNotDrawn() {
  for (;;) {
    const made = await gradedUnit(world, world.inspector2);
    const [row] = await db().select().from(rechecks).where(eq(rechecks.gradeId, made.grade.id));
    if (!row) return made.unit;
  }
}
async function ungradedUnit() {
  return (await createMeasurableUnit({ workspaceId: world.workspaceId, userId: world.lead.id })).unit;
}
async function otherWorkspaceUnit() {
  const other = await createWorkspace();
  const user = await createUser({ workspaceId: other.id, roles: ["inspector"] });
  return (await createMeasurableUnit({ workspaceId: other.id, userId: user.id })).unit;
}
