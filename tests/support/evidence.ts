/**
 * Fixtures of the evidence tests (evidence.test.ts, evidence-link.test.ts): a part type with one
 * defect class and a published rubric, a supplier with its contact, lots whose sampled units are
 * inspected through the API (photos and regions written as fixtures), and the lot decided.
 */
import sharp from "sharp";
import { putObject } from "@/lib/storage/s3";
import { createPhoto, FIXTURE_SURFACE, insertRubricVersion, saveRegions, workspaceIdOf, type FixtureRegion } from "./grading";
import { api, ok, type Session } from "./http";
import { testStore } from "./photos";

export const SURFACE: FixtureRegion = { ...FIXTURE_SURFACE, clientId: "surface" };
export const SCRATCH: FixtureRegion = { clientId: "scratch", role: "defect", defect: "scratch", shape: { kind: "rect", x: 60, y: 60, width: 30, height: 10 } };

/** Polls until `read` gives a value, or fails with `what` after the deadline (waits for states, not for time). */
export async function until<T>(what: string, read: () => Promise<T | undefined>, timeoutMs = 60_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await read();
    if (value !== undefined) return value;
    if (Date.now() > deadline) throw new Error(`Timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

export const evidenceDraft = (overrides: Record<string, unknown> = {}) => ({
  subject: "Lot {{lot}}: {{decision}} (claim {{claimRef}})",
  body: "Hello,\n\nlot {{lot}} was {{decision}}.\nPlan: {{plan}}\nDefectives: {{defectives}}\nReason: {{reason}}\n\n{{workspace}}",
  ...overrides,
});

export type EvidenceWorld = { lead: Session; inspector: Session; owner: { workspaceId: string; userId: string }; partTypeId: string; supplierId: string };

/** A part type (scratch: major) with a published rubric (scratch share > 1 % → C) and a supplier whose contact is `contact`. */
export async function evidenceWorld(lead: Session, inspector: Session, { tag, contact, supplierName }: { tag: string; contact: string; supplierName: string }): Promise<EvidenceWorld> {
  const owner = await workspaceIdOf(lead.email);
  const { partType } = await ok(
    api<{ partType: { id: string } }>(lead, "POST", "/api/part-types", {
      name: `Evidence part ${tag}`,
      category: "housing",
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
    rubric: { rules: [{ id: "scratch-c", metric: "share", defect: "scratch", comparison: ">", threshold: 1, grade: "C" }] },
    actorId: owner.userId,
  });
  const { supplier } = await ok(api<{ supplier: { id: string } }>(lead, "POST", "/api/suppliers", { name: supplierName, contactEmail: contact }), "supplier", 201);
  return { lead, inspector, owner, partTypeId: partType.id, supplierId: supplier.id };
}

/** A lot of 10 with its sampled units as placeholders. */
export async function lotWithUnits(world: EvidenceWorld, purchaseRef: string) {
  const { lot } = await ok(
    api<{ lot: { id: string } }>(world.lead, "POST", "/api/lots", {
      supplierId: world.supplierId,
      partTypeId: world.partTypeId,
      purchaseRef,
      quantity: 10,
      receivedOn: "2026-11-18",
      dueOn: "2026-11-27",
      inspectionLevel: "II",
      aqlCritical: null,
      aqlMajor: 4.0,
      aqlMinor: 4.0,
    }),
    "lot",
    201,
  );
  await ok(api(world.lead, "POST", `/api/lots/${lot.id}/units`, { source: "placeholders" }), "units", 201);
  const { units: list } = await ok(api<{ units: { id: string }[] }>(world.lead, "GET", `/api/lots/${lot.id}/units`), "unit list");
  return { lotId: lot.id, unitIds: list.map((u) => u.id) };
}

/**
 * Inspects one unit through the API: serial, checklist, a back photo with `regions`, measure and
 * grade. `preview` (default: a small grey picture) is stored as the photo's preview, which the
 * lot report and the annotated photos are drawn from.
 */
export async function inspectUnit(world: EvidenceWorld, unitId: string, serial: string, regions: FixtureRegion[], preview?: Buffer) {
  const { inspector, owner } = world;
  await ok(api(inspector, "PATCH", `/api/units/${unitId}`, { serial }), "serial");
  await ok(api(inspector, "POST", `/api/units/${unitId}/checklist`, { itemId: "power", value: { pass: true } }), "checklist");
  const photo = await createPhoto({ workspaceId: owner.workspaceId, unitId, uploadedBy: owner.userId, viewKey: "back" });
  await saveRegions({ workspaceId: owner.workspaceId, photoId: photo.id, authorId: owner.userId, regions: [SURFACE, ...regions] });
  const measured = await ok(api<{ measurement: { id: string } }>(inspector, "POST", `/api/units/${unitId}/measure`), "measure");
  await ok(api(inspector, "POST", `/api/units/${unitId}/grades`, { measurementId: measured.measurement.id, decision: "accept" }), "grade", 201);
  if (regions.length > 0) {
    const image =
      preview ??
      (await sharp({ create: { width: 300, height: 200, channels: 3, background: "#8a9199" } })
        .webp()
        .toBuffer());
    await putObject(testStore(), photo.previewKey!, image, { contentType: "image/webp" });
  }
  return photo;
}
