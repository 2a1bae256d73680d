/**
 * Rubric versions over HTTP against the test server and its PostgreSQL: drafts, publishing,
 * immutability (in the app and in the database trigger), roles, bad input, diff and preview.
 */
import { sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { ownerDb } from "../support/owner-db";
import { createUser, uniqueEmail } from "../support/db";
import { FIXTURE_RUBRIC_V1, createPartType, insertRubricVersion, workspaceIdOf } from "../support/grading";
import { api, signIn, type Session } from "../support/http";

type ErrorBody = { error: { code: string; message: string; fieldErrors?: Record<string, string> } };
type Versions = { versions: { version: number; status: string; rubric: { rules: { id: string; threshold: unknown }[] }; publishedByName: string | null }[] };

let lead: Session;
let trainer: Session;
let inspector: Session;
let owner: { workspaceId: string; userId: string };

const refusal = (e: unknown) => String((e as { cause?: { message?: string } }).cause?.message ?? e);
const dbError = (query: ReturnType<typeof sql>) =>
  db()
    .execute(query)
    .then(
      () => "no error",
      (e) => refusal(e),
    );

beforeAll(async () => {
  lead = await signIn("lead@vellmoor.example");
  inspector = await signIn("inspector@vellmoor.example");
  owner = await workspaceIdOf("lead@vellmoor.example");
  const trainerUser = await createUser({ workspaceId: owner.workspaceId, roles: ["trainer"], email: uniqueEmail("rubric-trainer") });
  trainer = await signIn(trainerUser.email, "integration-pass-123");
});

async function partTypeWithV1() {
  const partType = await createPartType(owner.workspaceId);
  await insertRubricVersion({ workspaceId: owner.workspaceId, partTypeId: partType.id, version: 1, status: "published", actorId: owner.userId });
  return partType;
}

const v2Rules = FIXTURE_RUBRIC_V1.rules.map((rule) => (rule.id === "lens-scratch-c" ? { ...rule, threshold: 2 } : rule));

describe("rubric drafts and publishing", () => {
  it("a trainer opens a draft copied from v1, edits it; a lead publishes it as v2", async () => {
    const partType = await partTypeWithV1();
    const base = `/api/part-types/${partType.id}/rubrics`;
    const opened = await api<{ created: boolean; version: number }>(trainer, "POST", base);
    expect(opened.status).toBe(201);
    expect(opened.body).toEqual({ created: true, version: 2 });
    // Opening again returns the same draft: one draft per part type.
    expect((await api(trainer, "POST", base)).body).toEqual({ created: false, version: 2 });

    const draft = await api<{ draft: { version: number; rubric: unknown; basedOnVersion: number } }>(trainer, "GET", `${base}/draft`);
    expect(draft.body.draft).toMatchObject({ version: 2, basedOnVersion: 1, rubric: FIXTURE_RUBRIC_V1 });

    const saved = await api(trainer, "PATCH", `${base}/draft`, { rubric: { ...FIXTURE_RUBRIC_V1, rules: v2Rules }, version: 2, revision: 0 });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    expect(saved.body).toMatchObject({ version: 2, revision: 1 });

    const byTrainer = await api<ErrorBody>(trainer, "POST", `${base}/draft/publish`, { version: 2, revision: 1 });
    expect(byTrainer.status).toBe(403);
    const published = await api(lead, "POST", `${base}/draft/publish`, { version: 2, revision: 1 });
    expect(published.status).toBe(200);
    expect(published.body).toEqual({ version: 2 });

    const list = await api<Versions>(inspector, "GET", base);
    expect(list.body.versions.map((v) => [v.version, v.status])).toEqual([
      [2, "published"],
      [1, "published"],
    ]);
    expect(list.body.versions[0].rubric.rules.find((r) => r.id === "lens-scratch-c")?.threshold).toBe(2);

    // No draft any more: saving answers 409 and the published v2 is untouched.
    const late = await api<ErrorBody>(trainer, "PATCH", `${base}/draft`, { rubric: { rules: [] }, version: 2, revision: 1 });
    expect(late.status).toBe(409);
    expect((await api<Versions>(inspector, "GET", base)).body.versions[0].rubric.rules).toHaveLength(2);

    const diff = await api<{ from: number; to: number; diff: { changes: { text: string }[] } }>(inspector, "GET", `${base}/diff?from=1&to=2`);
    expect(diff.body.from).toBe(1);
    expect(diff.body.diff.changes.map((c) => c.text)).toEqual(["scratch on lens window: threshold for C changed from 1.0 % to 2.0 %"]);
    // Without parameters: the newest version against the one it was based on.
    expect((await api<{ from: number; to: number }>(inspector, "GET", `${base}/diff`)).body).toMatchObject({ from: 1, to: 2 });
    expect((await api<ErrorBody>(inspector, "GET", `${base}/diff?from=1&to=9`)).status).toBe(404);
    expect((await api<ErrorBody>(inspector, "GET", `${base}/diff?from=x`)).status).toBe(400);
  });

  it("refuses a bad rubric with the library's sentences and stores nothing", async () => {
    const partType = await partTypeWithV1();
    const base = `/api/part-types/${partType.id}/rubrics`;
    await api(trainer, "POST", base);
    const before = (await api<{ draft: { rubric: unknown; updatedAt: string } }>(trainer, "GET", `${base}/draft`)).body.draft;
    const bad: [unknown, RegExp][] = [
      [{ rules: [{ id: "neg", metric: "count", defect: "scratch", comparison: ">", threshold: -1, grade: "B" }] }, /Rule 1 \("neg"\), threshold: cannot be negative/],
      [
        { rules: [{ id: "sw", metric: "count", defect: "swelling", comparison: ">", threshold: 0, grade: "Reject" }] },
        /Rule 1 \("sw"\), defect: defect class "swelling" is not one of this part type's defect classes \(allowed: scratch, dent, crack\)/,
      ],
      [{ rules: [{ id: "a", metric: "count", defect: "dent", comparison: ">", threshold: 0, grade: "A" }] }, /grade: cannot be A/],
      [{ rules: [{ id: "z", metric: "count", defect: "dent", zone: "lens-window", comparison: ">", threshold: 0, grade: "B" }] }, /unknown field "zone" for a count rule/],
      [{ rules: "all of them" }, /rules: must be a list of rules/],
    ];
    for (const [rubric, message] of bad) {
      const res = await api<ErrorBody>(trainer, "PATCH", `${base}/draft`, { rubric, version: 2, revision: 0 });
      expect(res.status, JSON.stringify(rubric)).toBe(400);
      expect(res.body.error.message).toMatch(message);
      expect(Object.keys(res.body.error.fieldErrors ?? {}).every((key) => key.startsWith("rubric"))).toBe(true);
    }
    expect((await api(trainer, "PATCH", `${base}/draft`, { rubric: { rules: [] }, version: 2, revision: 0, extra: 1 })).status).toBe(400);
    // Without the revision it was based on, a save is refused before anything is read.
    expect((await api<ErrorBody>(trainer, "PATCH", `${base}/draft`, { rubric: { rules: [] } })).body.error.fieldErrors?.revision).toMatch(/the draft's revision/);
    const after = (await api<{ draft: { rubric: unknown; updatedAt: string } }>(trainer, "GET", `${base}/draft`)).body.draft;
    expect(after).toEqual(before);
  });

  it("checks roles: inspectors and auditors cannot draft, only leads publish", async () => {
    const partType = await partTypeWithV1();
    const base = `/api/part-types/${partType.id}/rubrics`;
    expect((await api(inspector, "POST", base)).status).toBe(403);
    expect((await api(await signIn("auditor@vellmoor.example"), "POST", base)).status).toBe(403);
    expect((await api(lead, "POST", base)).status).toBe(201);
    expect((await api(inspector, "PATCH", `${base}/draft`, { rubric: { rules: [] }, version: 2, revision: 0 })).status).toBe(403);
    expect((await api(inspector, "POST", `${base}/draft/publish`, { version: 2, revision: 0 })).status).toBe(403);
  });

  it("another workspace's part type is a 404, exactly like a missing one", async () => {
    const partType = await partTypeWithV1();
    const other = await signIn("lead@quillfen.example");
    const foreign = await api<ErrorBody>(other, "GET", `/api/part-types/${partType.id}/rubrics`);
    const missing = await api<ErrorBody>(other, "GET", `/api/part-types/00000000-0000-4000-8000-000000000000/rubrics`);
    expect(foreign.status).toBe(404);
    expect(foreign.body).toEqual(missing.body);
    expect((await api(other, "POST", `/api/part-types/${partType.id}/rubrics`)).status).toBe(404);
    expect((await api(other, "POST", `/api/part-types/${partType.id}/rubrics/draft/publish`, { version: 2, revision: 0 })).status).toBe(404);
  });

  it("publishing re-checks the draft against the part type as it is now", async () => {
    const partType = await partTypeWithV1();
    const base = `/api/part-types/${partType.id}/rubrics`;
    await api(trainer, "POST", base);
    await api(trainer, "PATCH", `${base}/draft`, { rubric: { rules: [{ id: "dent-b", metric: "count", defect: "dent", comparison: ">", threshold: 0, grade: "B" }] }, version: 2, revision: 0 });
    // The part type loses its "dent" class after the draft was saved.
    await db().execute(sql`UPDATE part_types SET defect_classes = '[{"key":"scratch","label":"scratch","severity":"major"}]'::jsonb WHERE id = ${partType.id}`);
    const res = await api<ErrorBody>(lead, "POST", `${base}/draft/publish`, { version: 2, revision: 1 });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/defect class "dent" is not one of this part type's defect classes/);
    expect((await api<{ draft: { status: string } }>(lead, "GET", `${base}/draft`)).body.draft.status).toBe("draft");
  });
});

describe("drafts carry their revision (no lost updates)", () => {
  it("a save or publish based on an older edit of the draft is refused with 409 and changes nothing", async () => {
    const partType = await partTypeWithV1();
    const base = `/api/part-types/${partType.id}/rubrics`;
    await api(trainer, "POST", base);
    const opened = (await api<{ draft: { version: number; revision: number } }>(trainer, "GET", `${base}/draft`)).body.draft;
    expect(opened).toMatchObject({ version: 2, revision: 0 });
    // Two people opened edit 0; the trainer saves first.
    const first = await api<{ revision: number }>(trainer, "PATCH", `${base}/draft`, { rubric: { ...FIXTURE_RUBRIC_V1, rules: v2Rules }, version: 2, revision: 0 });
    expect(first.status).toBe(200);
    expect(first.body.revision).toBe(1);
    // The lead, still on edit 0, would overwrite the trainer's rules unseen: 409.
    const stale = await api<ErrorBody>(lead, "PATCH", `${base}/draft`, { rubric: { rules: [] }, version: 2, revision: 0 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.message).toMatch(/was saved again .*edit 1; you had edit 0.*reload the draft/);
    // Nor may the lead publish edit 0: what would be published is not what they reviewed.
    const blindPublish = await api<ErrorBody>(lead, "POST", `${base}/draft/publish`, { version: 2, revision: 0 });
    expect(blindPublish.status).toBe(409);
    const draft = (await api<{ draft: { status: string; revision: number; rubric: { rules: unknown[] } } }>(lead, "GET", `${base}/draft`)).body.draft;
    expect(draft).toMatchObject({ status: "draft", revision: 1 });
    expect(draft.rubric.rules).toHaveLength(v2Rules.length);
    // A draft of another version number (v3 after v2 is published) is "moved" as well.
    expect((await api(lead, "POST", `${base}/draft/publish`, { version: 2, revision: 1 })).status).toBe(200);
    await api(trainer, "POST", base);
    expect((await api<ErrorBody>(trainer, "PATCH", `${base}/draft`, { rubric: { rules: [] }, version: 2, revision: 1 })).status).toBe(409);
    expect((await api(trainer, "PATCH", `${base}/draft`, { rubric: { rules: [] }, version: 3, revision: 0 })).status).toBe(200);
  });
});

describe("the database keeps published versions immutable", () => {
  it("refuses UPDATE and DELETE of a published row, allows them on a draft", async () => {
    const partType = await partTypeWithV1();
    await insertRubricVersion({ workspaceId: owner.workspaceId, partTypeId: partType.id, version: 2, status: "draft" });
    expect(await dbError(sql`UPDATE rubric_versions SET rubric = '{"rules":[]}'::jsonb WHERE part_type_id = ${partType.id} AND version = 1`)).toMatch(
      /version 1 is published and immutable \(UPDATE refused\)/,
    );
    expect(await dbError(sql`DELETE FROM rubric_versions WHERE part_type_id = ${partType.id} AND version = 1`)).toMatch(/version 1 is published and immutable \(DELETE refused\)/);
    expect(await dbError(sql`UPDATE rubric_versions SET rubric = '{"rules":[]}'::jsonb WHERE part_type_id = ${partType.id} AND version = 2`)).toBe("no error");
    expect(await dbError(sql`DELETE FROM rubric_versions WHERE part_type_id = ${partType.id} AND version = 2`)).toBe("no error");
    // TRUNCATE is the owner's alone (the app's role has no TRUNCATE right; db-role.test.ts).
    expect(
      await ownerDb()
        .execute(sql`TRUNCATE rubric_versions CASCADE`)
        .then(
          () => "no error",
          (e) => refusal(e),
        ),
    ).toMatch(/cannot be truncated/);
  });

  it("allows only one draft per part type and unique version numbers", async () => {
    const partType = await partTypeWithV1();
    await insertRubricVersion({ workspaceId: owner.workspaceId, partTypeId: partType.id, version: 2, status: "draft" });
    await expect(insertRubricVersion({ workspaceId: owner.workspaceId, partTypeId: partType.id, version: 3, status: "draft" }).catch((e) => Promise.reject(refusal(e)))).rejects.toMatch(
      /rubric_versions_one_draft_key/,
    );
    await expect(insertRubricVersion({ workspaceId: owner.workspaceId, partTypeId: partType.id, version: 1, status: "published" }).catch((e) => Promise.reject(refusal(e)))).rejects.toMatch(
      /rubric_versions_part_type_version_key/,
    );
  });
});

describe("preview", () => {
  it("grades sample measurements with an unsaved rubric and stores nothing", async () => {
    const partType = await partTypeWithV1();
    const photo = {
      photoId: "sample-1",
      viewKey: "lens",
      calibration: { method: "ruler", pxPerMm: 10, detail: "sample" },
      byDefect: { scratch: { px: 120, share: 0.0006, count: 1, areaMm2: 1.2, maxLengthMm: null, totalLengthMm: null, maxDiameterMm: null } },
      byZone: { "lens-window": { zonePx: 10000, byDefect: { scratch: { px: 120, share: 0.012, areaMm2: 1.2 } } } },
      pixelFaults: null,
    };
    const count = async () => (await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM rubric_versions WHERE part_type_id = ${partType.id}`)).rows[0].n;
    const before = await count();
    const res = await api<{ result: { grade: string; lines: { text: string }[] } }>(trainer, "POST", `/api/part-types/${partType.id}/rubrics/preview`, { rubric: { rules: v2Rules }, photos: [photo] });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.result.grade).toBe("B");
    expect(res.body.result.lines.map((l) => l.text)).toEqual(["scratch covers 1.2 % of lens window > 0.5 % allowed for A → B"]);
    expect(await count()).toBe(before);
    const bad = await api<ErrorBody>(trainer, "POST", `/api/part-types/${partType.id}/rubrics/preview`, {
      rubric: { rules: v2Rules },
      photos: [{ ...photo, byDefect: { scratch: { ...photo.byDefect.scratch, share: 2 } } }],
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/Invalid photo measurement 1/);
  });
});
