/**
 * The worker is killed with SIGKILL (no chance to hand its jobs back) in the middle of processing
 * photos, and in the middle of a measurement job. A new worker starts; pg-boss's maintenance
 * finds the dead worker's jobs past their expiry (PHOTO_JOB_EXPIRE_SECONDS /
 * MEASURE_JOB_EXPIRE_SECONDS, short in the test run) and retries them. Afterwards every photo is
 * ready or failed with a reason, none was made ready twice, and the store holds exactly the
 * objects the rows name; the measurement is stored once.
 */
import { and, eq, inArray, isNull, sql } from "drizzle-orm";
import sharp from "sharp";
import { afterAll, beforeAll, expect, it } from "vitest";
import { db } from "@/db/client";
import { activityLog, measurements, photos } from "@/db/schema";
import { enqueueMeasureUnit } from "@/lib/jobs/measure-unit";
import { makePhotoLikeRaw } from "@/support/fixtures/make-photos";
import { createMeasurableUnit, createPhoto, saveRegions, workspaceIdOf, type FixtureRegion } from "../support/grading";
import { signIn, type Session } from "../support/http";
import { createUser, TEST_PASSWORD, uniqueEmail, workspaceBySlug } from "../support/db";
import { createPhotoUnits, finalise, photoRowsFor, putToStore, requestUpload, storedKeysFor, waitForPhoto } from "../support/photos";
import { serviceControl } from "../support/services";

let inspector: Session;
let unit: string;
let workerDown = false;

beforeAll(async () => {
  const vellmoor = await workspaceBySlug("vellmoor");
  inspector = await signIn((await createUser({ workspaceId: vellmoor.id, roles: ["inspector"], email: uniqueEmail("worker-fault") })).email, TEST_PASSWORD);
  [unit] = (await createPhotoUnits({ slug: "vellmoor" })).unitIds;
});

afterAll(async () => {
  if (workerDown) await serviceControl("worker", "start");
});

async function killWorkerAndRestart(pause = 500) {
  await serviceControl("worker", "kill");
  workerDown = true;
  await new Promise((r) => setTimeout(r, pause));
  await serviceControl("worker", "start");
  workerDown = false;
}

/** Distinct 24 MP JPEGs: each takes the worker a second or more, so a kill lands mid-way. */
async function bigPhotos(count: number): Promise<Buffer[]> {
  const [width, height] = [6000, 4000];
  const raw = makePhotoLikeRaw(width, height, 7);
  return Promise.all(
    Array.from({ length: count }, (_, i) =>
      sharp(raw, { raw: { width, height, channels: 3 } })
        .composite([{ input: { create: { width: 80, height: 80, channels: 3, background: { r: 40 * i, g: 90, b: 200 } } }, left: 100 + 120 * i, top: 100 }])
        .jpeg({ quality: 90 })
        .toBuffer(),
    ),
  );
}

it("photos being processed when the worker is killed all end ready, each once, with exactly their objects", { timeout: 240_000 }, async () => {
  const files = await bigPhotos(6);
  const ids: string[] = [];
  for (const file of files) {
    const intent = await requestUpload(inspector, unit, { bytes: file.length });
    expect(await putToStore(intent.body, file)).toBe(200);
    const accepted = await finalise(inspector, unit, intent.body.ticket, { wait: false });
    expect(accepted.status).toBe(202);
    ids.push(accepted.body.photo.id);
  }
  // Killed as soon as the worker has photos in hand (read straight from the table: polling the
  // API could miss a photo that takes the worker only a few seconds).
  const processing = () =>
    db()
      .select({ id: photos.id })
      .from(photos)
      .where(and(eq(photos.unitId, unit), eq(photos.status, "processing")));
  const deadline = Date.now() + 60_000;
  while ((await processing()).length === 0) {
    if (Date.now() > deadline) throw new Error("the worker never started on the photos");
    await new Promise((r) => setTimeout(r, 20));
  }
  await serviceControl("worker", "kill");
  workerDown = true;
  // The kill really caught work in hand: photos left "processing" by a worker that is gone.
  const caught = await processing();
  expect(caught.length).toBeGreaterThan(0);
  await new Promise((r) => setTimeout(r, 500));
  await serviceControl("worker", "start");
  workerDown = false;

  for (const id of ids) await waitForPhoto(inspector, id, (p) => p.status === "ready" || p.status === "failed", 150_000);
  const rows = await photoRowsFor(unit);
  for (const row of rows) {
    if (row.status === "failed") expect(row.failureReason).toBeTruthy();
    else expect(row.status).toBe("ready");
  }
  expect(rows.filter((r) => r.status === "ready")).toHaveLength(6);
  // Made ready once each, although a photo may have been started twice.
  const readyEntries = await db()
    .select({ subjectId: activityLog.subjectId, n: sql<number>`count(*)::int` })
    .from(activityLog)
    .where(and(eq(activityLog.action, "photo.processed"), inArray(activityLog.subjectId, ids)))
    .groupBy(activityLog.subjectId);
  expect(readyEntries.map((e) => e.n)).toEqual([1, 1, 1, 1, 1, 1]);
  expect(rows.some((r) => r.attempts > 1)).toBe(true);
  // Exactly the objects the rows name: original, preview and thumbnail of each photo, nothing else.
  const named = rows
    .flatMap((r) => [r.originalKey, r.previewKey, r.thumbnailKey])
    .filter(Boolean)
    .sort();
  expect(await storedKeysFor(unit)).toEqual(named);
  expect(named).toHaveLength(18);
});

it("a measurement job cut off by a killed worker is run again by the next one and stored once", { timeout: 180_000 }, async () => {
  const owner = await workspaceIdOf("lead@vellmoor.example");
  const { unit: measured, photo } = await createMeasurableUnit(owner);
  // Enough work that the job is still running when the worker is killed (a few seconds, well
  // inside the job's expiry): four 12 MP photos, each with 15 wide scratch lines across it.
  const lines = (p: number): FixtureRegion[] =>
    Array.from({ length: 15 }, (_, i) => ({
      clientId: `line-${p}-${i}`,
      role: "defect",
      defect: "scratch",
      shape: {
        kind: "line",
        points: [
          [20, 20 + i * 190],
          [3980, 2980 - i * 190],
        ],
        width: 40,
      },
    }));
  await db().update(photos).set({ width: 4000, height: 3000 }).where(eq(photos.id, photo.id));
  await saveRegions({ workspaceId: owner.workspaceId, photoId: photo.id, authorId: owner.userId, regions: lines(0) });
  for (let p = 1; p < 4; p++) {
    const extra = await createPhoto({ workspaceId: owner.workspaceId, unitId: measured.id, uploadedBy: owner.userId, width: 4000, height: 3000 });
    await saveRegions({ workspaceId: owner.workspaceId, photoId: extra.id, authorId: owner.userId, regions: lines(p) });
  }
  const { jobId } = await enqueueMeasureUnit({ workspaceId: owner.workspaceId, unitId: measured.id, requestedBy: owner.userId });
  expect(jobId).toBeTruthy();
  const state = async () => (await db().execute<{ state: string; retry_count: number }>(sql`SELECT state, retry_count FROM pgboss.job WHERE id = ${jobId}`)).rows[0];
  const deadline = Date.now() + 30_000;
  while ((await state())?.state !== "active") {
    if (Date.now() > deadline) throw new Error("the measurement job never started");
    await new Promise((r) => setTimeout(r, 20));
  }
  await killWorkerAndRestart();
  expect((await state()).state).toBe("active");

  const until = Date.now() + 150_000;
  while ((await state()).state !== "completed") {
    if (Date.now() > until) throw new Error(`the measurement job did not complete: ${JSON.stringify(await state())}`);
    await new Promise((r) => setTimeout(r, 500));
  }
  expect((await state()).retry_count).toBeGreaterThan(0);
  const stored = await db()
    .select({ id: measurements.id })
    .from(measurements)
    .where(and(eq(measurements.unitId, measured.id), isNull(measurements.photoId)));
  expect(stored).toHaveLength(1);
});
