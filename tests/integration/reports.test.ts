/**
 * Reports over HTTP against the test server and its PostgreSQL (no mocks): the CSV exports read
 * back with papaparse and compared row by row with the database, and the lot report PDF's text
 * read back with pdf.js and compared with the lot. Units are inspected through the API as on the
 * Bench (photos and regions are fixture rows; measuring never reads the image).
 *
 * Region sizes checked against plain geometry (a): a 30 × 10 px rectangle covers 300 px²; a
 * spot of radius 4 px covers π·4² ≈ 50.2655 px²; a line from (100,100) to (140,110) is
 * √(40² + 10²) ≈ 41.2311 px long (Pythagoras) and, 2 px wide, covers ≈ 82.4621 px². The
 * part type's nominal size 20 × 10 mm over a Surface 200 px wide gives 10 px/mm (the nominal
 * calibration, lib/measure), so the rectangle is 3 mm² and the line ≈ 4.1231 mm.
 */
import Papa from "papaparse";
import sharp from "sharp";
import { and, asc, eq, inArray, desc } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { grades, lots, photos, regions, units } from "@/db/schema";
import { putObject } from "@/lib/storage/s3";
import { createPhoto, FIXTURE_SURFACE, insertRubricVersion, saveRegions, workspaceIdOf, type FixtureRegion } from "../support/grading";
import { api, BASE_URL, ok, signIn, type Session } from "../support/http";
import { flatText, pdfText } from "../support/pdf-text";
import { testStore } from "../support/photos";

const SURFACE: FixtureRegion = { ...FIXTURE_SURFACE, clientId: "surface" };
const SCRATCH: FixtureRegion = { clientId: "scratch", role: "defect", defect: "scratch", shape: { kind: "rect", x: 60, y: 60, width: 30, height: 10 } };
const DENT: FixtureRegion = { clientId: "dent", role: "defect", defect: "dent", shape: { kind: "spot", x: 200, y: 120, radius: 4 } };
const CRACK: FixtureRegion = {
  clientId: "crack",
  role: "defect",
  defect: "crack",
  shape: {
    kind: "line",
    points: [
      [100, 100],
      [140, 110],
    ],
    width: 2,
  },
};

/** Starts with "+": a spreadsheet would read it as a formula. */
const REASON = "+2 cracked housings over the limit.";

let lead: Session;
let auditor: Session;
let inspector: Session;
let owner: { workspaceId: string; userId: string };
const tag = `${Date.now().toString(36)}`;
let ids: { partTypeId: string; supplierId: string; lotId: string; unitIds: string[]; purchaseRef: string; supplierName: string };

async function download(session: Session, path: string) {
  const res = await fetch(`${BASE_URL}${path}`, { headers: { cookie: session.cookie } });
  return { status: res.status, headers: res.headers, bytes: Buffer.from(await res.arrayBuffer()) };
}

/** The CSV parsed back: header and rows as records (papaparse, RFC 4180). */
async function csv(session: Session, query: string) {
  const res = await download(session, `/api/reports/export?${query}`);
  expect(res.status, res.bytes.toString()).toBe(200);
  expect(res.headers.get("content-type")).toMatch(/^text\/csv; charset=utf-8/);
  const text = res.bytes.toString("utf8");
  expect(text.charCodeAt(0)).toBe(0xfeff); // the byte-order mark
  const parsed = Papa.parse<Record<string, string>>(text.slice(1), { header: true, skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return { fields: parsed.meta.fields ?? [], rows: parsed.data, text };
}

async function inspect(unitId: string, serial: string, input: { power: boolean; regions: FixtureRegion[] }) {
  await ok(api(inspector, "PATCH", `/api/units/${unitId}`, { serial }), "serial");
  await ok(api(inspector, "POST", `/api/units/${unitId}/checklist`, { itemId: "power", value: { pass: input.power } }), "checklist");
  const photo = await createPhoto({ workspaceId: owner.workspaceId, unitId, uploadedBy: owner.userId, viewKey: "back" });
  await saveRegions({ workspaceId: owner.workspaceId, photoId: photo.id, authorId: owner.userId, regions: [SURFACE, ...input.regions] });
  const measured = await ok(api<{ measurement: { id: string } }>(inspector, "POST", `/api/units/${unitId}/measure`), "measure");
  await ok(api(inspector, "POST", `/api/units/${unitId}/grades`, { measurementId: measured.measurement.id, decision: "accept" }), "grade", 201);
  return photo;
}

beforeAll(async () => {
  lead = await signIn("lead@vellmoor.example");
  auditor = await signIn("auditor@vellmoor.example");
  inspector = await signIn("inspector@vellmoor.example");
  owner = await workspaceIdOf("lead@vellmoor.example");
  const { partType } = await ok(
    api<{ partType: { id: string } }>(lead, "POST", "/api/part-types", {
      name: `Report part ${tag}`,
      category: "housing",
      views: [{ key: "back", label: "Back", required: true, zones: [] }],
      defectClasses: [
        { key: "scratch", label: "Scratch", severity: "major" },
        { key: "dent", label: "Dent", severity: "minor" },
        { key: "crack", label: "Crack", severity: "critical" },
      ],
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
    rubric: {
      rules: [
        { id: "scratch-c", metric: "share", defect: "scratch", comparison: ">", threshold: 1, grade: "C" },
        { id: "crack-r", metric: "count", defect: "crack", comparison: ">", threshold: 0, grade: "Reject" },
      ],
    },
    actorId: owner.userId,
  });
  // Accented names: the CSV is UTF-8 and the PDF's font carries them.
  const supplierName = `Brœnsted Složky, «Reports» ${tag}`;
  const { supplier } = await ok(api<{ supplier: { id: string } }>(lead, "POST", "/api/suppliers", { name: supplierName, contactEmail: "reports@supplier.example" }), "supplier", 201);
  const purchaseRef = `PO-REP-${tag}`;
  const { lot } = await ok(
    api<{ lot: { id: string } }>(lead, "POST", "/api/lots", {
      supplierId: supplier.id,
      partTypeId: partType.id,
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
  await ok(api(lead, "POST", `/api/lots/${lot.id}/units`, { source: "placeholders" }), "units", 201);
  const { units: unitList } = await ok(api<{ units: { id: string }[] }>(lead, "GET", `/api/lots/${lot.id}/units`), "unit list");
  const unitIds = unitList.map((u) => u.id);
  const scratched = await inspect(unitIds[0], `REP-${tag}-1`, { power: true, regions: [SCRATCH, DENT] });
  await inspect(unitIds[1], `REP-${tag}-2`, { power: false, regions: [CRACK] });
  await inspect(unitIds[2], `REP-${tag}-3`, { power: true, regions: [] });
  // One real preview in the store, so the report draws an annotated photo.
  const preview = await sharp({ create: { width: 300, height: 200, channels: 3, background: "#8a9199" } })
    .webp()
    .toBuffer();
  await putObject(testStore(), scratched.previewKey!, preview, { contentType: "image/webp" });
  await ok(api(lead, "POST", `/api/lots/${lot.id}/disposition`, { disposition: "return_to_vendor", reason: REASON }), "decision");
  ids = { partTypeId: partType.id, supplierId: supplier.id, lotId: lot.id, unitIds, purchaseRef, supplierName };
});

describe("CSV exports", () => {
  it("units: one row per sampled unit, equal to the database row by row", async () => {
    // As the lead: an auditor's exports leave out units whose blind recheck waits (recheck-blind.test.ts), and the draw picks this lot's at random.
    const { fields, rows } = await csv(lead, `kind=units&supplierId=${ids.supplierId}`);
    expect(fields.slice(0, 4)).toEqual(["unit_id", "lot_id", "purchase_ref", "supplier"]);
    const dbUnits = await db().select().from(units).where(eq(units.lotId, ids.lotId)).orderBy(asc(units.sampleIndex));
    expect(rows.map((r) => r.unit_id)).toEqual(dbUnits.map((u) => u.id));
    for (const [i, unit] of dbUnits.entries()) {
      const [current] = await db().select().from(grades).where(eq(grades.unitId, unit.id)).orderBy(desc(grades.createdAt), desc(grades.id)).limit(1);
      const row = rows[i];
      expect(row.supplier).toBe(ids.supplierName);
      expect(row.sample_index).toBe(String(unit.sampleIndex));
      expect(row.status).toBe(unit.status);
      expect(row.grade).toBe(current.finalGrade);
      expect(new Date(row.graded_at).toISOString()).toBe(current.createdAt.toISOString());
      expect(row.graded_at).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/); // ISO 8601, UTC
      expect(row.serial).toBe(unit.serial);
    }
    expect(rows.map((r) => r.checklist_failed)).toEqual(["0", "1", "0"]);
  });

  it("defects: one row per marked region with its measurements", async () => {
    const { rows } = await csv(lead, `kind=defects&supplierId=${ids.supplierId}`);
    const dbRegions = await db()
      .select({ id: regions.id, defect: regions.defectClass, unitId: photos.unitId })
      .from(regions)
      .innerJoin(photos, eq(photos.id, regions.photoId))
      .where(and(inArray(photos.unitId, ids.unitIds), eq(regions.role, "defect")));
    expect(rows.map((r) => r.region_id).sort()).toEqual(dbRegions.map((r) => r.id).sort());
    const byClass = Object.fromEntries(rows.map((r) => [r.defect_class, r]));
    expect(byClass.scratch).toMatchObject({
      shape: "rect",
      x_px: "60",
      y_px: "60",
      width_px: "30",
      height_px: "10",
      region_area_px: "300",
      px_per_mm: "10",
      calibration: "nominal",
      region_area_mm2: "3",
    });
    // Surface 200 × 100 = 20 000 px; the scratch's 300 px are 1.5 % of it (a: rectangle areas).
    expect(Number(byClass.scratch.class_share_of_surface)).toBeCloseTo(0.015, 4);
    expect(byClass.scratch.class_count_on_photo).toBe("1");
    expect(Number(byClass.dent.region_area_px)).toBeCloseTo(Math.PI * 16, 3);
    expect(Number(byClass.crack.region_length_px)).toBeCloseTo(Math.hypot(40, 10), 3);
    expect(Number(byClass.crack.region_area_px)).toBeCloseTo(2 * Math.hypot(40, 10), 3);
    expect(Number(byClass.crack.region_length_mm)).toBeCloseTo(Math.hypot(40, 10) / 10, 3);
  });

  it("lots and grades follow the filter; days outside it give only the header", async () => {
    const { rows: lotRows } = await csv(lead, `kind=lots&supplierId=${ids.supplierId}`);
    const [lot] = await db().select().from(lots).where(eq(lots.id, ids.lotId));
    expect(lotRows).toHaveLength(1);
    expect(lotRows[0]).toMatchObject({
      lot_id: lot.id,
      purchase_ref: ids.purchaseRef,
      received_on: "2026-11-18",
      status: "decided",
      verdict: lot.verdict,
      disposition: "return_to_vendor",
      units_sampled: "3",
      units_graded: "3",
    });
    // A reason a spreadsheet would run as a formula gets a leading apostrophe (OWASP "CSV injection", a).
    expect(lotRows[0].disposition_reason).toBe(`'${REASON}`);
    expect(new Date(lotRows[0].decided_at).toISOString()).toBe(lot.decidedAt!.toISOString());

    const { rows: gradeRows } = await csv(lead, `kind=grades&partTypeId=${ids.partTypeId}`);
    const dbGrades = await db().select().from(grades).where(inArray(grades.unitId, ids.unitIds));
    expect(gradeRows.map((r) => r.grade_id).sort()).toEqual(dbGrades.map((g) => g.id).sort());

    const empty = await csv(lead, `kind=units&supplierId=${ids.supplierId}&from=2026-11-19`);
    expect(empty.rows).toEqual([]);
    expect(empty.fields[0]).toBe("unit_id");
  });

  it("bad filters get a clear 400; another workspace's supplier a 404", async () => {
    const unknownKind = await api<{ error: { message: string } }>(lead, "GET", "/api/reports/export?kind=invoices");
    expect(unknownKind.status).toBe(400);
    expect(unknownKind.body.error.message).toMatch(/Choose an export: lots, units, grades, defects/);
    const backwards = await api<{ error: { message: string } }>(lead, "GET", "/api/reports/export?kind=lots&from=2026-11-20&to=2026-11-01");
    expect(backwards.status).toBe(400);
    expect(backwards.body.error.message).toMatch(/first day must be on or before the last day/);
    const badDate = await api<{ error: { message: string } }>(lead, "GET", "/api/reports/export?kind=lots&from=2026-02-30");
    expect(badDate.status).toBe(400);
    const missing = await api(lead, "GET", "/api/reports/export?kind=lots&supplierId=00000000-0000-4000-8000-000000000000");
    expect(missing.status).toBe(404);
  });
});

describe("the lot inspection report (PDF)", () => {
  it("states the lot, the decision and every sampled unit as the database has them, with the annotated photo", async () => {
    // As the lead, for the same reason as the units export above.
    const res = await download(lead, `/api/lots/${ids.lotId}/report`);
    expect(res.status).toBe(200);
    expect((await download(auditor, `/api/lots/${ids.lotId}/report`)).status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    const pages = await pdfText(res.bytes);
    const text = flatText(pages);
    expect(text).toContain(ids.purchaseRef);
    expect(text).toContain(ids.supplierName);
    expect(text).toContain(`Report part ${tag}`);
    expect(text).toMatch(/Return to vendor/i);
    expect(text).toContain(REASON);
    const dbUnits = await db().select().from(units).where(eq(units.lotId, ids.lotId));
    for (const unit of dbUnits) expect(text).toContain(unit.serial!);
    expect(text).toContain("Powers on"); // the failed checklist item
    // One photo has a preview in the store: the photo pages follow the units table.
    expect(text).toContain("Annotated photos of defective units");
    expect(text).toContain(`Unit REP-${tag}-1 · Back`);
  });

  it("another workspace's or a missing lot is a 404; a malformed id too", async () => {
    expect((await api(lead, "GET", "/api/lots/00000000-0000-4000-8000-000000000000/report")).status).toBe(404);
    expect((await api(lead, "GET", "/api/lots/not-a-lot/report")).status).toBe(404);
  });
});
