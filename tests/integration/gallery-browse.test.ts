/**
 * Reading the Gallery against the test server: list filters and keyset pages, drafts only for
 * editors, the Bench's reference order, the measured numbers of an item, and uploading a photo
 * straight into the gallery through the presigned pipeline.
 */
import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { galleryItems, photos } from "@/db/schema";
import type { GalleryCardDto, GalleryItemDto } from "@/lib/gallery/dto";
import type { GalleryMeasurement } from "@/lib/gallery/measure";
import { createUser, TEST_PASSWORD, uniqueEmail, workspaceBySlug } from "../support/db";
import { makePhotoLikeJpeg } from "@/support/fixtures/make-photos";
import { createGradedPhoto, insertItem, SCRATCHED } from "../support/gallery";
import { api, signIn, type Session } from "../support/http";
import { putToStore, testStore, type IntentBody } from "../support/photos";
import { listObjects } from "@/lib/storage/s3";

type Page = { items: GalleryCardDto[]; nextCursor: string | null };

let trainer: Session;
let inspector: Session;
let scene: Awaited<ReturnType<typeof createGradedPhoto>>;
const ids: Record<string, string> = {};

beforeAll(async () => {
  const vellmoor = await workspaceBySlug("vellmoor");
  const lead = await signIn("lead@vellmoor.example");
  trainer = await signIn((await createUser({ workspaceId: vellmoor.id, roles: ["trainer"], email: uniqueEmail("browse-trainer") })).email, TEST_PASSWORD);
  inspector = await signIn((await createUser({ workspaceId: vellmoor.id, roles: ["inspector"], email: uniqueEmail("browse-inspector") })).email, TEST_PASSWORD);
  scene = await createGradedPhoto(lead, { extraPhotos: 6 });
  const [p1, p2, p3, p4, p5, p6] = scene.extra;
  const base = { partTypeId: scene.partType.id };
  const dent = { ...SCRATCHED, regions: [{ id: "d1", defect: "dent", shape: { kind: "spot" as const, x: 120, y: 100, radius: 6 } }] };
  // Created one after another: newest last, so the list's order is known.
  ids.normal = (await insertItem(scene.owner, { ...base, photoId: p1.id, status: "published", kind: "normal", grade: "A" })).id;
  ids.scratchC = (await insertItem(scene.owner, { ...base, photoId: p2.id, status: "published", regions: SCRATCHED, grade: "C" })).id;
  ids.dentB = (await insertItem(scene.owner, { ...base, photoId: p3.id, status: "published", regions: dent, grade: "B" })).id;
  ids.scratchB = (await insertItem(scene.owner, { ...base, photoId: p4.id, status: "published", regions: SCRATCHED, grade: "B" })).id;
  ids.backView = (await insertItem(scene.owner, { ...base, photoId: p5.id, status: "published", regions: SCRATCHED, grade: "B", viewKey: "back" })).id;
  ids.draft = (await insertItem(scene.owner, { ...base, photoId: p6.id, regions: SCRATCHED })).id;
});

const listIds = async (session: Session, query: string) => (await api<Page>(session, "GET", `/api/gallery?partType=${scene.partType.id}${query}`)).body.items.map((i) => i.id);

describe("the list", () => {
  it("shows readers the published items only, newest first; editors also the drafts", async () => {
    expect(await listIds(inspector, "")).toEqual([ids.backView, ids.scratchB, ids.dentB, ids.scratchC, ids.normal]);
    expect(await listIds(trainer, "")).toEqual([ids.draft, ids.backView, ids.scratchB, ids.dentB, ids.scratchC, ids.normal]);
    expect(await listIds(trainer, "&status=draft")).toEqual([ids.draft]);
    // A reader asking for drafts still gets only published items.
    expect(await listIds(inspector, "&status=draft")).toEqual([ids.backView, ids.scratchB, ids.dentB, ids.scratchC, ids.normal]);
  });

  it("filters by view, defect class, normal/abnormal and grade, together", async () => {
    expect(await listIds(inspector, "&view=back")).toEqual([ids.backView]);
    expect(await listIds(inspector, "&defect=dent")).toEqual([ids.dentB]);
    expect(await listIds(inspector, "&kind=normal")).toEqual([ids.normal]);
    expect(await listIds(inspector, "&grade=B&defect=scratch&view=lens")).toEqual([ids.scratchB]);
    expect(await listIds(inspector, "&grade=Reject")).toEqual([]);
  });

  it("pages by keyset without skipping or repeating an item", async () => {
    const seen: string[] = [];
    let cursor: string | null = "";
    while (cursor !== null) {
      const page: { status: number; body: Page } = await api<Page>(inspector, "GET", `/api/gallery?partType=${scene.partType.id}&limit=2${cursor ? `&cursor=${cursor}` : ""}`);
      expect(page.body.items.length).toBeLessThanOrEqual(2);
      seen.push(...page.body.items.map((i) => i.id));
      cursor = page.body.nextCursor;
    }
    expect(seen).toEqual([ids.backView, ids.scratchB, ids.dentB, ids.scratchC, ids.normal]);
  });

  it("lists each item exactly as its own page describes it (the list's cards are written by PostgreSQL, the page's by toGalleryCardDto)", async () => {
    const own = await createGradedPhoto(await signIn("lead@vellmoor.example"), { extraPhotos: 2 });
    const [ready, waiting] = own.extra;
    const base = { partTypeId: own.partType.id };
    const published = await insertItem(own.owner, { ...base, photoId: ready.id, status: "published", regions: SCRATCHED, grade: "B" });
    const draft = await insertItem(own.owner, { ...base, photoId: waiting.id, kind: "normal", grade: "A" });
    // The edges of the two ways of writing a card: a photo still processing (no sizes, no URLs) and
    // a time whose microseconds a JavaScript Date cuts to milliseconds (.999999 → .999, never rounded up).
    await db().update(photos).set({ status: "processing", previewWidth: null, previewHeight: null, thumbnailWidth: null, thumbnailHeight: null }).where(eq(photos.id, waiting.id));
    await db().execute(sql`UPDATE gallery_items SET updated_at = '2026-11-30 23:59:59.999999+00' WHERE id = ${published.id}`);
    const listed = (await api<Page>(trainer, "GET", `/api/gallery?partType=${own.partType.id}`)).body.items;
    expect(listed.map((i) => i.id)).toEqual([draft.id, published.id]);
    for (const card of listed) {
      const page = await api<{ item: GalleryItemDto }>(trainer, "GET", `/api/gallery/${card.id}`);
      expect(page.status).toBe(200);
      const { rubricVersion: _v, source: _s, createdByName: _c, publishedAt: _p, retiredAt: _r, ...pageCard } = page.body.item;
      expect(card).toEqual(pageCard);
    }
    expect(listed[1].updatedAt).toBe("2026-11-30T23:59:59.999Z");
    expect(listed[0].photo).toMatchObject({ ready: false, urls: null, preview: null, thumbnail: null });
    expect(listed[1].photo.urls).toEqual({ thumbnail: `/api/photos/${ready.id}/thumbnail`, preview: `/api/photos/${ready.id}/preview` });
  });

  it("answers 400 with a sentence to bad filters and a forged cursor", async () => {
    const bad = await api<{ error: { message: string } }>(inspector, "GET", "/api/gallery?grade=E");
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/A, B, C, Reject/);
    const forged = await api<{ error: { message: string } }>(inspector, "GET", "/api/gallery?cursor=bm90LWEtY3Vyc29y");
    expect(forged.status).toBe(400);
    expect(forged.body.error.message).toMatch(/first page/);
  });
});

describe("the Bench's reference panel", () => {
  it("lists published items of the part type and view: normal first, then A → Reject", async () => {
    const res = await api<{ items: GalleryCardDto[] }>(inspector, "GET", `/api/gallery/reference?partType=${scene.partType.id}&view=lens`);
    expect(res.body.items.map((i) => i.id)).toEqual([ids.normal, ids.scratchB, ids.dentB, ids.scratchC]);
  });

  it("narrows abnormal items to the selected class and keeps the normal ones to compare", async () => {
    const res = await api<{ items: GalleryCardDto[] }>(inspector, "GET", `/api/gallery/reference?partType=${scene.partType.id}&view=lens&defect=scratch`);
    expect(res.body.items.map((i) => i.id)).toEqual([ids.normal, ids.scratchB, ids.scratchC]);
  });

  it("answers 400 to a view the part type does not have", async () => {
    expect((await api(inspector, "GET", `/api/gallery/reference?partType=${scene.partType.id}&view=side`)).status).toBe(400);
  });
});

describe("measured numbers", () => {
  it("measures the item's own regions and says what the published rubric makes of them", async () => {
    const res = await api<{ measurement: GalleryMeasurement }>(inspector, "GET", `/api/gallery/${ids.scratchC}/measurement`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const { measurement, rubric } = res.body.measurement;
    // Hand computation (common practice: a box covers width × height pixels): the Surface is
    // 200 × 100 = 20 000 px; the 12 × 10 scratch box covers 120 px = 0.6 % of it, and 1.2 % of
    // the lens window (the Surface's left half, 10 000 px), over the rubric's 1 % for C.
    expect(measurement.surfacePx).toBe(20_000);
    expect(measurement.byDefect.scratch).toMatchObject({ px: 120, count: 1 });
    expect(measurement.byDefect.scratch.share).toBeCloseTo(0.006, 10);
    expect(measurement.byZone["lens-window"].byDefect.scratch.share).toBeCloseTo(0.012, 10);
    expect(rubric).toMatchObject({ version: 1, proposal: { grade: "C" } });
  });
});

describe("uploading straight into the gallery", () => {
  const intent = (session: Session, bytes: number) =>
    api<IntentBody & { error?: { message: string } }>(session, "POST", "/api/gallery/uploads", {
      partTypeId: scene.partType.id,
      viewKey: "lens",
      kind: "normal",
      grade: "A",
      fileName: "clean-lens.jpg",
      contentType: "image/jpeg",
      bytes,
    });

  it("makes a draft item with an empty region set once the photo is ready; the same ticket again answers the same item", async () => {
    const bytes = await makePhotoLikeJpeg({ width: 480, height: 360, seed: 91 });
    const started = await intent(trainer, bytes.length);
    expect(started.status).toBe(201);
    expect(started.body.upload.url).toContain(`/uploads/${scene.owner.workspaceId}/gallery/${started.body.photoId}`);
    expect(await putToStore(started.body, bytes)).toBe(200);
    const done = await api<{ item: GalleryItemDto }>(trainer, "POST", "/api/gallery/photos", { ticket: started.body.ticket });
    expect(done.status, JSON.stringify(done.body)).toBe(201);
    expect(done.body.item).toMatchObject({ status: "draft", kind: "normal", grade: "A", rubricVersion: 1, source: { kind: "upload" }, regions: { regions: [], surfaces: [], ruler: null } });
    expect(done.body.item.photo).toMatchObject({ id: started.body.photoId, ready: true, original: { width: 480, height: 360 } });
    const again = await api<{ item: GalleryItemDto }>(trainer, "POST", "/api/gallery/photos", { ticket: started.body.ticket });
    expect(again.status).toBe(200);
    expect(again.body.item.id).toBe(done.body.item.id);
    // Its images come through the photo routes every role of the workspace may read.
    expect((await api(inspector, "GET", `/api/photos/${started.body.photoId}/thumbnail`)).status).toBe(200);
  });

  it("refuses a file that is not a photo: no photo row, no item, no object left", async () => {
    const junk = Buffer.from("GIF89a but not really a picture at all".repeat(20));
    const started = await intent(trainer, junk.length);
    await putToStore(started.body, junk);
    const done = await api<{ error: { message: string } }>(trainer, "POST", "/api/gallery/photos", { ticket: started.body.ticket });
    expect(done.status).toBeGreaterThanOrEqual(400);
    expect(done.status).toBeLessThan(500);
    expect(await db().select().from(photos).where(eq(photos.id, started.body.photoId))).toEqual([]);
    expect(await db().select().from(galleryItems).where(eq(galleryItems.photoId, started.body.photoId))).toEqual([]);
    const left: string[] = [];
    for (const prefix of ["uploads/", "photos/"]) for await (const o of listObjects(testStore(), prefix)) if (o.key.includes(started.body.photoId)) left.push(o.key);
    expect(left).toEqual([]);
  });

  it("refuses a view the part type lacks and another person's ticket", async () => {
    const wrongView = await api<{ error: { message: string } }>(trainer, "POST", "/api/gallery/uploads", {
      partTypeId: scene.partType.id,
      viewKey: "side",
      kind: "normal",
      grade: "A",
      fileName: "x.jpg",
      contentType: "image/jpeg",
      bytes: 1000,
    });
    expect(wrongView.status).toBe(400);
    expect(wrongView.body.error.message).toMatch(/not a view of/);
    const started = await intent(trainer, 1000);
    const other = await signIn("lead@vellmoor.example");
    expect((await api(other, "POST", "/api/gallery/photos", { ticket: started.body.ticket })).status).toBe(400);
  });
});
