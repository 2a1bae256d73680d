/**
 * Calibration against the test server: a trainer makes a set of published gallery items (bad
 * input 4xx, nothing stored) and assigns it; the inspector takes it blind — no route a taker can
 * call hands over anything of the key before submitting — pauses and resumes, submits, and gets a
 * hand-computable score with the key; the trainer sees the attempt and the item most missed.
 */
import { sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { calibrationAssignments, calibrationSets } from "@/db/schema";
import { createCalibrationItems, createAssignedSet, KEYS } from "../support/calibration";
import { createUser, TEST_PASSWORD, uniqueEmail, workspaceBySlug } from "../support/db";
import { SCRATCHED } from "../support/gallery";
import { api, signIn, type Session } from "../support/http";

type ErrorBody = { error: { code: string; message: string; fieldErrors?: Record<string, string> } };
type AttemptBody = {
  attempt: {
    id: string;
    status: string;
    items: ({ keyCaption?: string; keyGrade?: string } & Record<string, unknown>)[];
    answers: Record<string, { grade: string | null }>;
    result: null | { passed: boolean; summary: Summary; items: { position: number; missed: number; extra: number; classes: Record<string, { iou: number }> }[] };
  };
};
type Summary = {
  passed: boolean;
  grades: { exact: number; exactShare: number };
  classes: Record<string, { meanIou: number; missed: number; extra: number; gates: boolean }>;
  checks: { check: string; defect?: string; passed: boolean }[];
};

let lead: Session;
let trainer: Session;
let inspector: Session;
let otherInspector: Session;
let inspectorId: string;
let auditorId: string;
let fixture: Awaited<ReturnType<typeof createCalibrationItems>>;
let foreignItemId: string;

const count = async (table: typeof calibrationSets | typeof calibrationAssignments) =>
  (
    await db()
      .select({ n: sql<number>`count(*)::int` })
      .from(table)
  )[0].n;
const ids = () => fixture.published.map((p) => p.id);
const answer = (position: number, regions: unknown[], grade: string | null) => ({ position, grade, regions: { regions, surfaces: [], ruler: null } });

beforeAll(async () => {
  const vellmoor = await workspaceBySlug("vellmoor");
  lead = await signIn("lead@vellmoor.example");
  const make = async (role: "trainer" | "inspector" | "auditor") => createUser({ workspaceId: vellmoor.id, roles: [role], email: uniqueEmail(`calibration-${role}`) });
  const [t, i, o, a] = [await make("trainer"), await make("inspector"), await make("inspector"), await make("auditor")];
  [trainer, inspector, otherInspector] = [await signIn(t.email, TEST_PASSWORD), await signIn(i.email, TEST_PASSWORD), await signIn(o.email, TEST_PASSWORD)];
  inspectorId = i.id;
  auditorId = a.id;
  fixture = await createCalibrationItems(lead);
  foreignItemId = (await createCalibrationItems(await signIn("lead@quillfen.example"))).published[0].id;
});

describe("making a set", () => {
  const valid = () => ({ name: "Lens basics", itemIds: ids(), thresholds: { minGradeAgreement: 0.8, minMeanIou: 0.5 } });

  // The changes are functions: the fixture's item ids exist only once beforeAll has run.
  it.each([
    ["an empty set", () => ({ itemIds: [] }), /at least 5 items/],
    ["four items", () => ({ itemIds: ids().slice(0, 4) }), /at least 5 items/],
    ["an item twice", () => ({ itemIds: [...ids().slice(0, 4), ids()[0]] }), /only once/],
    ["a threshold above 100 %", () => ({ thresholds: { minGradeAgreement: 1.2, minMeanIou: 0.5 } }), /at most 1/],
    ["a negative IoU threshold", () => ({ thresholds: { minGradeAgreement: 0.8, minMeanIou: -0.1 } }), /at least 0/],
    ["no name", () => ({ name: "  " }), /name/],
  ])("refuses %s with a 400 and stores nothing", async (_what, change, message) => {
    const before = await count(calibrationSets);
    const res = await api<ErrorBody>(trainer, "POST", "/api/calibration/sets", { ...valid(), ...change() });
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(JSON.stringify(res.body.error)).toMatch(message);
    expect(await count(calibrationSets)).toBe(before);
  });

  it("refuses a draft item and another workspace's item, naming their places, and stores nothing", async () => {
    const before = await count(calibrationSets);
    const draft = await api<ErrorBody>(trainer, "POST", "/api/calibration/sets", { ...valid(), itemIds: [...ids().slice(0, 4), fixture.draft.id] });
    expect(draft.status).toBe(400);
    expect(draft.body.error.message).toMatch(/Only published gallery items.*#5/);
    const foreign = await api<ErrorBody>(trainer, "POST", "/api/calibration/sets", { ...valid(), itemIds: [foreignItemId, ...ids().slice(0, 4)] });
    expect(foreign.status).toBe(400);
    expect(foreign.body.error.message).toMatch(/#1 of the list are not gallery items of this workspace/);
    expect(await count(calibrationSets)).toBe(before);
  });

  it("is for trainers and leads: an inspector gets 403", async () => {
    expect((await api(inspector, "POST", "/api/calibration/sets", valid())).status).toBe(403);
  });

  it("refuses to assign an auditor, someone of another workspace or an impossible date, assigning nobody", async () => {
    const { setId } = await createAssignedSet(trainer, ids(), null);
    const before = await count(calibrationAssignments);
    const auditor = await api<ErrorBody>(trainer, "POST", `/api/calibration/sets/${setId}/assignments`, { userIds: [inspectorId, auditorId], dueOn: "2099-01-01" });
    expect(auditor.status).toBe(400);
    expect(auditor.body.error.message).toMatch(/cannot take calibration sets/);
    const badDate = await api<ErrorBody>(trainer, "POST", `/api/calibration/sets/${setId}/assignments`, { userIds: [inspectorId], dueOn: "2099-02-30" });
    expect(badDate.status).toBe(400);
    const stranger = await api<ErrorBody>(trainer, "POST", `/api/calibration/sets/${setId}/assignments`, { userIds: ["00000000-0000-4000-8000-000000000000"], dueOn: "2099-01-01" });
    expect(stranger.status).toBe(400);
    expect(await count(calibrationAssignments)).toBe(before);
  });
});

describe("taking a set blind, then the score and the key", () => {
  let setId: string;
  let attemptId: string;
  let assignmentId: string;
  /** Everything of the key a response must not carry before submission. */
  const keyMarks = () => [...KEYS.map((k) => k.caption), ...fixture.published.flatMap((p) => [p.id, p.photoId]), "keyGrade", "keyRegions", "keyCaption", "galleryItemId", '"d1"', '"s1"'];
  const expectBlind = (what: string, body: unknown) => {
    const text = JSON.stringify(body);
    for (const mark of keyMarks()) expect(text, `${what} carries ${mark}`).not.toContain(mark);
  };

  beforeAll(async () => {
    ({ setId } = await createAssignedSet(trainer, ids(), inspectorId, `Blind set ${Date.now()}`));
  });

  it("lists the assignment and opens the same attempt again after a pause", async () => {
    const mine = await api<{ assignments: { id: string; status: string; itemCount: number }[] }>(inspector, "GET", "/api/calibration/assignments");
    expectBlind("the assignments list", mine.body);
    const listed = mine.body.assignments.at(-1)!;
    expect(listed).toMatchObject({ status: "not_started", itemCount: 5 });
    assignmentId = listed.id;
    const first = await api<{ attemptId: string }>(inspector, "POST", `/api/calibration/assignments/${assignmentId}/attempt`);
    expect(first.status).toBe(200);
    attemptId = first.body.attemptId;
    expect((await api<{ attemptId: string }>(inspector, "POST", `/api/calibration/assignments/${assignmentId}/attempt`)).body.attemptId).toBe(attemptId);
    expect((await api(otherInspector, "POST", `/api/calibration/assignments/${assignmentId}/attempt`)).status).toBe(404);
  });

  it("hands the taker the items without anything of the key, on every route a taker calls", async () => {
    const read = await api<AttemptBody>(inspector, "GET", `/api/calibration/attempts/${attemptId}`);
    expect(read.status).toBe(200);
    expect(read.body.attempt.items).toHaveLength(5);
    expect(read.body.attempt.result).toBeNull();
    expectBlind("the attempt", read.body);
    const image = await fetch(new URL(`/api/calibration/attempts/${attemptId}/image?position=3`, process.env.TEST_BASE_URL ?? "http://127.0.0.1:3100"), { headers: { cookie: inspector.cookie } });
    expect(image.status).toBe(200);
    expect(image.headers.get("content-type")).toBe("image/webp");
    expectBlind("the image headers", [...image.headers.entries()]);
    const saved = await api(inspector, "PUT", `/api/calibration/attempts/${attemptId}/answers`, answer(1, SCRATCHED.regions, "C"));
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    expectBlind("a saved answer", { ...(saved.body as object), answer: { ...(saved.body as { answer: object }).answer, regions: "(own)" } });
    // The taker's own numbers, as on the Bench: their saved scratch (12 × 10 px, counted by hand) and nothing of the key.
    type MeasurementBody = {
      measurement: { measurement: { photoId: string; byDefect: Record<string, { px: number; count: number }> }; rubric: { proposal: { grade: string } } | null; savedAt: string | null };
    };
    const measured = await api<MeasurementBody>(inspector, "GET", `/api/calibration/attempts/${attemptId}/measurement?position=1`);
    expect(measured.status, JSON.stringify(measured.body)).toBe(200);
    expectBlind("the taker's measurement", measured.body);
    expect(measured.body.measurement.measurement.photoId).toBe("item-1");
    expect(measured.body.measurement.measurement.byDefect.scratch).toMatchObject({ px: 120, count: 1 });
    expect(measured.body.measurement.savedAt).not.toBeNull();
    const unsaved = await api<MeasurementBody>(inspector, "GET", `/api/calibration/attempts/${attemptId}/measurement?position=3`);
    expect(unsaved.status).toBe(200);
    expectBlind("an unsaved item's measurement", unsaved.body);
    expect(unsaved.body.measurement).toMatchObject({ savedAt: null, measurement: { byDefect: {} } });
    expect((await api<ErrorBody>(inspector, "GET", `/api/calibration/attempts/${attemptId}/measurement?position=x`)).status).toBe(400);
    expect((await api<ErrorBody>(inspector, "GET", `/api/calibration/attempts/${attemptId}/measurement?position=9`)).status).toBe(404);
    const early = await api<ErrorBody>(inspector, "POST", `/api/calibration/attempts/${attemptId}/submit`);
    expect(early.status).toBe(409);
    expectBlind("a refused submission", early.body);
  });

  it("keeps the set's items out of the taker's Gallery until they submit (list, item, measurement, reference panel)", async () => {
    const partType = fixture.partType.id;
    const list = await api<{ items: { id: string }[] }>(inspector, "GET", `/api/gallery?partType=${partType}`);
    expect(list.status).toBe(200);
    expectBlind("the gallery list", list.body);
    const reference = await api<{ items: { id: string }[] }>(inspector, "GET", `/api/gallery/reference?partType=${partType}&view=lens`);
    expect(reference.status).toBe(200);
    expectBlind("the reference panel", reference.body);
    for (const item of fixture.published) {
      expect((await api(inspector, "GET", `/api/gallery/${item.id}`)).status).toBe(404);
      expect((await api(inspector, "GET", `/api/gallery/${item.id}/measurement`)).status).toBe(404);
    }
    // Someone not taking the set still sees them.
    const others = await api<{ items: { id: string }[] }>(otherInspector, "GET", `/api/gallery?partType=${partType}`);
    expect(others.body.items.map((i) => i.id).sort()).toEqual(ids().sort());
  });

  it("keeps other people out of one's attempt (404, as a missing one)", async () => {
    expect((await api(otherInspector, "GET", `/api/calibration/attempts/${attemptId}`)).status).toBe(404);
    expect((await api(otherInspector, "PUT", `/api/calibration/attempts/${attemptId}/answers`, answer(2, [], "A"))).status).toBe(404);
    expect((await api(otherInspector, "GET", `/api/calibration/attempts/${attemptId}/image?position=2`)).status).toBe(404);
    expect((await api(otherInspector, "GET", `/api/calibration/attempts/${attemptId}/measurement?position=1`)).status).toBe(404);
  });

  it("refuses a bad answer with a 400, keeping the answers as they were", async () => {
    const outside = await api<ErrorBody>(
      inspector,
      "PUT",
      `/api/calibration/attempts/${attemptId}/answers`,
      answer(2, [{ id: "x", defect: "scratch", shape: { kind: "rect", x: 290, y: 190, width: 40, height: 40 } }], "A"),
    );
    expect(outside.status).toBe(400);
    const unknownClass = await api<ErrorBody>(
      inspector,
      "PUT",
      `/api/calibration/attempts/${attemptId}/answers`,
      answer(2, [{ id: "x", defect: "smudge", shape: { kind: "spot", x: 100, y: 100, radius: 4 } }], "A"),
    );
    expect(unknownClass.status).toBe(400);
    expect(unknownClass.body.error.message).toMatch(/not allowed for this part type/);
    expect((await api(inspector, "PUT", `/api/calibration/attempts/${attemptId}/answers`, answer(2, [], "D"))).status).toBe(400);
    expect((await api(inspector, "PUT", `/api/calibration/attempts/${attemptId}/answers`, answer(9, [], "A"))).status).toBe(404);
    const read = await api<AttemptBody>(inspector, "GET", `/api/calibration/attempts/${attemptId}`);
    expect(Object.keys(read.body.attempt.answers)).toEqual(["1"]);
  });

  it("scores the submitted attempt as computed by hand and shows the key only now", async () => {
    // 1: the key's scratch exactly, C (right). 2: nothing, A (right). 3: the dent missed, B (right).
    // 4: the key's scratch, but B for C (one step off). 5: a dent that is not there, A (right).
    await api(inspector, "PUT", `/api/calibration/attempts/${attemptId}/answers`, answer(2, [], "A"));
    await api(inspector, "PUT", `/api/calibration/attempts/${attemptId}/answers`, answer(3, [], "B"));
    await api(inspector, "PUT", `/api/calibration/attempts/${attemptId}/answers`, answer(4, SCRATCHED.regions, "B"));
    await api(inspector, "PUT", `/api/calibration/attempts/${attemptId}/answers`, answer(5, [{ id: "e1", defect: "dent", shape: { kind: "spot", x: 100, y: 120, radius: 5 } }], "A"));
    const before = await api<AttemptBody>(inspector, "GET", `/api/calibration/attempts/${attemptId}`);
    expectBlind("the attempt with every answer", { ...before.body, attempt: { ...before.body.attempt, answers: "(own)" } });

    const res = await api<AttemptBody>(inspector, "POST", `/api/calibration/attempts/${attemptId}/submit`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const { result, items } = res.body.attempt;
    expect(res.body.attempt.status).toBe("submitted");
    // 4 of 5 grades exact: 80 % meets the 80 % threshold. Scratch: IoU 1 on items 1 and 4. Dent: the
    // key's dent missed on item 3 (IoU 0) and a false one on item 5 (IoU 0): mean 0 < 0.5, so it fails.
    expect(result!.summary.grades).toMatchObject({ exact: 4, exactShare: 0.8 });
    expect(result!.summary.classes.scratch).toMatchObject({ meanIou: 1, missed: 0, extra: 0, gates: true });
    expect(result!.summary.classes.dent).toMatchObject({ meanIou: 0, missed: 1, extra: 1, gates: true });
    const check = (name: string, defect?: string) => result!.summary.checks.find((c) => c.check === name && c.defect === defect);
    expect(result!.summary.checks).toHaveLength(3);
    expect(check("grade_agreement")?.passed).toBe(true);
    expect(check("mean_iou", "scratch")?.passed).toBe(true);
    expect(check("mean_iou", "dent")?.passed).toBe(false);
    expect(result!.passed).toBe(false);
    expect(items.map((i) => i.keyCaption)).toEqual(KEYS.map((k) => k.caption));
    expect(items.map((i) => i.keyGrade)).toEqual(KEYS.map((k) => k.grade));
  });

  it("gives the set's items back to the taker's Gallery once submitted", async () => {
    const list = await api<{ items: { id: string }[] }>(inspector, "GET", `/api/gallery?partType=${fixture.partType.id}`);
    expect(list.body.items.map((i) => i.id).sort()).toEqual(ids().sort());
    expect((await api(inspector, "GET", `/api/gallery/${ids()[2]}`)).status).toBe(200);
  });

  it("freezes a submitted attempt", async () => {
    expect((await api(inspector, "PUT", `/api/calibration/attempts/${attemptId}/answers`, answer(1, [], "A"))).status).toBe(409);
    expect((await api(inspector, "POST", `/api/calibration/attempts/${attemptId}/submit`)).status).toBe(409);
  });

  it("shows the trainer the attempt per person and the item most missed", async () => {
    const res = await api<{ attempts: { userId: string; passed: boolean }[]; mostMissed: { position: number; missedAttempts: number }[]; items: { keyGrade: string }[] }>(
      trainer,
      "GET",
      `/api/calibration/sets/${setId}`,
    );
    expect(res.status).toBe(200);
    expect(res.body.attempts).toEqual([expect.objectContaining({ userId: inspectorId, passed: false })]);
    expect(res.body.mostMissed[0]).toMatchObject({ position: 3, missedAttempts: 1 });
    expect(res.body.items.map((i) => i.keyGrade)).toEqual(KEYS.map((k) => k.grade));
    expect((await api(inspector, "GET", `/api/calibration/sets/${setId}`)).status).toBe(403);
  });
});
