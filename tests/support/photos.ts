/**
 * Photo-intake test helpers: units to photograph (direct rows, like tests/support/lot-fixtures.ts),
 * the browser's three upload steps over HTTP against the test server, and a look into the test
 * bucket and the photos table to prove what was (and was not) stored. No mocks: the same
 * PostgreSQL and s3rver the app uses.
 */
import crypto from "node:crypto";
import { asc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { lots, partTypes, photos, suppliers, units, users, workspaces, type StoredSamplingPlan } from "@/db/schema";
import { createObjectStore, listObjects } from "@/lib/storage/s3";
import { serviceControl } from "./services";
import { api, BASE_URL, type ApiResult, type Session } from "./http";
import type { ViewDefinition } from "@/lib/part-types/schemas";

export const PHOTO_VIEWS: ViewDefinition[] = [
  { key: "front", label: "Front", required: true, zones: [] },
  { key: "back", label: "Back", required: true, zones: [] },
  { key: "connector", label: "Connector", required: false, zones: [] },
];

const tag = () => crypto.randomBytes(4).toString("hex");

const PLAN: StoredSamplingPlan = {
  standard: "ISO 2859-1 single sampling",
  lotSize: 5,
  level: "II",
  severity: "normal",
  sampleSize: 5,
  hundredPercent: true,
  byDefectSeverity: {
    critical: { aql: null, codeLetter: "A", planLetter: "A", sampleSize: 5, accept: 0, reject: 1 },
    major: { aql: 1, codeLetter: "A", planLetter: "A", sampleSize: 5, accept: 0, reject: 1 },
    minor: { aql: 2.5, codeLetter: "A", planLetter: "A", sampleSize: 5, accept: 0, reject: 1 },
  },
  switchingReason: "photo test fixture",
};

/** A part type with PHOTO_VIEWS, a lot and `count` units on the bench, in the workspace with this slug (or id). */
export async function createPhotoUnits(
  workspace: { slug: string } | { id: string },
  { count = 1, status = "on_bench" as (typeof units.$inferInsert)["status"], views = PHOTO_VIEWS, category = "camera" } = {},
) {
  const [ws] = await db()
    .select()
    .from(workspaces)
    .where("slug" in workspace ? eq(workspaces.slug, workspace.slug) : eq(workspaces.id, workspace.id));
  if (!ws) throw new Error(`No workspace ${JSON.stringify(workspace)}; was the demo seed run?`);
  const [lead] = await db().select({ id: users.id }).from(users).where(eq(users.workspaceId, ws.id)).orderBy(asc(users.email)).limit(1);
  const t = tag();
  const [partType] = await db()
    .insert(partTypes)
    .values({
      workspaceId: ws.id,
      slug: `photo-fixture-${t}`,
      name: `Photo fixture ${category} ${t}`,
      category,
      views,
      defectClasses: [{ key: "scratch", label: "Scratch", severity: "minor" }],
      checklist: [],
    })
    .returning();
  const [supplier] = await db()
    .insert(suppliers)
    .values({ workspaceId: ws.id, name: `Photo fixture supplier ${t}`, contactEmail: "photos@supplier.example" })
    .returning();
  const [lot] = await db()
    .insert(lots)
    .values({
      workspaceId: ws.id,
      supplierId: supplier.id,
      partTypeId: partType.id,
      purchaseRef: `PO-PHOTO-${t}`,
      quantity: count,
      receivedOn: "2026-11-30",
      dueOn: "2099-12-31",
      inspectionLevel: "II",
      aqlCritical: null,
      aqlMajor: 1,
      aqlMinor: 2.5,
      inspectionSeverity: "normal",
      plan: PLAN,
      createdBy: lead.id,
    })
    .returning();
  const rows = await db()
    .insert(units)
    .values(
      Array.from({ length: count }, (_, i) => ({
        workspaceId: ws.id,
        lotId: lot.id,
        sampleIndex: i + 1,
        serial: `PH-${t}-${i + 1}`,
        status,
        partTypeId: partType.id,
        supplierId: supplier.id,
        lotDueOn: lot.dueOn,
        lotReceivedOn: lot.receivedOn,
        lotCreatedAt: lot.createdAt,
      })),
    )
    .returning({ id: units.id });
  return { workspaceId: ws.id, partTypeId: partType.id, lotId: lot.id, unitIds: rows.map((r) => r.id) };
}

export type IntentBody = { photoId: string; ticket: string; upload: { method: string; url: string; headers: Record<string, string> } };
type ErrorBody = { error: { code: string; message: string } };
export type FinaliseBody = { photo: PhotoJson; outcome: string } & Partial<ErrorBody>;
export type PhotoJson = {
  id: string;
  status: string;
  viewKey: string;
  width: number | null;
  height: number | null;
  format: string | null;
  sha256: string;
  bytes: number;
  orientation: number | null;
  preview: { width: number; height: number } | null;
  thumbnail: { width: number; height: number } | null;
  failure: { code: string; reason: string } | null;
  retryNote: string | null;
  possibleReuse: { photoId: string; unitId: string; unitLabel: string } | null;
  captureTime: string | null;
  urls: { thumbnail: string; preview: string; original: string } | null;
};

export async function requestUpload(session: Session, unitId: string, file: { bytes: number; viewKey?: string; fileName?: string; contentType?: string }) {
  return api<IntentBody & Partial<ErrorBody>>(session, "POST", `/api/units/${unitId}/photos/uploads`, {
    viewKey: file.viewKey ?? "front",
    fileName: file.fileName ?? "photo.jpg",
    contentType: file.contentType ?? "image/jpeg",
    bytes: file.bytes,
  });
}

/** The browser's PUT to the presigned URL. */
export async function putToStore(intent: IntentBody, bytes: Buffer): Promise<number> {
  const res = await fetch(intent.upload.url, { method: "PUT", headers: intent.upload.headers, body: new Uint8Array(bytes) });
  await res.arrayBuffer();
  return res.status;
}

export async function finalise(session: Session, unitId: string, ticket: string, { wait = true } = {}) {
  return api<FinaliseBody>(session, "POST", `/api/units/${unitId}/photos${wait ? "" : "?wait=0"}`, { ticket });
}

/** All three steps; `declaredBytes` lets a test lie about the size, as a hostile client could. */
export async function uploadPhoto(
  session: Session,
  unitId: string,
  bytes: Buffer,
  options: { viewKey?: string; fileName?: string; contentType?: string; declaredBytes?: number; wait?: boolean } = {},
): Promise<{ intent: ApiResult<IntentBody & Partial<ErrorBody>>; finalise: ApiResult<FinaliseBody> | null }> {
  const intent = await requestUpload(session, unitId, { ...options, bytes: options.declaredBytes ?? bytes.length });
  if (intent.status !== 201) return { intent, finalise: null };
  const put = await putToStore(intent.body, bytes);
  if (put !== 200) throw new Error(`PUT to the store answered ${put}`);
  return { intent, finalise: await finalise(session, unitId, intent.body.ticket, { wait: options.wait }) };
}

export function testStore() {
  return createObjectStore({
    endpoint: process.env.S3_ENDPOINT,
    region: process.env.S3_REGION ?? "us-east-1",
    bucket: process.env.S3_BUCKET ?? "partproof-test",
    accessKeyId: process.env.S3_ACCESS_KEY_ID ?? "S3RVER",
    secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? "S3RVER",
    forcePathStyle: true,
  });
}

/** Every object in the bucket that belongs to this unit (staging and accepted). */
export async function storedKeysFor(unitId: string): Promise<string[]> {
  const store = testStore();
  const keys: string[] = [];
  for (const prefix of ["uploads/", "photos/"]) for await (const o of listObjects(store, prefix)) if (o.key.includes(`/${unitId}/`)) keys.push(o.key);
  return keys.sort();
}

export async function photoRowsFor(unitId: string) {
  return db().select().from(photos).where(eq(photos.unitId, unitId)).orderBy(asc(photos.createdAt));
}

/** Takes the test object store down or brings it back (scripts/test.ts runs the control endpoint). */
export async function objectStoreControl(action: "stop" | "start") {
  await serviceControl("s3", action);
}

export async function waitForPhoto(session: Session, photoId: string, done: (p: PhotoJson) => boolean, timeoutMs = 45_000): Promise<PhotoJson> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await api<{ photo: PhotoJson }>(session, "GET", `/api/photos/${photoId}`);
    if (res.status === 200 && done(res.body.photo)) return res.body.photo;
    if (Date.now() > deadline) throw new Error(`photo ${photoId} did not settle: ${JSON.stringify(res.body)}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** GET with the session cookie, bytes and headers (for images; follows the original's redirect). */
export async function fetchBytes(session: Session, path: string, { follow = true } = {}) {
  const res = await fetch(`${BASE_URL}${path}`, { headers: { cookie: session.cookie }, redirect: follow ? "follow" : "manual" });
  return { status: res.status, headers: res.headers, bytes: Buffer.from(await res.arrayBuffer()) };
}
