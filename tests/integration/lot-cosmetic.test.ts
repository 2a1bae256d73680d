/**
 * Cosmetic grades in the lot verdict, over HTTP against the test server and its PostgreSQL (no
 * mocks): units defective only cosmetically, only functionally and both, each counted once per
 * severity class (ISO 2859-1 practice for classified nonconformities, b, from memory; the rule is
 * docs/contracts.md "Lot verdict counting" and lib/lots/cosmetic.ts). Photos and region sets are
 * fixture rows (measuring never reads the image); everything else goes through the API.
 *
 * Plan of a lot of 10 at level II, normal: code letter B, sample 3 (Table 1; sample sizes, a,
 * docs/references.md). AQL 4.0 major and minor at B → n 3, Ac 0 Re 1 (Table 2-A, b, read through
 * the app's own tested table: tests/unit/sampling/iso2859.test.ts); critical without AQL → 0 / 1.
 */
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { lots } from "@/db/schema";
import type { Rubric } from "@/lib/grading/rubric-schema";
import { createPhoto, FIXTURE_SURFACE, insertRubricVersion, saveRegions, workspaceIdOf, type FixtureRegion } from "../support/grading";
import { api, ok, signIn, type Session } from "../support/http";

type Defect = { severity: string; source: string; label?: string };
type LotView = {
  lot: { promisedGrade: string; verdict: string; status: string; decisionCounts: Record<string, { found: number }> | null };
  verdict: { verdict: string; classes: Record<string, { found: number; inspected: number; sampleSize: number }> };
  cosmeticGrading: boolean;
  unitDefects: Record<string, Defect[]>;
};

const RUBRIC: Rubric = {
  rules: [
    { id: "scratch-c", metric: "share", defect: "scratch", comparison: ">", threshold: 1, grade: "C" },
    { id: "dent-b", metric: "count", defect: "dent", comparison: ">", threshold: 0, grade: "B" },
    { id: "func-major", metric: "functionalFailures", severity: "major", comparison: ">", threshold: 0, grade: "C" },
  ],
  notes: ["Test rubric for the lot counts."],
};
/** Surface 200 × 100 px = 20 000 px; a 30 × 10 px scratch is 1.5 % of it (a: rectangle areas). */
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

let lead: Session;
let inspector: Session;
let owner: { workspaceId: string; userId: string };
let n = 0;

/** A part type with one major checklist item, its rubric published, and a supplier buying at `supplierGrade`. */
async function scene(supplierGrade: "A" | "B" | "C" | null) {
  const tag = `${Date.now().toString(36)}-${++n}`;
  const { partType } = await ok(
    api<{ partType: { id: string } }>(lead, "POST", "/api/part-types", {
      name: `Cosmetic count part ${tag}`,
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
  await insertRubricVersion({ workspaceId: owner.workspaceId, partTypeId: partType.id, version: 1, status: "published", rubric: RUBRIC, actorId: owner.userId });
  const { supplier } = await ok(
    api<{ supplier: { id: string } }>(lead, "POST", "/api/suppliers", { name: `Cosmetic Supplier ${tag}`, contactEmail: "grade@supplier.example", promisedGrade: supplierGrade }),
    "supplier",
    201,
  );
  return { partTypeId: partType.id, supplierId: supplier.id, tag };
}

async function receive(ids: { partTypeId: string; supplierId: string; tag: string }, extra: Record<string, unknown> = {}) {
  const body = {
    supplierId: ids.supplierId,
    partTypeId: ids.partTypeId,
    purchaseRef: `PO-COS-${ids.tag}`,
    quantity: 10,
    receivedOn: "2026-11-20",
    dueOn: "2026-11-27",
    inspectionLevel: "II",
    aqlCritical: null,
    aqlMajor: 4.0,
    aqlMinor: 4.0,
    ...extra,
  };
  const { lot } = await ok(api<{ lot: { id: string; promisedGrade: string; plan: { sampleSize: number } } }>(lead, "POST", "/api/lots", body), "lot", 201);
  await ok(api(lead, "POST", `/api/lots/${lot.id}/units`, { source: "placeholders" }), "units", 201);
  const { units } = await ok(api<{ units: { id: string }[] }>(lead, "GET", `/api/lots/${lot.id}/units`), "unit list");
  return { lot, unitIds: units.map((u) => u.id) };
}

/** Checklist, a photo with regions, measure, accept the proposal (or override it) — as on the Bench. */
async function inspect(unitId: string, input: { power: boolean; regions: FixtureRegion[]; override?: "A" | "B" | "C" | "Reject" }) {
  await ok(api(inspector, "PATCH", `/api/units/${unitId}`, { serial: `COS-${unitId.slice(0, 8)}` }), "serial");
  await ok(api(inspector, "POST", `/api/units/${unitId}/checklist`, { itemId: "power", value: { pass: input.power } }), "checklist");
  const photo = await createPhoto({ workspaceId: owner.workspaceId, unitId, uploadedBy: owner.userId, viewKey: "back" });
  await saveRegions({ workspaceId: owner.workspaceId, photoId: photo.id, authorId: owner.userId, regions: [SURFACE, ...input.regions] });
  const measured = await ok(api<{ measurement: { id: string; proposal: { grade: string } } }>(inspector, "POST", `/api/units/${unitId}/measure`), "measure");
  const decision = input.override ? { decision: "override", finalGrade: input.override, reason: "Judged at the bench." } : { decision: "accept" };
  await ok(api(inspector, "POST", `/api/units/${unitId}/grades`, { measurementId: measured.measurement.id, ...decision }), "grade", 201);
  return measured.measurement.proposal.grade;
}

const view = (lotId: string) => ok(api<LotView>(lead, "GET", `/api/lots/${lotId}`), "lot view");
const severities = (defects: Defect[] | undefined, source: string) => (defects ?? []).filter((d) => d.source === source).map((d) => d.severity);

beforeAll(async () => {
  lead = await signIn("lead@vellmoor.example");
  inspector = await signIn("inspector@vellmoor.example");
  owner = await workspaceIdOf("lead@vellmoor.example");
});

describe("the promised grade", () => {
  it("comes from the supplier, else the part type, unless the lead sets it; a bad one is refused", async () => {
    const fromSupplier = await receive(await scene("B"));
    expect(fromSupplier.lot.promisedGrade).toBe("B");
    const fromPartType = await receive(await scene(null));
    expect(fromPartType.lot.promisedGrade).toBe("A");
    const chosen = await receive(await scene("B"), { promisedGrade: "C" });
    expect(chosen.lot.promisedGrade).toBe("C");
    const ids = await scene(null);
    const bad = await api<{ error: { message: string } }>(lead, "POST", "/api/lots", {
      supplierId: ids.supplierId,
      partTypeId: ids.partTypeId,
      purchaseRef: "PO-BAD",
      quantity: 10,
      receivedOn: "2026-11-20",
      dueOn: "2026-11-27",
      inspectionLevel: "II",
      aqlCritical: null,
      aqlMajor: 4.0,
      aqlMinor: 4.0,
      promisedGrade: "Reject",
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/promised grade is A, B or C/);
  });
});

describe("cosmetic grades in the lot counts", () => {
  it("counts units defective only cosmetically, only functionally and both, once per severity class", async () => {
    const ids = await scene("B"); // bought at B
    const { lot, unitIds } = await receive(ids);
    expect(lot.plan.sampleSize).toBe(3);
    const [cosmeticOnly, functionalOnly, both] = unitIds;
    expect(await inspect(cosmeticOnly, { power: true, regions: [SCRATCH] })).toBe("C"); // 1.5 % scratch > 1 % → C, worse than B
    expect(await inspect(functionalOnly, { power: false, regions: [DENT] })).toBe("C"); // C from the failure only; the dent's B keeps the promise
    expect(await inspect(both, { power: false, regions: [SCRATCH, DENT] })).toBe("C");

    const got = await view(lot.id);
    expect(got.lot.promisedGrade).toBe("B");
    expect(got.cosmeticGrading).toBe(true);
    expect(severities(got.unitDefects[cosmeticOnly], "cosmetic")).toEqual(["major"]);
    expect(severities(got.unitDefects[cosmeticOnly], "functional")).toEqual([]);
    expect(severities(got.unitDefects[functionalOnly], "cosmetic")).toEqual([]);
    expect(severities(got.unitDefects[functionalOnly], "functional")).toEqual(["major"]);
    expect(severities(got.unitDefects[both], "cosmetic")).toEqual(["major"]);
    expect(severities(got.unitDefects[both], "functional")).toEqual(["major"]);
    // Three units with a major nonconformity, each counted once; the dent (B) never broke the promise.
    expect(got.verdict.classes.major).toMatchObject({ found: 3, inspected: 3 });
    expect(got.verdict.classes.minor.found).toBe(0);
    expect(got.verdict.classes.critical.found).toBe(0);
    expect(got.verdict.verdict).toBe("reject");
  });

  it("promised A: the dent's B counts as minor; a crack counts as critical even when overridden to A", async () => {
    const ids = await scene(null); // part type default: A
    const { lot, unitIds } = await receive(ids);
    await inspect(unitIds[0], { power: true, regions: [DENT] });
    await inspect(unitIds[1], { power: true, regions: [CRACK], override: "A" });
    await inspect(unitIds[2], { power: true, regions: [] });
    const got = await view(lot.id);
    expect(severities(got.unitDefects[unitIds[0]], "cosmetic")).toEqual(["minor"]);
    expect(severities(got.unitDefects[unitIds[1]], "cosmetic")).toEqual(["critical"]);
    expect(got.unitDefects[unitIds[2]]).toBeUndefined();
    expect(got.verdict.classes).toMatchObject({ critical: { found: 1 }, major: { found: 0 }, minor: { found: 1 } });
  });

  it("a lot is accepted only once every sampled unit is graded; the decision stores the new counts", async () => {
    const ids = await scene("C"); // bought at C: scratches and dents keep the promise
    const { lot, unitIds } = await receive(ids);
    for (const unitId of unitIds) {
      await ok(api(inspector, "PATCH", `/api/units/${unitId}`, { serial: `CHK-${unitId.slice(0, 8)}` }), "serial");
      await ok(api(inspector, "POST", `/api/units/${unitId}/checklist`, { itemId: "power", value: { pass: true } }), "checklist");
    }
    const checkedOnly = await view(lot.id);
    expect(checkedOnly.verdict.verdict).toBe("pending"); // checklists done, nothing graded yet
    expect(checkedOnly.verdict.classes.major.inspected).toBe(0);
    const early = await api<{ error: { message: string } }>(lead, "POST", `/api/lots/${lot.id}/disposition`, { disposition: "to_stock", reason: "Too early." });
    expect(early.status).toBe(409);

    for (const unitId of unitIds) await inspect(unitId, { power: true, regions: [SCRATCH, DENT] });
    const graded = await view(lot.id);
    expect(graded.verdict.verdict).toBe("accept");
    const decided = await api(lead, "POST", `/api/lots/${lot.id}/disposition`, { disposition: "to_stock", reason: "Graded C as bought." });
    expect(decided.status, JSON.stringify(decided.body)).toBe(200);
    const [row] = await db().select({ counts: lots.decisionCounts }).from(lots).where(eq(lots.id, lot.id));
    expect(row.counts).toEqual({ critical: { found: 0, inspected: 3, sampleSize: 3 }, major: { found: 0, inspected: 3, sampleSize: 3 }, minor: { found: 0, inspected: 3, sampleSize: 3 } });
  });

  it("a lot decided before the change keeps its stored verdict and counts: the history is not recounted", async () => {
    const ids = await scene("B");
    const { lot, unitIds } = await receive(ids);
    for (const unitId of unitIds) await inspect(unitId, { power: true, regions: [SCRATCH] }); // each would now count as major
    const stored = { critical: { found: 0, inspected: 3, sampleSize: 3 }, major: { found: 0, inspected: 3, sampleSize: 3 }, minor: { found: 0, inspected: 3, sampleSize: 3 } };
    // As the earlier rule decided it: on the checklists alone, accepted to stock.
    await db()
      .update(lots)
      .set({
        status: "decided",
        verdict: "accept",
        disposition: "to_stock",
        dispositionReason: "Decided before cosmetic counts.",
        decisionCounts: stored,
        decidedBy: owner.userId,
        decidedAt: new Date(),
      })
      .where(eq(lots.id, lot.id));
    const got = await view(lot.id);
    expect(got.lot.verdict).toBe("accept");
    expect(got.verdict.classes.major.found).toBe(0);
    expect(got.verdict.verdict).toBe("accept");
    // The switching rules read the stored counts too: this lot stays an accepted one.
    const scheme = await ok(api<{ state: { reason: string } }>(lead, "GET", `/api/inspection-schemes?supplierId=${ids.supplierId}&partTypeId=${ids.partTypeId}`), "scheme");
    expect(scheme.state.reason).not.toMatch(/not accepted/);
  });
});
