/**
 * Upload intents are limited per person and minute (issue 14, item 10): each hands out a
 * presigned URL that may store up to 40 MB, so one account cannot line up an unbounded amount
 * of storage. The limit (PHOTO_UPLOAD_INTENTS_PER_MINUTE, 60 by default) is counted in
 * PostgreSQL, so it holds across web instances; another person is not affected.
 */
import { beforeAll, expect, it } from "vitest";
import { createUser, TEST_PASSWORD, uniqueEmail, workspaceBySlug } from "../support/db";
import { signIn, type Session } from "../support/http";
import { createPhotoUnits, requestUpload } from "../support/photos";

let eager: Session, other: Session;
let unitId: string;

beforeAll(async () => {
  const vellmoor = await workspaceBySlug("vellmoor");
  const [a, b] = await Promise.all(["eager-uploader", "calm-uploader"].map((p) => createUser({ workspaceId: vellmoor.id, roles: ["inspector"], email: uniqueEmail(p) })));
  [eager, other] = await Promise.all([signIn(a.email, TEST_PASSWORD), signIn(b.email, TEST_PASSWORD)]);
  [unitId] = (await createPhotoUnits({ slug: "vellmoor" })).unitIds;
});

it("allows 60 upload intents per person a minute, then answers 429 with a sentence; others carry on", async () => {
  const statuses: number[] = [];
  // Ten at a time, as a batch of photos picked at once would come in.
  for (let batch = 0; batch < 6; batch++) {
    const answers = await Promise.all(Array.from({ length: 10 }, (_, i) => requestUpload(eager, unitId, { bytes: 1000 + batch * 10 + i })));
    statuses.push(...answers.map((a) => a.status));
  }
  expect(statuses.filter((s) => s === 201)).toHaveLength(60);
  const refused = await requestUpload(eager, unitId, { bytes: 999 });
  expect(refused.status).toBe(429);
  expect(refused.body.error?.message).toMatch(/too many uploads in the last minute\. Wait \d+ seconds?/);
  expect(Number(refused.headers.get("retry-after"))).toBeGreaterThan(0);
  expect(Number(refused.headers.get("retry-after"))).toBeLessThanOrEqual(60);
  expect((await requestUpload(other, unitId, { bytes: 999 })).status).toBe(201);
});
