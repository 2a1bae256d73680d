/**
 * Measuring and grading units over HTTP against the test server and its PostgreSQL: proposals
 * with explanation lines, accept / override with a reason, the append-only history (app and
 * trigger), staleness, "what would version N say", the background path, workspaces.
 * Expected shares are hand computations (a: rectangle areas) noted beside each check.
 */
import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { ownerDb } from "../support/owner-db";
import { grades, measurements } from "@/db/schema";
import { gradingEvidenceCheck } from "@/lib/grading/photo-evidence";
import { handleMeasureUnitJobs } from "@/lib/jobs/measure-unit";
import { FIXTURE_RUBRIC_V1, FIXTURE_SURFACE, createMeasurableUnit, createPhoto, createPartType, createUnit, insertRubricVersion, saveRegions, scratchBox, workspaceIdOf } from "../support/grading";
import { api, signIn, type Session } from "../support/http";

type ErrorBody = { error: { code: string; message: string; fieldErrors?: Record<string, string> } };
type Measured = {
  status: string;
  measurement: {
    id: string;
    stale: boolean;
    reasons: string[];
    rubricVersion: number;
    proposal: { grade: string; lines: { text: string }[] };
    photos: { measurement: { calibration: { method: string } } }[];
  };
};
type Grade = { id: string; kind: string; proposedGrade: string; finalGrade: string; overrideReason: string | null; rubricVersion: number; explanation: { lines: { text: string }[] } };
type History = { grades: Grade[]; current: Grade | null };

let lead: Session;
let inspector: Session;
let owner: { workspaceId: string; userId: string };

const gradeCount = async (unitId: string) => (await db().select({ id: grades.id }).from(grades).where(eq(grades.unitId, unitId))).length;
const refusal = (e: unknown) => String((e as { cause?: { message?: string } }).cause?.message ?? e);

beforeAll(async () => {
  lead = await signIn("lead@vellmoor.example");
  inspector = await signIn("inspector@vellmoor.example");
  owner = await workspaceIdOf("lead@vellmoor.example");
});

describe("measuring a unit", () => {
  it("stores the measurement with the rubric and regions versions and proposes a grade with explanations", async () => {
    const { unit, photo, v1 } = await createMeasurableUnit(owner);
    const res = await api<Measured>(inspector, "POST", `/api/units/${unit.id}/measure`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.status).toBe("measured");
    const m = res.body.measurement;
    // 12 × 10 px scratch in the 100 × 100 px lens window (left half of the 200 × 100 Surface) = 1.2 %.
    expect(m.proposal.grade).toBe("C");
    expect(m.proposal.lines.map((l) => l.text)).toEqual(["scratch covers 1.2 % of lens window > 1.0 % allowed for B → C", "scratch covers 1.2 % of lens window > 0.5 % allowed for A → B"]);
    expect(m.rubricVersion).toBe(1);
    expect(m.stale).toBe(false);
    expect(m.photos[0].measurement.calibration.method).toBe("nominal");
    const rows = await db().select().from(measurements).where(eq(measurements.unitId, unit.id));
    expect(rows).toHaveLength(2); // the unit-level row and one photo row
    expect(rows.every((r) => r.rubricVersionId === v1.id)).toBe(true);
    expect(rows.find((r) => r.photoId === null)?.regionsVersions).toEqual({ [photo.id]: 1 });
  });

  it("refuses a unit without photos, with photos still processing, or without a published rubric", async () => {
    const partType = await createPartType(owner.workspaceId);
    await insertRubricVersion({ workspaceId: owner.workspaceId, partTypeId: partType.id, version: 1, status: "draft" });
    const unit = await createUnit({ workspaceId: owner.workspaceId, partTypeId: partType.id, createdBy: owner.userId });
    const noRubric = await api<ErrorBody>(inspector, "POST", `/api/units/${unit.id}/measure`);
    expect(noRubric.status).toBe(409);
    expect(noRubric.body.error.message).toMatch(/has no published rubric yet/);

    const { unit: other, partType: measurable } = await createMeasurableUnit(owner);
    const empty = await createUnit({ workspaceId: owner.workspaceId, partTypeId: measurable.id, createdBy: owner.userId });
    const noPhotos = await api<ErrorBody>(inspector, "POST", `/api/units/${empty.id}/measure`);
    expect(noPhotos.status).toBe(409);
    expect(noPhotos.body.error.message).toMatch(/has no photos yet/);

    await createPhoto({ workspaceId: owner.workspaceId, unitId: other.id, uploadedBy: owner.userId, status: "processing" });
    const pending = await api<ErrorBody>(inspector, "POST", `/api/units/${other.id}/measure`);
    expect(pending.status).toBe(409);
    expect(pending.body.error.message).toMatch(/1 photo is still being processed/);
    expect(await db().select().from(measurements).where(eq(measurements.unitId, other.id))).toHaveLength(0);
  });

  it("a measurement becomes stale when regions change and is never graded as current", async () => {
    const { unit, photo } = await createMeasurableUnit(owner);
    await api(inspector, "POST", `/api/units/${unit.id}/measure`);
    await saveRegions({ workspaceId: owner.workspaceId, photoId: photo.id, authorId: owner.userId, regions: [FIXTURE_SURFACE, scratchBox(4, 5)] });
    const latest = await api<{ measurement: Measured["measurement"] }>(inspector, "GET", `/api/units/${unit.id}/measure`);
    expect(latest.body.measurement.stale).toBe(true);
    expect(latest.body.measurement.reasons).toEqual(["Photo 1 (lens): regions changed since measuring (version 1 → 2)."]);
    const refused = await api<ErrorBody>(inspector, "POST", `/api/units/${unit.id}/grades`, { decision: "accept" });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/The measurement is out of date: .*Measure again before grading/);
    expect(await gradeCount(unit.id)).toBe(0);
    // Measuring again reads the new regions: 4 × 5 = 20 px = 0.2 % of the lens window → A.
    const again = await api<Measured>(inspector, "POST", `/api/units/${unit.id}/measure`);
    expect(again.body.measurement).toMatchObject({ stale: false, proposal: { grade: "A" } });
    expect((await api(inspector, "POST", `/api/units/${unit.id}/grades`, { decision: "accept" })).status).toBe(201);
  });

  it("queues a background measurement; the worker stores a result the API then shows", async () => {
    const { unit } = await createMeasurableUnit(owner);
    const queued = await api<{ status: string; jobId: string }>(inspector, "POST", `/api/units/${unit.id}/measure`, { mode: "queue" });
    expect(queued.status).toBe(202);
    expect(queued.body.jobId).toMatch(/^[0-9a-f-]{36}$/);
    // Another workspace's caller learns nothing about the job.
    const other = await signIn("lead@quillfen.example");
    expect((await api(other, "GET", `/api/units/${unit.id}/measure?jobId=${queued.body.jobId}`)).status).toBe(404);
    // The worker process started by the test run picks the job up (pg-boss + NOTIFY).
    let done: { measurement: Measured["measurement"] | null; job?: { state: string } } = { measurement: null };
    // The worker stores the result before pg-boss marks the job completed, so wait for both.
    for (let i = 0; i < 150 && !(done.measurement && done.job?.state === "completed"); i++) {
      await new Promise((r) => setTimeout(r, 200));
      done = (await api<typeof done>(inspector, "GET", `/api/units/${unit.id}/measure?jobId=${queued.body.jobId}`)).body;
    }
    expect(done.measurement).toMatchObject({ stale: false, proposal: { grade: "C" } });
    expect(done.job?.state).toBe("completed");
    expect((await api<ErrorBody>(inspector, "POST", `/api/units/${unit.id}/measure`, { mode: "later" })).status).toBe(400);
  });

  it("the job handler measures the unit it is given (as the worker calls it)", async () => {
    const { unit } = await createMeasurableUnit(owner);
    await handleMeasureUnitJobs([
      { id: "00000000-0000-4000-8000-000000000001", name: "measure-unit", expireInSeconds: 600, data: { workspaceId: owner.workspaceId, unitId: unit.id, requestedBy: owner.userId } },
    ]);
    const measured = await api<{ measurement: Measured["measurement"] }>(inspector, "GET", `/api/units/${unit.id}/measure`);
    expect(measured.body.measurement).toMatchObject({ stale: false, proposal: { grade: "C" } });
  });
});

describe("recording grades", () => {
  it("accepts the proposal, or overrides it only with a reason; history is append-only", async () => {
    const { unit } = await createMeasurableUnit(owner);
    const none = await api<ErrorBody>(inspector, "POST", `/api/units/${unit.id}/grades`, { decision: "accept" });
    expect(none.status).toBe(409);
    expect(none.body.error.message).toMatch(/has not been measured yet/);
    await api(inspector, "POST", `/api/units/${unit.id}/measure`);

    const noReason = await api<ErrorBody>(inspector, "POST", `/api/units/${unit.id}/grades`, { decision: "override", finalGrade: "B" });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fieldErrors?.reason).toMatch(/An override needs a reason/);
    const blank = await api<ErrorBody>(inspector, "POST", `/api/units/${unit.id}/grades`, { decision: "override", finalGrade: "B", reason: "   " });
    expect(blank.status).toBe(400);
    const same = await api<ErrorBody>(inspector, "POST", `/api/units/${unit.id}/grades`, { decision: "override", finalGrade: "C", reason: "same" });
    expect(same.status).toBe(400);
    expect(same.body.error.message).toMatch(/already C; accept it instead/);
    expect(await gradeCount(unit.id)).toBe(0);

    const overridden = await api<{ grade: Grade }>(inspector, "POST", `/api/units/${unit.id}/grades`, {
      decision: "override",
      finalGrade: "B",
      reason: "The mark is a smudge on the glass, it wiped off.",
    });
    expect(overridden.status).toBe(201);
    expect(overridden.body.grade).toMatchObject({ kind: "inspection", proposedGrade: "C", finalGrade: "B", overrideReason: "The mark is a smudge on the glass, it wiped off.", rubricVersion: 1 });
    expect(overridden.body.grade.explanation.lines[0].text).toBe("scratch covers 1.2 % of lens window > 1.0 % allowed for B → C");

    // A lead's later correction is its own kind, needs the lead role and a reason.
    expect((await api<ErrorBody>(inspector, "POST", `/api/units/${unit.id}/grades`, { decision: "accept", kind: "override", reason: "x" })).status).toBe(403);
    expect((await api<ErrorBody>(lead, "POST", `/api/units/${unit.id}/grades`, { decision: "accept", kind: "override" })).status).toBe(400);
    const corrected = await api<{ grade: Grade }>(lead, "POST", `/api/units/${unit.id}/grades`, {
      decision: "accept",
      kind: "override",
      reason: "Checked under the loupe: the scratch is real.",
      expectedCurrentGradeId: overridden.body.grade.id,
    });
    expect(corrected.body.grade).toMatchObject({ kind: "override", proposedGrade: "C", finalGrade: "C" });

    const history = await api<History>(inspector, "GET", `/api/units/${unit.id}/grades`);
    expect(history.body.grades.map((g) => [g.kind, g.finalGrade])).toEqual([
      ["inspection", "B"],
      ["override", "C"],
    ]);
    expect(history.body.current?.id).toBe(corrected.body.grade.id);
  });

  it("the database refuses to change or remove a grade, and a changed grade without a reason", async () => {
    const { unit } = await createMeasurableUnit(owner);
    await api(inspector, "POST", `/api/units/${unit.id}/measure`);
    await api(inspector, "POST", `/api/units/${unit.id}/grades`, { decision: "accept" });
    // As the tables' owner (the app's own role may not even try: db-role.test.ts).
    const update = await ownerDb()
      .execute(sql`UPDATE grades SET final_grade = 'A' WHERE unit_id = ${unit.id}`)
      .then(() => "no error", refusal);
    expect(update).toMatch(/grades is append-only \(UPDATE refused\)/);
    const remove = await ownerDb()
      .execute(sql`DELETE FROM grades WHERE unit_id = ${unit.id}`)
      .then(() => "no error", refusal);
    expect(remove).toMatch(/grades is append-only \(DELETE refused\)/);
    const [row] = await db().select().from(grades).where(eq(grades.unitId, unit.id));
    const { id: _id, createdAt: _at, ...copy } = row;
    const unreasoned = await db()
      .insert(grades)
      .values({ ...copy, finalGrade: "A", overrideReason: null })
      .then(() => "no error", refusal);
    expect(unreasoned).toMatch(/grades_override_reason/);
  });
});

describe("a new rubric version never rewrites past grades", () => {
  it("a unit graded under v1 keeps its grade; the preview shows what v2 would say", async () => {
    const { unit, partType } = await createMeasurableUnit(owner);
    await api(inspector, "POST", `/api/units/${unit.id}/measure`);
    const graded = await api<{ grade: Grade }>(inspector, "POST", `/api/units/${unit.id}/grades`, { decision: "accept" });
    expect(graded.body.grade).toMatchObject({ finalGrade: "C", rubricVersion: 1 });
    const [before] = await db().select().from(grades).where(eq(grades.unitId, unit.id));

    // A trainer drafts v2 (C only above 2 %), a lead publishes it.
    const base = `/api/part-types/${partType.id}/rubrics`;
    await api(lead, "POST", base);
    await api(lead, "PATCH", `${base}/draft`, {
      rubric: { ...FIXTURE_RUBRIC_V1, rules: FIXTURE_RUBRIC_V1.rules.map((r) => (r.id === "lens-scratch-c" ? { ...r, threshold: 2 } : r)) },
      version: 2,
      revision: 0,
    });
    expect((await api(lead, "POST", `${base}/draft/publish`, { version: 2, revision: 1 })).body).toEqual({ version: 2 });

    type Preview = {
      rubricVersion: { version: number; status: string };
      basis: { grade: { finalGrade: string; rubricVersion: number }; stale: boolean };
      result: { grade: string; lines: { text: string }[] };
    };
    const preview = await api<Preview>(inspector, "GET", `/api/units/${unit.id}/grade-preview?rubricVersion=2`);
    expect(preview.status, JSON.stringify(preview.body)).toBe(200);
    expect(preview.body.rubricVersion).toMatchObject({ version: 2, status: "published" });
    expect(preview.body.result.grade).toBe("B");
    expect(preview.body.result.lines.map((l) => l.text)).toEqual(["scratch covers 1.2 % of lens window > 0.5 % allowed for A → B"]);
    expect(preview.body.basis).toMatchObject({ grade: { finalGrade: "C", rubricVersion: 1 }, stale: false });
    // Without a version: the latest published, i.e. v2 again; v1 reproduces the recorded grade.
    expect((await api<Preview>(inspector, "GET", `/api/units/${unit.id}/grade-preview`)).body.rubricVersion.version).toBe(2);
    expect((await api<Preview>(inspector, "GET", `/api/units/${unit.id}/grade-preview?rubricVersion=1`)).body.result.grade).toBe("C");
    expect((await api<ErrorBody>(inspector, "GET", `/api/units/${unit.id}/grade-preview?rubricVersion=7`)).status).toBe(404);
    expect((await api<ErrorBody>(inspector, "GET", `/api/units/${unit.id}/grade-preview?rubricVersion=two`)).status).toBe(400);

    const history = await api<History>(inspector, "GET", `/api/units/${unit.id}/grades`);
    expect(history.body.grades).toHaveLength(1);
    expect(history.body.current).toMatchObject({ finalGrade: "C", rubricVersion: 1 });
    const [after] = await db().select().from(grades).where(eq(grades.unitId, unit.id));
    expect(after).toEqual(before);
    // New measurements use v2.
    expect((await api<Measured>(inspector, "POST", `/api/units/${unit.id}/measure`)).body.measurement).toMatchObject({ rubricVersion: 2, proposal: { grade: "B" } });
  });

  it("a photo with regions or a measurement is evidence: the deletion check says why", async () => {
    const { unit, photo } = await createMeasurableUnit(owner);
    const fresh = await createPhoto({ workspaceId: owner.workspaceId, unitId: unit.id, uploadedBy: owner.userId });
    expect(await gradingEvidenceCheck(db(), { workspaceId: owner.workspaceId, photoId: fresh.id })).toBeNull();
    expect(await gradingEvidenceCheck(db(), { workspaceId: owner.workspaceId, photoId: photo.id })).toMatch(/Regions were marked on this photo/);
    await api(inspector, "POST", `/api/units/${unit.id}/measure`);
    expect(await gradingEvidenceCheck(db(), { workspaceId: owner.workspaceId, photoId: photo.id })).toMatch(/A measurement .* was made from this photo/);
  });

  it("another workspace sees the unit as missing", async () => {
    const { unit } = await createMeasurableUnit(owner);
    const other = await signIn("lead@quillfen.example");
    for (const [method, path] of [
      ["GET", "grades"],
      ["POST", "measure"],
      ["GET", "grade-preview"],
    ] as const) {
      const foreign = await api<ErrorBody>(other, method, `/api/units/${unit.id}/${path}`);
      const missing = await api<ErrorBody>(other, method, `/api/units/00000000-0000-4000-8000-000000000000/${path}`);
      expect(foreign.status).toBe(404);
      expect(foreign.body).toEqual(missing.body);
    }
    expect((await api(other, "POST", `/api/units/${unit.id}/grades`, { decision: "accept" })).status).toBe(404);
  });
});
