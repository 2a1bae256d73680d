/**
 * Bad input, counted: one table of distinct bad requests — wrong content types, cross-site
 * origins, broken and oversized bodies (also chunked), NaN / Infinity / huge geometry, 2 001
 * regions, 200 001 points, lines and spots far past their size caps, forged ids of another
 * workspace in paths and in bodies (grades and measuring included), wrong roles,
 * replayed and expired tokens, tampered and foreign session cookies, images that lie about their
 * type. Each must be answered 4xx with a sentence, and leave the database (row counts of every
 * table) and the object store (every key) exactly as they were. The count is in the test name.
 *
 * Not compared: rate_limit_counters, which a refused sign-in or reset request is meant to count.
 */
import { encode } from "next-auth/jwt";
import { sql } from "drizzle-orm";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { listObjects } from "@/lib/storage/s3";
import { createUser, TEST_PASSWORD, uniqueEmail, workspaceBySlug } from "../support/db";
import { api, BASE_URL, FILE_CLIENT_ADDRESS, signIn, trySignIn, type ApiResult, type Session } from "../support/http";
import { latestLinkTo, tokenFromLink } from "../support/inbox";
import { photoFixtureIds } from "../support/photo-access";
import { finalise, putToStore, requestUpload, testStore } from "../support/photos";
import { createMeasurableUnit, workspaceIdOf } from "../support/grading";
import { regionFixtureIds } from "../support/region-access";
import { lotFixtureIds } from "../support/lot-access";
import { waitForTrainingsToFinish } from "../support/suggestion-access";

type Ids = Record<string, string>;
let lead: Session, inspector: Session, auditor: Session, trainer: Session, signedOut: Session;
let own: Ids, foreign: Ids;
let usedToken: string, expiredToken: string;

async function supplierId(session: Session) {
  const res = await api<{ supplier: { id: string } }>(session, "POST", "/api/suppliers", { name: `Bad-input supplier ${Math.random()}`, contactEmail: "bad@supplier.example" });
  return res.body.supplier.id;
}

async function personId(session: Session) {
  const res = await api<{ people: { id: string; roles: string[] }[] }>(session, "GET", "/api/people");
  return res.body.people.find((p) => !p.roles.includes("lead"))!.id;
}

/** A measured unit (and, with `graded`, its accepted grade): its id, its measurement's and its grade's. */
async function gradingIds(session: Session, graded: boolean): Promise<Ids> {
  const { unit } = await createMeasurableUnit(await workspaceIdOf(session.email));
  const measured = await api<{ measurement: { id: string } }>(session, "POST", `/api/units/${unit.id}/measure`);
  if (measured.status !== 200) throw new Error(`Fixture measure failed: ${JSON.stringify(measured.body)}`);
  const ids: Ids = { gradeUnitId: unit.id, measurementId: measured.body.measurement.id };
  if (!graded) return ids;
  const grade = await api<{ grade: { id: string } }>(session, "POST", `/api/units/${unit.id}/grades`, { decision: "accept" });
  if (grade.status !== 201) throw new Error(`Fixture grade failed: ${JSON.stringify(grade.body)}`);
  return { ...ids, gradeId: grade.body.grade.id };
}

async function fixtures(session: Session, graded: boolean): Promise<Ids> {
  const supplier = await supplierId(session);
  return {
    supplierId: supplier,
    personId: await personId(session),
    ...(await regionFixtureIds(session)),
    ...(await photoFixtureIds(session)),
    ...(await lotFixtureIds(session, supplier)),
    ...(await gradingIds(session, graded)),
  };
}

beforeAll(async () => {
  [lead, inspector, auditor, trainer] = await Promise.all(["lead@vellmoor.example", "inspector@vellmoor.example", "auditor@vellmoor.example", "trainer@vellmoor.example"].map((e) => signIn(e)));
  own = await fixtures(lead, false);
  foreign = await fixtures(await signIn("lead@quillfen.example"), true);
  // A session that was signed out (its cookie copied before), and two spent links.
  const vellmoor = await workspaceBySlug("vellmoor");
  const leaver = await createUser({ workspaceId: vellmoor.id, roles: ["inspector"] });
  signedOut = (await trySignIn(leaver.email, TEST_PASSWORD)).session!;
  const csrf = await api<{ csrfToken: string }>(signedOut, "GET", "/api/auth/csrf");
  const cookie = [signedOut.cookie, ...csrf.headers.getSetCookie().map((c) => c.split(";")[0])].join("; ");
  await fetch(`${BASE_URL}/api/auth/signout`, {
    method: "POST",
    headers: { cookie, "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ csrfToken: csrf.body.csrfToken, json: "true" }),
  });
  const invitee = uniqueEmail("spent");
  await api(lead, "POST", "/api/people", { email: invitee, name: "Spent Link", roles: ["inspector"] });
  usedToken = tokenFromLink(await latestLinkTo(invitee));
  await api(null, "POST", "/api/password/set", { token: usedToken, password: "spent-link-password" });
  const expiring = uniqueEmail("expired");
  const created = await api<{ person: { id: string } }>(lead, "POST", "/api/people", { email: expiring, name: "Expired Link", roles: ["inspector"] });
  expiredToken = tokenFromLink(await latestLinkTo(expiring));
  await db().execute(sql`UPDATE auth_tokens SET expires_at = now() - interval '1 minute' WHERE user_id = ${created.body.person.id}`);
  // Row counts are compared around each case: a training another file asked for must be over first.
  await waitForTrainingsToFinish();
}, 480_000);

/** Row counts of every application table, and every key in the bucket. */
async function snapshot() {
  const { rows: tables } = await db().execute<{ table_name: string }>(
    sql`SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' AND table_name <> 'rate_limit_counters' ORDER BY 1`,
  );
  const counts: Record<string, number> = {};
  for (const { table_name } of tables) counts[table_name] = (await db().execute<{ n: number }>(sql.raw(`SELECT count(*)::int AS n FROM "${table_name}"`))).rows[0].n;
  const keys: string[] = [];
  for await (const o of listObjects(testStore(), "")) keys.push(o.key);
  return { counts, keys: keys.sort() };
}

const json = { "content-type": "application/json" };
const raw = (session: Session | null, method: string, path: string, body: string | undefined, headers: Record<string, string>) => api(session, method, path, body, headers);
const region = (shape: unknown) => ({ id: "bad-1", defect: "scratch", shape });
const regionsBody = (regions: unknown[], extra: Record<string, unknown> = {}) => ({ baseVersion: 0, regions: { regions, surfaces: [], ruler: null }, ...extra });

/** A JPEG of w × h. */
const jpeg = (w: number, h: number) =>
  sharp({ create: { width: w, height: h, channels: 3, background: { r: 120, g: 90, b: 60 } } })
    .jpeg()
    .toBuffer();

/** Uploads `bytes` (announced as `declared` bytes of image/jpeg) and finalises: the finalise answer. */
async function uploadAndFinalise(bytes: Buffer, declared = bytes.length): Promise<ApiResult> {
  const intent = await requestUpload(inspector, own.photoUnitId, { bytes: declared });
  if (intent.status !== 201) return intent;
  await putToStore(intent.body, bytes);
  return finalise(inspector, own.photoUnitId, intent.body.ticket);
}

/**
 * A chunked body (no Content-Length) of `bytes` bytes, streamed. It is answered before it is all
 * read; the next request over the same connection (the case after this one) used to hang on the
 * unread rest (scripts/serve.ts now reads it and throws it away).
 */
async function chunked(session: Session, path: string, bytes: number): Promise<ApiResult> {
  const chunk = new TextEncoder().encode(`{"name":"${"x".repeat(64 * 1024 - 20)}`);
  let sent = 0;
  const stream = new ReadableStream<Uint8Array>({
    pull(controller) {
      if (sent >= bytes) return controller.close();
      controller.enqueue(chunk);
      sent += chunk.length;
    },
  });
  const res = await fetch(`${BASE_URL}${path}`, { method: "POST", headers: { ...json, cookie: session.cookie, "x-forwarded-for": FILE_CLIENT_ADDRESS }, body: stream, duplex: "half" } as RequestInit);
  return { status: res.status, body: await res.json().catch(() => null), headers: res.headers };
}

type Case = [name: string, send: () => Promise<ApiResult>, status: number | number[]];

const CASES: Case[] = [
  // Cross-site writes and content types (proxy.ts).
  ["a form post (urlencoded) to create a supplier", () => raw(lead, "POST", "/api/suppliers", "name=Evil&contactEmail=e%40x.example", { "content-type": "application/x-www-form-urlencoded" }), 415],
  [
    "a multipart form post",
    () => raw(lead, "POST", "/api/suppliers", '--b\r\nContent-Disposition: form-data; name="name"\r\n\r\nEvil\r\n--b--', { "content-type": "multipart/form-data; boundary=b" }),
    415,
  ],
  ["a text/plain body with JSON in it", () => raw(lead, "POST", "/api/suppliers", JSON.stringify({ name: "Plain Evil", contactEmail: "e@x.example" }), { "content-type": "text/plain" }), 415],
  ["a body without a content type", () => raw(lead, "POST", "/api/people", JSON.stringify({ email: "nt@x.example", name: "N", roles: ["inspector"] }), { "content-type": "" }), 415],
  ["a JSON write from another site (Origin)", () => api(lead, "POST", "/api/suppliers", { name: "Cross Site", contactEmail: "c@x.example" }, { origin: "https://evil.example" }), 403],
  ["a JSON write marked cross-site by the browser", () => api(lead, "PATCH", `/api/people/${own.personId}`, { name: "Renamed Cross" }, { "sec-fetch-site": "cross-site" }), 403],
  ["a write from an opaque origin (Origin: null)", () => api(lead, "POST", "/api/suppliers", { name: "Null Origin", contactEmail: "n@x.example" }, { origin: "null" }), 403],
  ["a delete from a sibling site", () => api(inspector, "DELETE", `/api/photos/${own.photoId}`, undefined, { "sec-fetch-site": "same-site" }), 403],
  [
    "next-auth sign-out posted from another site",
    () => raw(lead, "POST", "/api/auth/signout", "csrfToken=x&json=true", { "content-type": "application/x-www-form-urlencoded", origin: "https://evil.example" }),
    403,
  ],
  // Broken and oversized bodies.
  ["a body that is not JSON", () => raw(lead, "POST", "/api/people", "{not json", json), 400],
  ["an empty body", () => raw(lead, "POST", "/api/suppliers", "", json), 400],
  ["a JSON array instead of an object", () => raw(lead, "POST", "/api/suppliers", "[1,2,3]", json), 400],
  ["JSON null", () => raw(lead, "POST", "/api/people", "null", json), 400],
  ["an unknown field", () => api(lead, "POST", "/api/suppliers", { name: "Extra Field", contactEmail: "x@x.example", workspaceId: foreign.supplierId }), 400],
  ["a body over 1 MB", () => api(lead, "POST", "/api/suppliers", { name: "x".repeat(1_100_000), contactEmail: "b@x.example" }), 413],
  ["a chunked body over 1 MB without Content-Length", () => chunked(lead, "/api/suppliers", 2 * 1024 * 1024), 413],
  ["JSON nested 100 000 deep", () => raw(lead, "POST", "/api/suppliers", "[".repeat(100_000) + "]".repeat(100_000), json), 400],
  // Geometry.
  ['a coordinate that is a string "NaN"', () => api(inspector, "PUT", `/api/photos/${own.regionPhotoId}/regions`, regionsBody([region({ kind: "rect", x: "NaN", y: 1, width: 5, height: 5 })])), 400],
  [
    "an Infinity coordinate (1e999)",
    () =>
      raw(
        inspector,
        "PUT",
        `/api/photos/${own.regionPhotoId}/regions`,
        '{"baseVersion":0,"regions":{"regions":[{"id":"i","defect":"scratch","shape":{"kind":"spot","x":1e999,"y":5,"radius":2}}],"surfaces":[],"ruler":null}}',
        json,
      ),
    400,
  ],
  ["a huge coordinate (1e300)", () => api(inspector, "PUT", `/api/photos/${own.regionPhotoId}/regions`, regionsBody([region({ kind: "rect", x: 1e300, y: 1, width: 5, height: 5 })])), 400],
  ["a box with negative width", () => api(inspector, "PUT", `/api/photos/${own.regionPhotoId}/regions`, regionsBody([region({ kind: "rect", x: 10, y: 10, width: -5, height: 5 })])), 400],
  [
    "an outline of two points",
    () =>
      api(
        inspector,
        "PUT",
        `/api/photos/${own.regionPhotoId}/regions`,
        regionsBody([
          region({
            kind: "polygon",
            points: [
              [1, 1],
              [5, 5],
            ],
          }),
        ]),
      ),
    400,
  ],
  [
    "a line of width 0",
    () =>
      api(
        inspector,
        "PUT",
        `/api/photos/${own.regionPhotoId}/regions`,
        regionsBody([
          region({
            kind: "line",
            points: [
              [1, 1],
              [20, 20],
            ],
            width: 0,
          }),
        ]),
      ),
    400,
  ],
  ["a spot with a negative radius", () => api(inspector, "PUT", `/api/photos/${own.regionPhotoId}/regions`, regionsBody([region({ kind: "spot", x: 10, y: 10, radius: -3 })])), 400],
  ["an unknown shape kind", () => api(inspector, "PUT", `/api/photos/${own.regionPhotoId}/regions`, regionsBody([region({ kind: "star", x: 10, y: 10 })])), 400],
  [
    "a defect class the part type does not have",
    () => api(inspector, "PUT", `/api/photos/${own.regionPhotoId}/regions`, regionsBody([{ id: "k", defect: "explosion", shape: { kind: "rect", x: 1, y: 1, width: 5, height: 5 } }])),
    400,
  ],
  [
    "2 001 regions",
    () =>
      api(
        inspector,
        "PUT",
        `/api/photos/${own.regionPhotoId}/regions`,
        regionsBody(Array.from({ length: 2001 }, (_, i) => ({ id: `r${i}`, defect: "scratch", shape: { kind: "spot", x: 10, y: 10, radius: 1 } }))),
      ),
    400,
  ],
  // The fixture photo is 120 × 90 px: Lines may be 16 px wide and Spots 16 px in radius there (lib/geometry/limits.ts).
  [
    "a line 4 000 px wide",
    () =>
      api(
        inspector,
        "PUT",
        `/api/photos/${own.regionPhotoId}/regions`,
        regionsBody([
          region({
            kind: "line",
            points: [
              [10, 10],
              [100, 80],
            ],
            width: 4000,
          }),
        ]),
      ),
    400,
  ],
  [
    "a line just past its width cap (17 px)",
    () =>
      api(
        inspector,
        "PUT",
        `/api/photos/${own.regionPhotoId}/regions`,
        regionsBody([
          region({
            kind: "line",
            points: [
              [10, 10],
              [100, 80],
            ],
            width: 17,
          }),
        ]),
      ),
    400,
  ],
  ["a spot of radius 4 000 px", () => api(inspector, "PUT", `/api/photos/${own.regionPhotoId}/regions`, regionsBody([region({ kind: "spot", x: 60, y: 45, radius: 4000 })])), 400],
  [
    "an outline of 200 001 points",
    () =>
      api(
        inspector,
        "PUT",
        `/api/photos/${own.regionPhotoId}/regions`,
        regionsBody([region({ kind: "polygon", points: Array.from({ length: 200_001 }, (_, i) => [i % 60, Math.floor(i / 60) % 40]) })]),
      ),
    [400, 413],
  ],
  [
    "two regions with one id",
    () => api(inspector, "PUT", `/api/photos/${own.regionPhotoId}/regions`, regionsBody([region({ kind: "spot", x: 10, y: 10, radius: 1 }), region({ kind: "spot", x: 20, y: 20, radius: 1 })])),
    400,
  ],
  ["a negative base version", () => api(inspector, "PUT", `/api/photos/${own.regionPhotoId}/regions`, regionsBody([], { baseVersion: -1 })), 400],
  [
    "a ruler of length 0 mm",
    () => api(inspector, "PUT", `/api/photos/${own.regionPhotoId}/regions`, { baseVersion: 0, regions: { regions: [], surfaces: [], ruler: { id: "r", a: [1, 1], b: [50, 1], lengthMm: 0 } } }),
    400,
  ],
  // Another workspace's ids, in paths and in bodies (answered as if they did not exist).
  ["another workspace's photo (read)", () => api(lead, "GET", `/api/photos/${foreign.photoId}`), 404],
  ["another workspace's photo's regions (write)", () => api(inspector, "PUT", `/api/photos/${foreign.regionPhotoId}/regions`, regionsBody([])), 404],
  [
    "an upload to another workspace's unit",
    () => api(inspector, "POST", `/api/units/${foreign.photoUnitId}/photos/uploads`, { viewKey: "front", fileName: "x.jpg", contentType: "image/jpeg", bytes: 100 }),
    404,
  ],
  ["renaming another workspace's person", () => api(lead, "PATCH", `/api/people/${foreign.personId}`, { name: "Hijacked" }), 404],
  ["editing another workspace's supplier", () => api(lead, "PATCH", `/api/suppliers/${foreign.supplierId}`, { notes: "hijacked" }), 404],
  [
    "a lot naming another workspace's supplier (in the body)",
    () =>
      api(lead, "POST", "/api/lots", {
        supplierId: foreign.supplierId,
        partTypeId: own.lotPartTypeId,
        purchaseRef: "PO-BAD-1",
        quantity: 10,
        receivedOn: "2026-11-20",
        dueOn: "2026-11-25",
        inspectionLevel: "II",
        aqlCritical: null,
        aqlMajor: 1,
        aqlMinor: 2.5,
      }),
    [400, 404],
  ],
  [
    "a lot naming another workspace's part type (in the body)",
    () =>
      api(lead, "POST", "/api/lots", {
        supplierId: own.supplierId,
        partTypeId: foreign.lotPartTypeId,
        purchaseRef: "PO-BAD-2",
        quantity: 10,
        receivedOn: "2026-11-20",
        dueOn: "2026-11-25",
        inspectionLevel: "II",
        aqlCritical: null,
        aqlMajor: 1,
        aqlMinor: 2.5,
      }),
    [400, 404],
  ],
  ["reassigning a unit to another workspace's person (in the body)", () => api(lead, "POST", `/api/units/${own.benchUnitId}/lease/reassign`, { userId: foreign.personId }), [400, 404, 409]],
  [
    "another workspace's inspection scheme (in the body)",
    () => api(lead, "PUT", "/api/inspection-schemes", { supplierId: foreign.supplierId, partTypeId: own.lotPartTypeId, steadyProduction: true }),
    [400, 404],
  ],
  ["grading another workspace's unit", () => api(lead, "POST", `/api/units/${foreign.gradeUnitId}/grades`, { decision: "accept" }), 404],
  ["measuring another workspace's unit", () => api(lead, "POST", `/api/units/${foreign.gradeUnitId}/measure`), 404],
  ["a grade naming another workspace's measurement (in the body)", () => api(lead, "POST", `/api/units/${own.gradeUnitId}/grades`, { decision: "accept", measurementId: foreign.measurementId }), 404],
  [
    "an override naming another workspace's grade as the one it replaces (in the body)",
    () => api(lead, "POST", `/api/units/${own.gradeUnitId}/grades`, { decision: "override", finalGrade: "C", reason: "Forged current grade", expectedCurrentGradeId: foreign.gradeId }),
    409,
  ],
  ["another workspace's unit id in a measure request's body", () => api(lead, "POST", `/api/units/${own.gradeUnitId}/measure`, { mode: "auto", unitId: foreign.gradeUnitId }), 400],
  ["a malformed id in the path", () => api(lead, "GET", "/api/photos/not-a-uuid"), 404],
  // Wrong roles.
  ["an inspector creating a supplier", () => api(inspector, "POST", "/api/suppliers", { name: "Inspector Supplier", contactEmail: "i@x.example" }), 403],
  ["an auditor saving regions", () => api(auditor, "PUT", `/api/photos/${own.regionPhotoId}/regions`, regionsBody([])), 403],
  [
    "a trainer receiving a lot",
    () =>
      api(trainer, "POST", "/api/lots", {
        supplierId: own.supplierId,
        partTypeId: own.lotPartTypeId,
        purchaseRef: "PO-BAD-3",
        quantity: 10,
        receivedOn: "2026-11-20",
        dueOn: "2026-11-25",
        inspectionLevel: "II",
        aqlCritical: null,
        aqlMajor: 1,
        aqlMinor: 2.5,
      }),
    403,
  ],
  ["an inspector inviting people", () => api(inspector, "POST", "/api/people", { email: uniqueEmail("nope"), name: "Nope", roles: ["lead"] }), 403],
  ["an auditor uploading a photo", () => api(auditor, "POST", `/api/units/${own.photoUnitId}/photos/uploads`, { viewKey: "front", fileName: "a.jpg", contentType: "image/jpeg", bytes: 100 }), 403],
  // Tokens and sessions.
  ["a set-password link used before", () => api(null, "POST", "/api/password/set", { token: usedToken, password: "replayed-password" }), 400],
  ["an expired set-password link", () => api(null, "POST", "/api/password/set", { token: expiredToken, password: "expired-password" }), 400],
  ["an upload ticket with a forged signature", () => api(inspector, "POST", `/api/units/${own.photoUnitId}/photos`, { ticket: `${Buffer.from("{}").toString("base64url")}.${"A".repeat(43)}` }), 400],
  [
    "an upload ticket of another unit",
    async () => {
      const intent = await requestUpload(inspector, own.photoUnitId, { bytes: 100 });
      return api(inspector, "POST", `/api/units/${own.benchUnitId}/photos`, { ticket: intent.body.ticket });
    },
    [400, 404],
  ],
  [
    "a session cookie with one character changed",
    () => api({ ...lead, cookie: lead.cookie.replace(/(session-token=[^;]{40})(.)/, (_, a: string, c: string) => a + (c === "A" ? "B" : "A")) }, "GET", "/api/me"),
    401,
  ],
  [
    "a session cookie made with another secret",
    async () => {
      const forged = await encode({ token: { sub: own.personId, workspaceId: "x", roles: ["lead"], tokenVersion: 0 }, secret: "not-the-server-secret-0123456789abcdef", maxAge: 3600 });
      return api({ cookie: `next-auth.session-token=${forged}`, email: "forged" }, "POST", "/api/suppliers", { name: "Forged Session", contactEmail: "f@x.example" });
    },
    401,
  ],
  ["a session that was signed out", () => api(signedOut, "POST", "/api/suppliers", { name: "Signed Out", contactEmail: "s@x.example" }), 401],
  ["no session at all", () => api(null, "POST", "/api/suppliers", { name: "Anonymous", contactEmail: "a@x.example" }), 401],
  // Photos that lie (finalise refuses before any row; the staged object is removed).
  ["an upload announced as 41 MB", () => requestUpload(inspector, own.photoUnitId, { bytes: 41 * 1024 * 1024 }), 413],
  ["an upload announced as an SVG", () => requestUpload(inspector, own.photoUnitId, { bytes: 500, contentType: "image/svg+xml" }), 415],
  ["an upload of -1 bytes", () => requestUpload(inspector, own.photoUnitId, { bytes: -1 }), 400],
  ["an upload for a view the part type lacks", () => requestUpload(inspector, own.photoUnitId, { bytes: 500, viewKey: "underside" }), 400],
  ["a PDF sent as image/jpeg", () => uploadAndFinalise(Buffer.from("%PDF-1.7\n%\u00e2\u00e3\n1 0 obj\n<<>>\nendobj\n")), 415],
  ["a GIF sent as image/jpeg", () => uploadAndFinalise(Buffer.from("GIF89a\u0001\u0000\u0001\u0000\u0000\u0000\u0000;")), 415],
  ["an HTML page sent as image/jpeg", () => uploadAndFinalise(Buffer.from("<!doctype html><script>alert(1)</script>")), 415],
  ["an empty file announced as 2 KB", () => uploadAndFinalise(Buffer.alloc(0), 2048), 400],
  ["more bytes than the upload announced", async () => uploadAndFinalise(await jpeg(64, 48), 100), 422],
  // Other refusals.
  ["forgot-password with no e-mail", () => api(null, "POST", "/api/password/forgot", { email: "" }), 400],
  ["sign-up with a password field", () => api(null, "POST", "/api/signup", { companyName: "Pw Works", name: "P", email: uniqueEmail("pw"), password: "long-enough-pass" }), 400],
  ["take-next with an unknown filter", () => api(inspector, "POST", "/api/queue/next", { colour: "red" }), 400],
  [
    "a lot of quantity 0",
    () =>
      api(lead, "POST", "/api/lots", {
        supplierId: own.supplierId,
        partTypeId: own.lotPartTypeId,
        purchaseRef: "PO-BAD-4",
        quantity: 0,
        receivedOn: "2026-11-20",
        dueOn: "2026-11-25",
        inspectionLevel: "II",
        aqlCritical: null,
        aqlMajor: 1,
        aqlMinor: 2.5,
      }),
    400,
  ],
  ["a part type without views", () => api(lead, "POST", "/api/part-types", { name: "Viewless", category: "other", views: [], defectClasses: [], checklist: [] }), 400],
  ["a checklist result of the wrong type", () => api(inspector, "POST", `/api/units/${own.benchUnitId}/checklist`, { itemId: "power", value: { pass: "yes" } }), 400],
];

describe(`${CASES.length} distinct bad inputs: each answered 4xx with a sentence, nothing changed in the database or the object store`, () => {
  it("has at least 60 distinct cases", () => {
    expect(new Set(CASES.map(([name]) => name)).size).toBe(CASES.length);
    expect(CASES.length).toBeGreaterThanOrEqual(60);
    console.log(`bad-input.test.ts: ${CASES.length} distinct bad inputs`);
  });

  it.each(CASES)("%s", async (_name, send, status) => {
    const before = await snapshot();
    const res = await send();
    expect([status].flat(), JSON.stringify(res.body)?.slice(0, 400)).toContain(res.status);
    const message = (res.body as { error?: { message?: string } } | null)?.error?.message ?? "";
    // A sentence: capitalised words, not a bare code or an empty body.
    expect(message, "a sentence a person can act on").toMatch(/^[A-Z“"]\S*( \S+){3,}/);
    expect(await snapshot()).toEqual(before);
  });
});
