/**
 * The object store goes down in the middle of a run and comes back: the person gets a clear 503
 * while it is down, the job it interrupted is retried with backoff, finalises retried with their
 * tickets succeed, and afterwards every photo is ready with its original intact. The test s3rver
 * is stopped (open connections cut) and restarted on the same port and folder by scripts/test.ts.
 */
import { createHash } from "node:crypto";
import sharp from "sharp";
import { afterAll, beforeAll, expect, it } from "vitest";
import { signIn, type Session } from "../support/http";
import { createUser, TEST_PASSWORD, uniqueEmail, workspaceBySlug } from "../support/db";
import { makePhotoLikeRaw } from "@/support/fixtures/make-photos";
import {
  createPhotoUnits,
  fetchBytes,
  finalise,
  objectStoreControl,
  photoRowsFor,
  putToStore,
  requestUpload,
  storedKeysFor,
  uploadPhoto,
  waitForPhoto,
  type IntentBody,
  type PhotoJson,
} from "../support/photos";

const sha256 = (bytes: Buffer) => createHash("sha256").update(bytes).digest("hex");
let inspector: Session;
let unit: string;
let storeDown = false;

/**
 * Distinct 12 MP JPEGs (one photo-like scene, a different marker square in each), and last a
 * 37 MP one: processing it takes the worker seconds, so stopping the store while its status says
 * "processing" surely catches it in the middle.
 */
async function photos(count: number): Promise<Buffer[]> {
  const [width, height] = [4000, 3000];
  const raw = makePhotoLikeRaw(width, height, 99);
  const marked = (i: number) =>
    sharp(raw, { raw: { width, height, channels: 3 } }).composite([
      { input: { create: { width: 40, height: 40, channels: 3, background: { r: 15 * i, g: 200, b: 255 - 15 * i } } }, left: 40 + 60 * i, top: 40 },
    ]);
  const files = await Promise.all(Array.from({ length: count - 1 }, (_, i) => marked(i).jpeg({ quality: 90 }).toBuffer()));
  const big = await sharp(await marked(count).png({ compressionLevel: 0 }).toBuffer())
    .resize(7000, 5250)
    .jpeg({ quality: 92 })
    .toBuffer();
  return [...files, big];
}

beforeAll(async () => {
  const vellmoor = await workspaceBySlug("vellmoor");
  inspector = await signIn((await createUser({ workspaceId: vellmoor.id, roles: ["inspector"], email: uniqueEmail("photo-outage") })).email, TEST_PASSWORD);
  [unit] = (await createPhotoUnits({ slug: "vellmoor" })).unitIds;
});

afterAll(async () => {
  // Never leave the store down for the tests that follow.
  if (storeDown) await objectStoreControl("start");
});

it("stopping the object store mid-run, then restarting it, loses nothing", { timeout: 180_000 }, async () => {
  // 2 photos before the outage, 10 finalised while it lasts, and a big one being processed when it starts.
  const files = await photos(13);
  const [before, during, big] = [files.slice(0, 2), files.slice(2, 12), files[12]];
  const ready: PhotoJson[] = [];
  for (const file of before) {
    const { finalise: done } = await uploadPhoto(inspector, unit, file);
    expect(done?.status).toBe(201);
    ready.push(done!.body.photo);
  }
  const staged: IntentBody[] = [];
  for (const file of [...during, big]) {
    const intent = await requestUpload(inspector, unit, { bytes: file.length });
    expect(await putToStore(intent.body, file)).toBe(200);
    staged.push(intent.body);
  }
  const bigIntent = staged.pop()!;

  // The store goes down while the worker is busy with the big photo.
  const bigAccepted = await finalise(inspector, unit, bigIntent.ticket, { wait: false });
  expect(bigAccepted.status).toBe(202);
  await waitForPhoto(inspector, bigAccepted.body.photo.id, (p) => p.status === "processing", 20_000);
  await objectStoreControl("stop");
  storeDown = true;

  const intentDown = await requestUpload(inspector, unit, { bytes: 1000 });
  expect(intentDown.status).toBe(503);
  expect(intentDown.body.error?.message).toMatch(/photo store is not reachable/);
  for (const intent of staged) {
    const res = await finalise(inspector, unit, intent.ticket);
    expect(res.status).toBe(503);
    expect(res.body.error?.message).toMatch(/photo store is not reachable/);
  }
  expect((await photoRowsFor(unit)).map((r) => r.id).sort()).toEqual([...ready.map((p) => p.id), bigAccepted.body.photo.id].sort());
  expect((await fetchBytes(inspector, ready[0].urls!.thumbnail)).status).toBe(503);
  // The interrupted job goes back to the queue with a note, to be retried with backoff.
  const waiting = await waitForPhoto(inspector, bigAccepted.body.photo.id, (p) => /photo store is not reachable/.test(p.retryNote ?? ""), 20_000);
  expect(waiting.status).not.toBe("failed");

  await objectStoreControl("start");
  storeDown = false;

  // Each finalise refused during the outage succeeds when retried with the same ticket.
  for (const intent of staged) {
    const retried = await finalise(inspector, unit, intent.ticket);
    expect([201, 202], JSON.stringify(retried.body)).toContain(retried.status);
  }
  for (const row of await photoRowsFor(unit)) await waitForPhoto(inspector, row.id, (p) => p.status === "ready", 90_000);

  // Nothing lost: thirteen ready photos, each original byte for byte, each with its derivatives.
  const rows = await photoRowsFor(unit);
  expect(rows).toHaveLength(13);
  expect(rows.every((r) => r.status === "ready")).toBe(true);
  expect(new Set(rows.map((r) => r.sha256))).toEqual(new Set(files.map(sha256)));
  for (const row of rows) {
    const original = await fetchBytes(inspector, `/api/photos/${row.id}/original`);
    expect(sha256(original.bytes)).toBe(row.sha256);
    expect((await fetchBytes(inspector, `/api/photos/${row.id}/thumbnail`)).status).toBe(200);
  }
  // Three objects per photo and no staging leftovers.
  expect(await storedKeysFor(unit)).toHaveLength(39);
  // The outage really hit processing: the big photo needed another attempt.
  expect(rows.find((r) => r.id === bigAccepted.body.photo.id)!.attempts).toBeGreaterThan(1);
});
