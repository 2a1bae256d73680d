/**
 * Issue 14, items 1 and 2, over HTTP against the test server and its PostgreSQL:
 * - a blind recheck must not see the first grader's work: the inspection read paths (regions,
 *   measurements, grade previews, grades, the unit and its photos, the Bench page) answer 403 to
 *   auditors (trainers read it, view only, to promote graded photos into the Gallery);
 * - once a unit is graded, a new grade row is only a lead's override, with a reason, naming the
 *   grade it replaces (409 when that is no longer current); a doubled submission is one row.
 */
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { grades } from "@/db/schema";
import { createUser, TEST_PASSWORD, uniqueEmail } from "../support/db";
import { createMeasurableUnit, workspaceIdOf } from "../support/grading";
import { api, signIn, type Session } from "../support/http";

type ErrorBody = { error: { code: string; message: string; fieldErrors?: Record<string, string> } };
type Grade = { id: string; kind: string; finalGrade: string; overrideReason: string | null };

let lead: Session;
let lead2: Session;
let inspector: Session;
let inspector2: Session;
let auditor: Session;
let trainer: Session;
let owner: { workspaceId: string; userId: string };

const gradeRows = async (unitId: string) => db().select({ id: grades.id, kind: grades.kind, finalGrade: grades.finalGrade }).from(grades).where(eq(grades.unitId, unitId));
const grade = (who: Session, unitId: string, body: Record<string, unknown>) => api<{ grade: Grade; replayed: boolean } & ErrorBody>(who, "POST", `/api/units/${unitId}/grades`, body);

beforeAll(async () => {
  owner = await workspaceIdOf("lead@vellmoor.example");
  const make = async (roles: ("inspector" | "trainer" | "auditor" | "lead")[]) =>
    signIn((await createUser({ workspaceId: owner.workspaceId, roles, email: uniqueEmail(`integrity-${roles[0]}`) })).email, TEST_PASSWORD);
  [lead, lead2, inspector, inspector2, auditor, trainer] = await Promise.all([make(["lead"]), make(["lead"]), make(["inspector"]), make(["inspector"]), make(["auditor"]), make(["trainer"])]);
});

async function gradedUnit() {
  const { unit, photo } = await createMeasurableUnit(owner);
  expect((await api(inspector, "POST", `/api/units/${unit.id}/measure`)).status).toBe(200);
  const first = await grade(inspector, unit.id, { decision: "accept" });
  expect(first.status, JSON.stringify(first.body)).toBe(201);
  return { unit, photo, first: first.body.grade };
}

describe("auditors cannot read the first grader's work (blind recheck)", () => {
  it("every inspection read path and the Bench page answer 403 to auditors, 200 to inspectors and trainers (view only, for the Gallery)", async () => {
    const { unit, photo } = await gradedUnit();
    const paths = [
      `/api/units/${unit.id}/grades`,
      `/api/units/${unit.id}/measure`,
      `/api/units/${unit.id}/grade-preview`,
      `/api/units/${unit.id}`,
      `/api/units/${unit.id}/photos`,
      `/api/photos/${photo.id}`,
      `/api/photos/${photo.id}/regions`,
    ];
    for (const path of paths) {
      const res = await api<ErrorBody>(auditor, "GET", path);
      expect(res.status, `auditor ${path}`).toBe(403);
      expect(res.body.error.message).toMatch(/needs the Inspector or Trainer role/);
      // Nothing of the grade leaks into the refusal.
      expect(JSON.stringify(res.body)).not.toMatch(/"finalGrade"|gradedBy|overrideReason/);
      expect((await api(inspector2, "GET", path)).status, path).toBe(200);
      expect((await api(trainer, "GET", path)).status, `trainer ${path}`).toBe(200);
    }
    // The page streams behind the app shell's loading state, so the refusal travels as Next's 403
    // marker, which the browser turns into app/forbidden.tsx (tests/e2e/photos.spec.ts sees it),
    // rather than as the status line; nothing of the unit is in it.
    const refused = "NEXT_HTTP_ERROR_FALLBACK;403";
    const page = await api(auditor, "GET", `/units/${unit.id}`);
    expect(String(page.body)).toContain(refused);
    expect(String(page.body)).not.toContain(unit.serial!);
    const own = await api(inspector2, "GET", `/units/${unit.id}`);
    expect(own.status).toBe(200);
    expect(String(own.body)).toContain(unit.serial!);
    expect(String(own.body)).not.toContain(refused);
  });
});

describe("a graded unit's grade changes only by a lead's override naming it", () => {
  it("another inspection grade on a graded unit is refused (409) and adds no row", async () => {
    const { unit, first } = await gradedUnit();
    const again = await grade(inspector2, unit.id, { decision: "accept" });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already graded \(C, recorded by .* on \d{4}-\d\d-\d\d \d\d:\d\d\)\. Only a QC lead can change a recorded grade/);
    const overrideByInspector = await grade(inspector2, unit.id, { decision: "override", finalGrade: "A", reason: "Looks fine to me." });
    expect(overrideByInspector.status).toBe(409);
    // A lead, too, cannot slip in a plain inspection grade over a recorded one.
    expect((await grade(lead, unit.id, { decision: "override", finalGrade: "B", reason: "Lead says B." })).status).toBe(409);
    expect((await gradeRows(unit.id)).map((g) => g.id)).toEqual([first.id]);
  });

  it("an override needs the current grade's id: 400 without it, 409 once it is no longer current", async () => {
    const { unit, first } = await gradedUnit();
    const unnamed = await grade(lead, unit.id, { decision: "override", kind: "override", finalGrade: "B", reason: "Smudge, not a scratch." });
    expect(unnamed.status).toBe(400);
    expect(unnamed.body.error.fieldErrors?.expectedCurrentGradeId).toMatch(/must name the grade it replaces/);
    const byInspector = await grade(inspector, unit.id, { decision: "override", kind: "override", finalGrade: "B", reason: "x", expectedCurrentGradeId: first.id });
    expect(byInspector.status).toBe(403);

    const corrected = await grade(lead, unit.id, { decision: "override", kind: "override", finalGrade: "B", reason: "Smudge, not a scratch.", expectedCurrentGradeId: first.id });
    expect(corrected.status, JSON.stringify(corrected.body)).toBe(201);
    expect(corrected.body.grade).toMatchObject({ kind: "override", finalGrade: "B", overrideReason: "Smudge, not a scratch." });
    // A second lead who still sees the first grade cannot replace the correction unseen.
    const late = await grade(lead2, unit.id, { decision: "override", kind: "override", finalGrade: "Reject", reason: "Cracked lens.", expectedCurrentGradeId: first.id });
    expect(late.status).toBe(409);
    expect(late.body.error.message).toMatch(/grade changed since you looked: it is now B, recorded by/);
    // Naming the correction works; the history keeps every row, oldest first.
    const next = await grade(lead2, unit.id, { decision: "override", kind: "override", finalGrade: "Reject", reason: "Cracked lens.", expectedCurrentGradeId: corrected.body.grade.id });
    expect(next.status).toBe(201);
    const history = await api<{ grades: Grade[]; current: Grade }>(lead, "GET", `/api/units/${unit.id}/grades`);
    expect(history.body.grades.map((g) => [g.kind, g.finalGrade])).toEqual([
      ["inspection", "C"],
      ["override", "B"],
      ["override", "Reject"],
    ]);
    expect(history.body.current.id).toBe(next.body.grade.id);
  });

  it("a double submit with one idempotency key is one row; the key cannot be reused for another grade", async () => {
    const { unit } = await createMeasurableUnit(owner);
    await api(inspector, "POST", `/api/units/${unit.id}/measure`);
    const key = crypto.randomUUID();
    const body = { decision: "accept", expectedCurrentGradeId: null, idempotencyKey: key };
    const both = await Promise.all([grade(inspector, unit.id, body), grade(inspector, unit.id, body)]);
    expect(both.map((r) => r.status).sort()).toEqual([200, 201]);
    expect(both[0].body.grade.id).toBe(both[1].body.grade.id);
    expect(both.find((r) => r.status === 200)?.body.replayed).toBe(true);
    expect(await gradeRows(unit.id)).toHaveLength(1);
    // A third repeat (a retry after a lost answer) is still the same row.
    expect((await grade(inspector, unit.id, body)).body.grade.id).toBe(both[0].body.grade.id);
    const misused = await grade(inspector, unit.id, { decision: "override", finalGrade: "A", reason: "Different.", idempotencyKey: key });
    expect(misused.status).toBe(409);
    expect(misused.body.error.message).toMatch(/key was already used for a different grade/);
    expect(await gradeRows(unit.id)).toHaveLength(1);
    expect((await grade(inspector, unit.id, { decision: "accept", idempotencyKey: "not-a-uuid" })).status).toBe(400);
  });
});
