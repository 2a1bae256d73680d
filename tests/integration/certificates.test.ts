/**
 * Condition certificates over HTTP against the test server and its PostgreSQL (no mocks): issue
 * for a graded unit, the PDF's text read back (pdf.js) against the database, the public
 * verification page signed out by signed token and by short code, tampered and expired tokens
 * refused with a plain sentence, revocation. The stored hash is recomputed here with the
 * `canonicalize` package (RFC 8785 JSON Canonicalization, a reference implementation from the
 * registry) and node:crypto's SHA-256, independent of the app's code path.
 */
import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { certificates } from "@/db/schema";
import { signPublicLink } from "@/lib/reports/public-links";
import { putObject } from "@/lib/storage/s3";
import sharp from "sharp";
import { createPhoto, insertRubricVersion, saveRegions, workspaceIdOf } from "../support/grading";
import { SCRATCH, SURFACE } from "../support/evidence";
import { api, BASE_URL, ok, signIn, type Session } from "../support/http";
import { flatText, pdfText } from "../support/pdf-text";
import { testStore } from "../support/photos";

let lead: Session;
let inspector: Session;
let foreignLead: Session;
let owner: { workspaceId: string; userId: string };
const tag = Date.now().toString(36);
let unitIds: string[] = [];

/** A public page as a signed-out visitor sees it. */
async function publicPage(path: string) {
  const res = await fetch(`${BASE_URL}${path}`, { redirect: "manual" });
  return { status: res.status, html: await res.text() };
}

beforeAll(async () => {
  lead = await signIn("lead@vellmoor.example");
  inspector = await signIn("inspector@vellmoor.example");
  foreignLead = await signIn("lead@quillfen.example");
  owner = await workspaceIdOf("lead@vellmoor.example");
  const { partType } = await ok(
    api<{ partType: { id: string } }>(lead, "POST", "/api/part-types", {
      name: `Certificate part ${tag}`,
      category: "housing",
      modelFamily: "Orvane K-series",
      views: [{ key: "back", label: "Back", required: true, zones: [] }],
      defectClasses: [{ key: "scratch", label: "Scratch", severity: "major" }],
      checklist: [{ id: "power", label: "Powers on", kind: "pass_fail", severityOnFail: "major" }],
      nominalSizeMm: { width: 20, height: 10 },
    }),
    "part type",
    201,
  );
  await insertRubricVersion({
    workspaceId: owner.workspaceId,
    partTypeId: partType.id,
    version: 1,
    status: "published",
    rubric: { rules: [{ id: "scratch-b", metric: "share", defect: "scratch", comparison: ">", threshold: 1, grade: "B" }] },
    actorId: owner.userId,
  });
  const { supplier } = await ok(api<{ supplier: { id: string } }>(lead, "POST", "/api/suppliers", { name: `Certificate Supplier ${tag}`, contactEmail: "cert@supplier.example" }), "supplier", 201);
  const { lot } = await ok(
    api<{ lot: { id: string } }>(lead, "POST", "/api/lots", {
      supplierId: supplier.id,
      partTypeId: partType.id,
      purchaseRef: `PO-CERT-${tag}`,
      quantity: 10,
      receivedOn: "2026-11-20",
      dueOn: "2026-11-27",
      inspectionLevel: "II",
      aqlCritical: null,
      aqlMajor: 4.0,
      aqlMinor: 4.0,
    }),
    "lot",
    201,
  );
  await ok(api(lead, "POST", `/api/lots/${lot.id}/units`, { source: "placeholders" }), "units", 201);
  const { units } = await ok(api<{ units: { id: string }[] }>(lead, "GET", `/api/lots/${lot.id}/units`), "unit list");
  unitIds = units.map((u) => u.id);
  const unitId = unitIds[0];
  await ok(api(inspector, "PATCH", `/api/units/${unitId}`, { serial: `CRT-${tag}` }), "serial");
  await ok(api(inspector, "POST", `/api/units/${unitId}/checklist`, { itemId: "power", value: { pass: true } }), "checklist");
  const photo = await createPhoto({ workspaceId: owner.workspaceId, unitId, uploadedBy: owner.userId, viewKey: "back" });
  await saveRegions({ workspaceId: owner.workspaceId, photoId: photo.id, authorId: owner.userId, regions: [SURFACE, SCRATCH] });
  // A real thumbnail in the store, so the certificate draws the view with its regions.
  const thumbnail = await sharp({ create: { width: 300, height: 200, channels: 3, background: "#8a9199" } })
    .webp()
    .toBuffer();
  await putObject(testStore(), photo.thumbnailKey!, thumbnail, { contentType: "image/webp" });
  const measured = await ok(api<{ measurement: { id: string } }>(inspector, "POST", `/api/units/${unitId}/measure`), "measure");
  await ok(api(inspector, "POST", `/api/units/${unitId}/grades`, { measurementId: measured.measurement.id, decision: "accept" }), "grade", 201);
});

describe("condition certificates", () => {
  it("a lead issues one for a graded unit: stored facts, their RFC 8785 hash, and a PDF that states them", async () => {
    const { certificate } = await ok(api<{ certificate: { id: string; shortCode: string; contentHash: string } }>(lead, "POST", `/api/units/${unitIds[0]}/certificates`, {}), "issue", 201);
    const [row] = await db().select().from(certificates).where(eq(certificates.id, certificate.id));
    expect(row.contentHash).toBe(createHash("sha256").update(canonicalize(row.content)!, "utf8").digest("hex"));
    expect(row.content).toMatchObject({ serial: `CRT-${tag}`, grade: "B", partType: `Certificate part ${tag}`, shortCode: certificate.shortCode });
    expect(row.content.checklist).toEqual([{ label: "Powers on", result: "pass", detail: "" }]);

    const res = await fetch(`${BASE_URL}/api/certificates/${certificate.id}/pdf`, { headers: { cookie: lead.cookie } });
    expect(res.status).toBe(200);
    const text = flatText(await pdfText(Buffer.from(await res.arrayBuffer())));
    expect(text).toContain(`CRT-${tag}`);
    expect(text).toContain(certificate.shortCode);
    expect(text).toContain(row.contentHash.slice(0, 8));
    expect(text).not.toContain("Photo not available"); // the view was drawn from its thumbnail

    // The unit's list gives the address the QR code holds; it opens the page signed out.
    const list = await ok(api<{ certificates: { id: string; verificationUrl: string; revokedAt: string | null }[] }>(lead, "GET", `/api/units/${unitIds[0]}/certificates`), "list");
    const listed = list.certificates.find((c) => c.id === certificate.id)!;
    expect(listed.revokedAt).toBeNull();
    const qrPath = new URL(listed.verificationUrl).pathname;
    expect(qrPath).toMatch(/^\/verify\/[^/]+$/);
    const page = await publicPage(qrPath);
    expect(page.status).toBe(200);
    expect(page.html).toContain(row.contentHash.slice(0, 8));
  });

  it("another workspace's lead gets 404 for the unit, the PDF and revoking; an issue request with fields is a 400 and stores nothing", async () => {
    const { certificate } = await ok(api<{ certificate: { id: string } }>(lead, "POST", `/api/units/${unitIds[0]}/certificates`, {}), "issue", 201);
    expect((await api(foreignLead, "GET", `/api/units/${unitIds[0]}/certificates`)).status).toBe(404);
    expect((await api(foreignLead, "POST", `/api/units/${unitIds[0]}/certificates`, {})).status).toBe(404);
    expect((await api(foreignLead, "GET", `/api/certificates/${certificate.id}/pdf`)).status).toBe(404);
    expect((await api(foreignLead, "POST", `/api/certificates/${certificate.id}/revoke`, { reason: "Not mine to revoke." })).status).toBe(404);
    const [stillValid] = await db().select().from(certificates).where(eq(certificates.id, certificate.id));
    expect(stillValid.revokedAt).toBeNull();

    const before = await db().select({ id: certificates.id }).from(certificates).where(eq(certificates.unitId, unitIds[0]));
    const extra = await api<{ error: { message: string } }>(lead, "POST", `/api/units/${unitIds[0]}/certificates`, { grade: "A" });
    expect(extra.status).toBe(400);
    expect(await db().select({ id: certificates.id }).from(certificates).where(eq(certificates.unitId, unitIds[0]))).toHaveLength(before.length);
  });

  it("the verification page, signed out, shows the facts and the hash by token and by code; tampered or expired tokens are refused", async () => {
    const { certificate } = await ok(api<{ certificate: { id: string; shortCode: string; contentHash: string } }>(lead, "POST", `/api/units/${unitIds[0]}/certificates`, {}), "issue", 201);
    const secret = process.env.NEXTAUTH_SECRET!;
    const token = signPublicLink("certificate", certificate.id, { secret, expiresAt: new Date(Date.now() + 86_400_000) });
    const byToken = await publicPage(`/verify/${token}`);
    expect(byToken.status).toBe(200);
    expect(byToken.html).toContain(`CRT-${tag}`);
    expect(byToken.html).toContain(certificate.contentHash.slice(0, 8));
    expect(byToken.html).not.toContain("Certificate Supplier"); // nothing else of the workspace
    const byCode = await publicPage(`/verify?code=${encodeURIComponent(certificate.shortCode.toLowerCase())}`);
    expect(byCode.html).toContain(certificate.contentHash.slice(0, 8));

    const tampered = token.slice(0, -2) + (token.endsWith("A") ? "B" : "A") + token.slice(-1);
    expect((await publicPage(`/verify/${tampered}`)).html).toContain("This certificate code is not valid");
    const expired = signPublicLink("certificate", certificate.id, { secret, expiresAt: new Date(Date.now() - 1000) });
    expect((await publicPage(`/verify/${expired}`)).html).toContain("verification link has expired");
    expect((await publicPage("/verify?code=ZZZZ-ZZZZ-ZZZ")).html).toContain("This certificate code is not valid");
  });

  it("revoking with a reason makes both ways in say revoked; a second revoke or an empty reason is refused", async () => {
    const { certificate } = await ok(api<{ certificate: { id: string; shortCode: string } }>(lead, "POST", `/api/units/${unitIds[0]}/certificates`, {}), "issue", 201);
    const empty = await api<{ error: { message: string } }>(lead, "POST", `/api/certificates/${certificate.id}/revoke`, { reason: " " });
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toMatch(/Say why the certificate is revoked/);
    await ok(api(lead, "POST", `/api/certificates/${certificate.id}/revoke`, { reason: "Sold unit came back cracked." }), "revoke");
    const again = await api(lead, "POST", `/api/certificates/${certificate.id}/revoke`, { reason: "Twice." });
    expect(again.status).toBe(409);
    const token = signPublicLink("certificate", certificate.id, { secret: process.env.NEXTAUTH_SECRET!, expiresAt: new Date(Date.now() + 86_400_000) });
    expect((await publicPage(`/verify/${token}`)).html).toContain("was revoked by its issuer");
    expect((await publicPage(`/verify?code=${certificate.shortCode}`)).html).toContain("was revoked by its issuer");
  });

  it("a unit without a grade gets a clear 409 and no certificate", async () => {
    const before = await db().select().from(certificates).where(eq(certificates.unitId, unitIds[1]));
    const res = await api<{ error: { message: string } }>(lead, "POST", `/api/units/${unitIds[1]}/certificates`, {});
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/no grade yet/);
    expect(await db().select().from(certificates).where(eq(certificates.unitId, unitIds[1]))).toEqual(before);
  });
});
