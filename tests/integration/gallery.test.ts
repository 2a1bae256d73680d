/**
 * The Gallery's write path against the test server: promoting a graded unit's photo (regions and
 * grade copied as a draft, the unit untouched), editing with revisions, publishing, retiring; who
 * may do what; bad input answered 4xx with nothing stored.
 */
import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { galleryItems, rechecks, regions } from "@/db/schema";
import type { GalleryItemDto } from "@/lib/gallery/dto";
import { createUser, TEST_PASSWORD, uniqueEmail, workspaceBySlug } from "../support/db";
import { createGradedPhoto, SCRATCHED } from "../support/gallery";
import { createMeasurableUnit, createPhoto } from "../support/grading";
import { api, signIn, type Session } from "../support/http";

type ItemBody = { item: GalleryItemDto };
type ErrorBody = { error: { code: string; message: string; fieldErrors?: Record<string, string> }; current?: GalleryItemDto };

let lead: Session;
let trainer: Session;
let inspector: Session;
let auditor: Session;
let scene: Awaited<ReturnType<typeof createGradedPhoto>>;

const itemCount = async () =>
  (
    await db()
      .select({ n: sql<number>`count(*)::int` })
      .from(galleryItems)
  )[0].n;

beforeAll(async () => {
  const vellmoor = await workspaceBySlug("vellmoor");
  lead = await signIn("lead@vellmoor.example");
  const as = async (role: "trainer" | "inspector" | "auditor") => signIn((await createUser({ workspaceId: vellmoor.id, roles: [role], email: uniqueEmail(`gallery-${role}`) })).email, TEST_PASSWORD);
  [trainer, inspector, auditor] = [await as("trainer"), await as("inspector"), await as("auditor")];
  scene = await createGradedPhoto(lead);
});

describe("promoting a graded unit's photo", () => {
  let item: GalleryItemDto;

  it("makes a draft with a copy of the photo's regions and the unit's grade and rubric version", async () => {
    const res = await api<ItemBody>(trainer, "POST", "/api/gallery", { photoId: scene.photo.id });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    item = res.body.item;
    expect(item).toMatchObject({ status: "draft", kind: "abnormal", grade: "C", rubricVersion: 1, viewKey: "lens", defectClasses: ["scratch"], caption: "", revision: 0 });
    expect(item.source).toMatchObject({ kind: "unit", unitId: scene.unit.id });
    expect(item.regions.regions).toEqual([{ id: "scratch-1", defect: "scratch", shape: { kind: "rect", x: 60, y: 60, width: 12, height: 10 } }]);
    expect(item.regions.surfaces).toHaveLength(1);
  });

  it("refuses to promote the same photo twice while an item shows it", async () => {
    const again = await api<ErrorBody>(trainer, "POST", "/api/gallery", { photoId: scene.photo.id });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already in the gallery/);
  });

  it("edits the item's own copy: the unit's regions stay as they were", async () => {
    const before = await db().select().from(regions).where(eq(regions.photoId, scene.photo.id));
    const moved = { ...item.regions, regions: [{ id: "scratch-1", defect: "scratch", shape: { kind: "rect", x: 70, y: 70, width: 20, height: 8 } }] };
    const res = await api<ItemBody>(trainer, "PATCH", `/api/gallery/${item.id}`, { revision: 0, caption: "Scratch across the lens window, 1.6 %: C", regions: moved });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.item).toMatchObject({ revision: 1, caption: "Scratch across the lens window, 1.6 %: C" });
    expect(res.body.item.regions.regions[0].shape).toEqual({ kind: "rect", x: 70, y: 70, width: 20, height: 8 });
    expect(await db().select().from(regions).where(eq(regions.photoId, scene.photo.id))).toEqual(before);
    item = res.body.item;
  });

  it("answers 409 with the current item to an edit based on an older revision, storing nothing", async () => {
    const res = await api<ErrorBody>(lead, "PATCH", `/api/gallery/${item.id}`, { revision: 0, caption: "Stale" });
    expect(res.status).toBe(409);
    expect(res.body.current).toMatchObject({ revision: 1, caption: "Scratch across the lens window, 1.6 %: C" });
  });

  it("records the rubric version published now when the grade changes", async () => {
    const res = await api<ItemBody>(trainer, "PATCH", `/api/gallery/${item.id}`, { revision: 1, grade: "B" });
    expect(res.body.item).toMatchObject({ grade: "B", rubricVersion: 1, revision: 2 });
    item = res.body.item;
  });

  it("publishes it; inspectors and auditors then see it, and cannot change it", async () => {
    expect((await api(inspector, "GET", `/api/gallery/${item.id}`)).status).toBe(404);
    const published = await api<ItemBody>(trainer, "POST", `/api/gallery/${item.id}/publish`, { revision: 2 });
    expect(published.status, JSON.stringify(published.body)).toBe(200);
    expect(published.body.item.status).toBe("published");
    for (const reader of [inspector, auditor]) {
      const edit = await api<ErrorBody>(reader, "PATCH", `/api/gallery/${item.id}`, { revision: 3, caption: "mine" });
      expect(edit.status).toBe(403);
    }
    expect((await api<ItemBody>(inspector, "GET", `/api/gallery/${item.id}`)).body.item.caption).toMatch(/lens window/);
    // The item shows the unit's first grade and regions: while the unit waits for its blind
    // recheck (drawn when it was graded, or sent now: 409 says it already waits), auditors do not see it.
    expect([201, 409]).toContain((await api(lead, "POST", "/api/rechecks", { unitId: scene.unit.id })).status);
    expect((await db().select({ status: rechecks.status }).from(rechecks).where(eq(rechecks.unitId, scene.unit.id))).map((r) => r.status)).toEqual(["waiting"]);
    expect((await api(auditor, "GET", `/api/gallery/${item.id}`)).status).toBe(404);
    expect(JSON.stringify((await api(auditor, "GET", "/api/gallery?limit=100")).body)).not.toContain(item.id);
    expect((await api(inspector, "POST", `/api/gallery/${item.id}/retire`, { revision: 3 })).status).toBe(403);
    item = published.body.item;
  });

  it("retires it: kept for editors, gone for everyone else, and no longer editable", async () => {
    const retired = await api<ItemBody>(trainer, "POST", `/api/gallery/${item.id}/retire`, { revision: item.revision });
    expect(retired.body.item.status).toBe("retired");
    expect((await api(inspector, "GET", `/api/gallery/${item.id}`)).status).toBe(404);
    expect((await api(trainer, "GET", `/api/gallery/${item.id}`)).status).toBe(200);
    const edit = await api<ErrorBody>(trainer, "PATCH", `/api/gallery/${item.id}`, { revision: retired.body.item.revision, caption: "again" });
    expect(edit.status).toBe(409);
    expect(edit.body.error.message).toMatch(/retired/);
    // Once retired, the photo may be promoted again as a new draft.
    expect((await api(trainer, "POST", "/api/gallery", { photoId: scene.photo.id })).status).toBe(201);
  });
});

describe("what publishing needs", () => {
  it("says every reason at once: an abnormal item with no regions and no caption", async () => {
    const photo = await createPhoto({ workspaceId: scene.owner.workspaceId, unitId: scene.unit.id, uploadedBy: scene.owner.userId });
    const draft = await api<ItemBody>(trainer, "POST", "/api/gallery", { photoId: photo.id });
    expect(draft.body.item.kind).toBe("normal");
    const abnormal = await api<ItemBody>(trainer, "PATCH", `/api/gallery/${draft.body.item.id}`, { revision: 0, kind: "abnormal" });
    const res = await api<ErrorBody>(trainer, "POST", `/api/gallery/${draft.body.item.id}/publish`, { revision: abnormal.body.item.revision });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/caption/);
    expect(res.body.error.message).toMatch(/at least one defect region/);
    expect((await api<ItemBody>(trainer, "GET", `/api/gallery/${draft.body.item.id}`)).body.item.status).toBe("draft");
  });
});

describe("bad input stores nothing", () => {
  it("refuses a photo of a unit that is not graded yet", async () => {
    const waiting = await createMeasurableUnit(scene.owner);
    const res = await api<ErrorBody>(trainer, "POST", "/api/gallery", { photoId: waiting.photo.id });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/Only a graded unit's photo/);
  });

  it("answers 400 to a malformed body and 404 to an unknown or foreign photo, adding no item", async () => {
    const before = await itemCount();
    expect((await api<ErrorBody>(trainer, "POST", "/api/gallery", { photoId: "not-an-id" })).status).toBe(400);
    expect((await api<ErrorBody>(trainer, "POST", "/api/gallery", { photoId: scene.photo.id, extra: 1 })).body.error.message).toMatch(/Unknown field/);
    expect((await api(trainer, "POST", "/api/gallery", { photoId: "00000000-0000-4000-8000-000000000000" })).status).toBe(404);
    const quillfen = await signIn("lead@quillfen.example");
    const foreign = await createGradedPhoto(quillfen);
    expect((await api(trainer, "POST", "/api/gallery", { photoId: foreign.photo.id })).status).toBe(404);
    expect(await itemCount()).toBe(before);
  });

  it("refuses regions outside the photo, of a class the part type lacks, or beyond the gallery's budget, keeping the item as it was", async () => {
    const photo = await createPhoto({ workspaceId: scene.owner.workspaceId, unitId: scene.unit.id, uploadedBy: scene.owner.userId });
    const { body } = await api<ItemBody>(trainer, "POST", "/api/gallery", { photoId: photo.id });
    const id = body.item.id;
    const outside = { ...SCRATCHED, regions: [{ id: "a", defect: "scratch", shape: { kind: "rect", x: 290, y: 10, width: 50, height: 10 } }] };
    const unknown = { ...SCRATCHED, regions: [{ id: "a", defect: "swelling", shape: { kind: "rect", x: 10, y: 10, width: 5, height: 5 } }] };
    const many = { ...SCRATCHED, regions: Array.from({ length: 101 }, (_, i) => ({ id: `r${i}`, defect: "dent", shape: { kind: "spot", x: 100, y: 100, radius: 2 } })) };
    for (const [payload, pattern] of [
      [outside, /outside/],
      [unknown, /not allowed/],
      [many, /at most 100 defect regions/],
    ] as const) {
      const res = await api<ErrorBody>(trainer, "PATCH", `/api/gallery/${id}`, { revision: 0, regions: payload });
      expect(res.status).toBe(400);
      expect(res.body.error.message).toMatch(pattern);
      expect(res.body.error.message).toMatch(/Nothing was stored/);
    }
    expect((await api(trainer, "PATCH", `/api/gallery/${id}`, { revision: 0 })).status).toBe(400);
    const after = await api<ItemBody>(trainer, "GET", `/api/gallery/${id}`);
    expect(after.body.item).toMatchObject({ revision: 0, regions: body.item.regions });
  });
});
