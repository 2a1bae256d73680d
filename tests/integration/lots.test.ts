/**
 * Lots over HTTP against the test server and its PostgreSQL (no mocks).
 * Plans: lot 120 at level II → code F (Table 1, REF a); F at 1.0 ↑ E n 13 Ac 0 Re 1 (N1, N3);
 * F at 2.5 n 20 Ac 1 Re 2 (N1, N2); tightened: F at 1.0 n 20 0/1 (T1, T2), F at 2.5 ↓ G n 32 1/2 (T1).
 * Lot 1000 at II → J; J at 2.5 n 80 5/6 (N1, N2). Sources as in tests/unit/sampling/iso2859.test.ts.
 * Switching: 2 of 5 or fewer consecutive lots not accepted → tightened (SW, b; sqconline chart, a).
 */
import { sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { api, signIn, type Session } from "../support/http";
import { lotBody, partTypeIdsBySlug } from "../support/lot-access";

type Plan = {
  sampleSize: number;
  severity: string;
  switchingReason: string;
  byDefectSeverity: Record<string, { codeLetter: string; planLetter: string; sampleSize: number; accept: number; reject: number }>;
};
const count = async (table: string) => (await db().execute<{ n: number }>(sql.raw(`SELECT count(*)::int AS n FROM ${table}`))).rows[0].n;

let lead: Session;
let inspector: Session;
let slugs: Record<string, string>;
const newSupplier = async (name = `Lot Test Supplier ${Date.now()}-${Math.random()}`) =>
  (await api<{ supplier: { id: string } }>(lead, "POST", "/api/suppliers", { name, contactEmail: "lots@supplier.example" })).body.supplier.id;

beforeAll(async () => {
  lead = await signIn("lead@vellmoor.example");
  inspector = await signIn("inspector@vellmoor.example");
  slugs = await partTypeIdsBySlug(lead);
});

describe("receiving a lot", () => {
  it("stores the ISO 2859-1 plan for the lot size, level and AQLs (lot 120, II: F; major E 13 0/1, minor F 20 1/2)", async () => {
    const supplierId = await newSupplier();
    const res = await api<{ lot: { id: string; plan: Plan; inspectionSeverity: string } }>(lead, "POST", "/api/lots", lotBody({ supplierId, partTypeId: slugs["rear-camera"] }, 120));
    expect(res.status).toBe(201);
    const { plan } = res.body.lot;
    expect(res.body.lot.inspectionSeverity).toBe("normal");
    expect(plan.sampleSize).toBe(20);
    expect(plan.byDefectSeverity.major).toMatchObject({ codeLetter: "F", planLetter: "E", sampleSize: 13, accept: 0, reject: 1 });
    expect(plan.byDefectSeverity.minor).toMatchObject({ codeLetter: "F", planLetter: "F", sampleSize: 20, accept: 1, reject: 2 });
    expect(plan.byDefectSeverity.critical).toMatchObject({ sampleSize: 20, accept: 0, reject: 1 });
    expect(plan.switchingReason).toMatch(/starting state/);
    const got = await api<{ lot: { plan: Plan }; verdict: { verdict: string } }>(inspector, "GET", `/api/lots/${res.body.lot.id}`);
    expect(got.body.lot.plan).toEqual(plan);
    expect(got.body.verdict.verdict).toBe("pending");
  });

  it("uses the lot's own AQLs (lot 1000, II, minor 2.5 → J n 80 Ac 5 Re 6)", async () => {
    const supplierId = await newSupplier();
    const res = await api<{ lot: { plan: Plan } }>(lead, "POST", "/api/lots", { ...lotBody({ supplierId, partTypeId: slugs.loudspeaker }, 1000), aqlMajor: 2.5, aqlMinor: 2.5 });
    expect(res.body.lot.plan.byDefectSeverity.minor).toMatchObject({ codeLetter: "J", sampleSize: 80, accept: 5, reject: 6 });
  });

  const bad: [string, Record<string, unknown>, RegExp][] = [
    ["zero quantity", { quantity: 0 }, /at least 1/],
    ["negative quantity", { quantity: -5 }, /at least 1/],
    ["fractional quantity", { quantity: 12.5 }, /whole number/],
    ["quantity as text", { quantity: "120" }, /whole number/],
    ["lot size over the table", { quantity: 500_001 }, /split the delivery/],
    ["unknown AQL", { aqlMajor: 2 }, /preferred values/],
    ["AQL as text", { aqlMinor: "2.5" }, /preferred values/],
    ["unknown inspection level", { inspectionLevel: "IV" }, /inspection level/],
    ["month 13", { receivedOn: "2026-13-01" }, /real calendar date/],
    ["30 February", { dueOn: "2026-02-30" }, /real calendar date/],
    ["a word for a date", { receivedOn: "yesterday" }, /YYYY-MM-DD/],
    ["slashes", { dueOn: "2026/12/01" }, /YYYY-MM-DD/],
    ["due before received", { receivedOn: "2026-11-20", dueOn: "2026-11-19" }, /cannot be before/],
    ["unknown field", { severity: "reduced" }, /Unknown field/],
    ["missing purchase reference", { purchaseRef: "  " }, /purchase reference/],
  ];
  it.each(bad)("%s → 400 with a clear message, nothing stored", async (_name, change, message) => {
    const supplierId = await newSupplier();
    const before = await count("lots");
    const res = await api<{ error: { message: string } }>(lead, "POST", "/api/lots", { ...lotBody({ supplierId, partTypeId: slugs.battery }), ...change });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(message);
    expect(await count("lots")).toBe(before);
  });

  it("another workspace's supplier or part type → 404; an inactive supplier → 409; nothing stored", async () => {
    const other = await signIn("lead@quillfen.example");
    const foreignSupplier = (await api<{ suppliers: { id: string }[] }>(other, "GET", "/api/suppliers")).body.suppliers[0].id;
    const foreignPartType = (await partTypeIdsBySlug(other)).battery;
    const before = await count("lots");
    expect((await api(lead, "POST", "/api/lots", lotBody({ supplierId: foreignSupplier, partTypeId: slugs.battery }))).status).toBe(404);
    expect((await api(lead, "POST", "/api/lots", lotBody({ supplierId: await newSupplier(), partTypeId: foreignPartType }))).status).toBe(404);
    const inactive = await newSupplier();
    await api(lead, "PATCH", `/api/suppliers/${inactive}`, { active: false });
    const res = await api<{ error: { message: string } }>(lead, "POST", "/api/lots", lotBody({ supplierId: inactive, partTypeId: slugs.battery }));
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/inactive/);
    expect(await count("lots")).toBe(before);
  });
});

describe("the lot list", () => {
  it("pages, sorts and filters on the server", async () => {
    const supplierId = await newSupplier();
    for (const [i, due] of ["2026-12-03", "2026-12-01", "2026-12-02"].entries()) {
      await api(lead, "POST", "/api/lots", { ...lotBody({ supplierId, partTypeId: slugs["button-flex"] }), purchaseRef: `PO-LIST-${i}`, receivedOn: "2026-11-30", dueOn: due });
    }
    const page1 = await api<{ lots: { purchaseRef: string; dueOn: string }[]; total: number }>(inspector, "GET", `/api/lots?supplierId=${supplierId}&sort=dueOn&dir=asc&pageSize=10&page=1`);
    expect(page1.body.total).toBe(3);
    expect(page1.body.lots.map((l) => l.dueOn)).toEqual(["2026-12-01", "2026-12-02", "2026-12-03"]);
    const desc = await api<{ lots: { purchaseRef: string }[] }>(inspector, "GET", `/api/lots?supplierId=${supplierId}&sort=purchaseRef&dir=desc`);
    expect(desc.body.lots.map((l) => l.purchaseRef)).toEqual(["PO-LIST-2", "PO-LIST-1", "PO-LIST-0"]);
    const searched = await api<{ lots: unknown[]; total: number }>(inspector, "GET", `/api/lots?supplierId=${supplierId}&search=LIST-1`);
    expect(searched.body.total).toBe(1);
    const all = await api<{ lots: unknown[]; total: number }>(inspector, "GET", "/api/lots?pageSize=10&page=1");
    expect(all.body.lots.length).toBeLessThanOrEqual(10);
    expect(all.body.total).toBeGreaterThanOrEqual(12); // the seeded lots are there too
    const deep = await api<{ lots: unknown[] }>(inspector, "GET", `/api/lots?supplierId=${supplierId}&pageSize=10&page=2`);
    expect(deep.body.lots).toEqual([]);
  });

  it.each(["pageSize=7", "sort=colour", "page=0", "dir=up", "status=lost", "supplierId=nope", "limit=5"])("bad query %s → 400", async (query) => {
    expect((await api(inspector, "GET", `/api/lots?${query}`)).status).toBe(400);
  });
});

describe("a lot's unit list", () => {
  it("shows each unit's worst failed checklist severity (critical before major before minor)", async () => {
    const items = [
      { id: "lens-clean", severity: "minor" },
      { id: "power", severity: "critical" },
      { id: "focus", severity: "major" },
    ];
    const partType = await api<{ partType: { id: string } }>(lead, "POST", "/api/part-types", {
      name: `Worst failure flex ${Date.now().toString(36)}`,
      category: "flex",
      views: [{ key: "front", label: "Front", required: true, zones: [] }],
      defectClasses: [{ key: "scratch", label: "Scratch", severity: "minor" }],
      checklist: items.map(({ id, severity }) => ({ id, label: `${id} passes`, kind: "pass_fail", severityOnFail: severity })),
    });
    expect(partType.status, JSON.stringify(partType.body)).toBe(201);
    const { lot } = (await api<{ lot: { id: string } }>(lead, "POST", "/api/lots", lotBody({ supplierId: await newSupplier(), partTypeId: partType.body.partType.id }, 3))).body;
    await api(lead, "POST", `/api/lots/${lot.id}/units`, { source: "placeholders" });
    const { units } = (await api<{ units: { id: string }[] }>(lead, "GET", `/api/lots/${lot.id}/units`)).body;
    // Unit 1 fails every item (the critical one is recorded second), unit 2 fails the minor and the major item, unit 3 passes all.
    const fails = [["lens-clean", "power", "focus"], ["lens-clean", "focus"], []];
    for (const [i, unit] of units.entries()) {
      await api(inspector, "PATCH", `/api/units/${unit.id}`, { serial: `WF-${lot.id.slice(0, 8)}-${i}` });
      for (const { id } of items) {
        const res = await api(inspector, "POST", `/api/units/${unit.id}/checklist`, { itemId: id, value: { pass: !fails[i].includes(id) } });
        expect(res.status, JSON.stringify(res.body)).toBe(200);
      }
    }
    const listed = (await api<{ units: { failed: number; worstFailure: string | null }[] }>(lead, "GET", `/api/lots/${lot.id}/units`)).body.units;
    expect(listed.map((u) => [u.failed, u.worstFailure])).toEqual([
      [3, "critical"],
      [2, "major"],
      [0, null],
    ]);
  });
});

describe("switching rules across lots", () => {
  /**
   * A flex part type like the seeded button flex but without a published rubric: its units count
   * on their checklists alone (lib/lots/findings.ts), so a clean pair is accepted without grading.
   */
  let flexWithoutRubric: string;
  beforeAll(async () => {
    const res = await api<{ partType: { id: string } }>(lead, "POST", "/api/part-types", {
      name: `Switching flex ${Date.now().toString(36)}`,
      category: "flex",
      views: [{ key: "front", label: "Front", required: true, zones: [] }],
      defectClasses: [{ key: "scratch", label: "Scratch", severity: "minor" }],
      checklist: ["power", "volume-up", "volume-down", "side-switch"].map((id) => ({ id, label: `${id} responds`, kind: "pass_fail", severityOnFail: "major" })),
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    flexWithoutRubric = res.body.partType.id;
  });

  /** A lot of 2 (a plan that covers the lot: 100 %), placeholders, a dead power button or a clean pair, decided. */
  async function decidedLot(supplierId: string, reject: boolean) {
    const { lot } = (await api<{ lot: { id: string; purchaseRef: string } }>(lead, "POST", "/api/lots", lotBody({ supplierId, partTypeId: flexWithoutRubric }, 2))).body;
    await api(lead, "POST", `/api/lots/${lot.id}/units`, { source: "placeholders" });
    const { units } = (await api<{ units: { id: string }[] }>(lead, "GET", `/api/lots/${lot.id}/units`)).body;
    for (const [i, unit] of units.entries()) {
      await api(inspector, "PATCH", `/api/units/${unit.id}`, { serial: `SW-${lot.id.slice(0, 8)}-${i}` });
      for (const itemId of ["power", "volume-up", "volume-down", "side-switch"]) {
        const res = await api(inspector, "POST", `/api/units/${unit.id}/checklist`, { itemId, value: { pass: !(reject && i === 0 && itemId === "power") } });
        expect(res.status).toBe(200);
      }
    }
    const decided = await api(
      lead,
      "POST",
      `/api/lots/${lot.id}/disposition`,
      reject ? { disposition: "return_to_vendor", reason: "Power button dead." } : { disposition: "to_stock", reason: "Clean." },
    );
    expect(decided.status, JSON.stringify(decided.body)).toBe(200);
    // Its units, checked but never graded, leave the queue with the decision: none is offered again.
    const after = (await api<{ units: { status: string }[] }>(lead, "GET", `/api/lots/${lot.id}/units`)).body.units;
    expect(after.map((u) => u.status)).toEqual(["not_graded", "not_graded"]);
    expect((await api(inspector, "POST", "/api/queue/next", { lotId: lot.id })).status).toBe(204);
    return lot;
  }

  it("five lots in a row with two rejections switch the next lot's plan to tightened, and say why (SW)", async () => {
    const supplierId = await newSupplier();
    const ids = [];
    for (const reject of [false, true, false, false, true]) ids.push((await decidedLot(supplierId, reject)).purchaseRef);
    const state = await api<{ state: { severity: string; reason: string } }>(inspector, "GET", `/api/inspection-schemes?supplierId=${supplierId}&partTypeId=${flexWithoutRubric}`);
    expect(state.body.state.severity).toBe("tightened");
    expect(state.body.state.reason).toBe(`2 of the last 5 lots on normal inspection were not accepted (${ids[1]}, ${ids[4]}) → tightened.`);
    // Lot 120 at II, tightened: major F n 20 0/1, minor G n 32 1/2 (T1, T2).
    const next = await api<{ lot: { id: string; inspectionSeverity: string; plan: Plan } }>(lead, "POST", "/api/lots", lotBody({ supplierId, partTypeId: flexWithoutRubric }, 120));
    expect(next.body.lot.inspectionSeverity).toBe("tightened");
    expect(next.body.lot.plan.byDefectSeverity.major).toMatchObject({ planLetter: "F", sampleSize: 20, accept: 0, reject: 1 });
    expect(next.body.lot.plan.byDefectSeverity.minor).toMatchObject({ planLetter: "G", sampleSize: 32, accept: 1, reject: 2 });
    expect(next.body.lot.plan.switchingReason).toBe(state.body.state.reason);
  });

  it("the lead's disposition must fit the verdict, needs a verdict, and is recorded once", async () => {
    const supplierId = await newSupplier();
    const { lot } = (await api<{ lot: { id: string } }>(lead, "POST", "/api/lots", lotBody({ supplierId, partTypeId: slugs["button-flex"] }, 2))).body;
    const pending = await api<{ error: { message: string } }>(lead, "POST", `/api/lots/${lot.id}/disposition`, { disposition: "to_stock", reason: "Too early." });
    expect(pending.status).toBe(409);
    expect(pending.body.error.message).toMatch(/no verdict yet/);
    const rejected = (await decidedLot(supplierId, true)).id;
    const again = await api(lead, "POST", `/api/lots/${rejected}/disposition`, { disposition: "sort", reason: "Second try." });
    expect(again.status).toBe(409);
    expect((await api(lead, "POST", `/api/lots/${lot.id}/disposition`, { disposition: "to_stock" })).status).toBe(400);
    expect((await api(lead, "POST", `/api/lots/${lot.id}/disposition`, { disposition: "scrap", reason: "Nope." })).status).toBe(400);
  });

  it("a rejected lot cannot go to stock as it is", async () => {
    const supplierId = await newSupplier();
    const { lot } = (await api<{ lot: { id: string } }>(lead, "POST", "/api/lots", lotBody({ supplierId, partTypeId: slugs.battery }, 2))).body;
    await api(lead, "POST", `/api/lots/${lot.id}/units`, { source: "placeholders" });
    const [unit] = (await api<{ units: { id: string }[] }>(lead, "GET", `/api/lots/${lot.id}/units`)).body.units;
    await api(inspector, "PATCH", `/api/units/${unit.id}`, { serial: `RJ-${lot.id.slice(0, 8)}` });
    await api(inspector, "POST", `/api/units/${unit.id}/checklist`, { itemId: "swelling", value: { pass: false } });
    const res = await api<{ error: { fieldErrors: Record<string, string> } }>(lead, "POST", `/api/lots/${lot.id}/disposition`, { disposition: "to_stock", reason: "Looks fine." });
    expect(res.status).toBe(400);
    expect(res.body.error.fieldErrors.disposition).toMatch(/downgrade, sort 100 %, return to vendor/);
    const got = await api<{ lot: { status: string } }>(lead, "GET", `/api/lots/${lot.id}`);
    expect(got.body.lot.status).toBe("open");
  });

  it("the lead's reduced-inspection approval is stored per supplier and part type", async () => {
    const supplierId = await newSupplier();
    const body = { supplierId, partTypeId: slugs.battery, reducedAllowed: true, steadyProduction: false };
    const res = await api<{ settings: { reducedAllowed: boolean; steadyProduction: boolean } }>(lead, "PUT", "/api/inspection-schemes", body);
    expect(res.status).toBe(200);
    expect(res.body.settings).toMatchObject({ reducedAllowed: true, steadyProduction: false });
    expect((await api(lead, "PUT", "/api/inspection-schemes", { supplierId, partTypeId: slugs.battery })).status).toBe(400);
    expect((await api(lead, "PUT", "/api/inspection-schemes", { ...body, recordCorrectiveAction: true })).status).toBe(409);
  });
});

describe("the demo seed", () => {
  it("decides its historical lots as a lead would: no unit of a decided lot is left waiting or on a bench", async () => {
    const { rows } = await db().execute<{ decided: number; left: number }>(sql`
      SELECT count(DISTINCT l.id)::int AS decided, count(u.id) FILTER (WHERE u.status IN ('queued', 'on_bench'))::int AS "left"
      FROM lots l JOIN units u ON u.lot_id = l.id
      WHERE l.status = 'decided'
        -- The seed's own decisions (its log lines say demo); other test files close lots directly.
        AND EXISTS (SELECT 1 FROM activity_log a WHERE a.subject_id = l.id::text AND a.action = 'lot.decided' AND a.detail->>'demo' = 'true')`);
    expect(rows[0].decided).toBeGreaterThan(0); // the seed has decided lots, so the check can fail
    expect(rows[0].left).toBe(0);
  });
});
