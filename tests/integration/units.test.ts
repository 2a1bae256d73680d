/**
 * Units and checklists over HTTP against the test server and PostgreSQL. Plans: lot 200 at II → G
 * (Table 1, REF a); lot 10 000 at II → L; the seeded draw and CSV rules as in the unit tests.
 * Battery limits: 3.00–4.40 V (docs/references.md, a); swelling is critical (c).
 */
import { sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { drawSample } from "@/lib/units/sample-draw";
import { api, signIn, type Session } from "../support/http";
import { lotBody, partTypeIdsBySlug } from "../support/lot-access";

type UnitRow = { id: string; sampleIndex: number; serial: string | null; status: string };
const unitsOf = async (lotId: string) => (await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM units WHERE lot_id = ${lotId}`)).rows[0].n;
const serials = (n: number, prefix = "TR-BAT-24") => Array.from({ length: n }, (_, i) => `${prefix}-${String(i + 1).padStart(6, "0")}`);

let lead: Session;
let inspector: Session;
let inspector2: Session;
let slugs: Record<string, string>;
let supplierId: string;

async function newLot(partType: string, quantity: number) {
  const res = await api<{ lot: { id: string; plan: { sampleSize: number } } }>(lead, "POST", "/api/lots", lotBody({ supplierId, partTypeId: slugs[partType] }, quantity));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.lot;
}
const listUnits = async (lotId: string) => (await api<{ units: UnitRow[] }>(lead, "GET", `/api/lots/${lotId}/units`)).body.units;

beforeAll(async () => {
  lead = await signIn("lead@vellmoor.example");
  inspector = await signIn("inspector@vellmoor.example");
  inspector2 = await signIn("inspector2@vellmoor.example");
  slugs = await partTypeIdsBySlug(lead);
  supplierId = (await api<{ supplier: { id: string } }>(lead, "POST", "/api/suppliers", { name: `Unit Test Supplier ${Date.now()}`, contactEmail: "units@supplier.example" })).body.supplier.id;
});

describe("drawing the sample from a serial list", () => {
  it("draws the plan's sample size at random, records the seed, and the same list + seed repeat the draw", async () => {
    const lot = await newLot("battery", 200);
    const list = ["serial,cycles", ...serials(200).map((s, i) => `${s},${i}`)].join("\r\n");
    const res = await api<{ created: number; draw: { seed: string; poolSize: number; algorithm: string } }>(lead, "POST", `/api/lots/${lot.id}/units`, { source: "serials", csv: `\uFEFF${list}` });
    expect(res.status).toBe(201);
    expect(res.body.created).toBe(lot.plan.sampleSize);
    expect(res.body.draw).toMatchObject({ poolSize: 200, algorithm: "xsadd-partial-fisher-yates-v1" });
    const drawn = (await listUnits(lot.id)).map((u) => u.serial);
    expect(drawn).toEqual(drawSample(serials(200), lot.plan.sampleSize, res.body.draw.seed));
    // Repeat on another lot with the recorded seed: the same units in the same order.
    const again = await newLot("battery", 200);
    await api(lead, "POST", `/api/lots/${again.id}/units`, { source: "serials", csv: list, seed: res.body.draw.seed });
    expect((await listUnits(again.id)).map((u) => u.serial)).toEqual(drawn);
    const detail = await api<{ lot: { sampleDraw: { seed: string } } }>(inspector, "GET", `/api/lots/${lot.id}`);
    expect(detail.body.lot.sampleDraw.seed).toBe(res.body.draw.seed);
    // The sample is drawn once.
    expect((await api(lead, "POST", `/api/lots/${lot.id}/units`, { source: "placeholders" })).status).toBe(409);
  });

  it("imports a 10 000-line list for a lot of 10 000 (lot 10 000 at II → L, n 200)", async () => {
    const lot = await newLot("button-flex", 10_000);
    expect(lot.plan.sampleSize).toBe(200);
    const res = await api<{ created: number }>(lead, "POST", `/api/lots/${lot.id}/units`, { source: "serials", csv: serials(10_000, "OV-BTN-24").join("\n") });
    expect(res.status).toBe(201);
    expect(res.body.created).toBe(200);
  });

  const badLists: [string, () => string, RegExp][] = [
    ["bad lines", () => [...serials(40), "OV CAM 1", "-OV-2"].join("\n"), /line 41: “OV CAM 1” contains a space.*line 42/],
    ["duplicates", () => [...serials(40), "tr-bat-24-000003"].join("\n"), /appears 2 times \(lines 3, 41\)/],
    ["10 000 lines for a lot of 200", () => serials(10_000).join("\n"), /10,000 serials but the lot has 200 units/],
    ["more lines than an import takes", () => serials(20_001).join("\n"), /at most 20,000/],
    ["fewer serials than the sample", () => serials(5).join("\n"), /needs \d+ units but the list has 5/],
    ["an empty list", () => "\n\n", /no serials/],
  ];
  it.each(badLists)("%s → 400 with a clear message, nothing stored", async (_name, csv, message) => {
    const lot = await newLot("battery", 200);
    const res = await api<{ error: { message: string } }>(lead, "POST", `/api/lots/${lot.id}/units`, { source: "serials", csv: csv() });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(message);
    expect(await unitsOf(lot.id)).toBe(0);
    const detail = await api<{ lot: { sampleDraw: unknown } }>(lead, "GET", `/api/lots/${lot.id}`);
    expect(detail.body.lot.sampleDraw).toBeNull();
  });

  it("refuses malformed bodies and a seed out of range", async () => {
    const lot = await newLot("battery", 200);
    for (const body of [{}, { source: "serials" }, { source: "magic" }, { source: "placeholders", extra: 1 }, { source: "serials", csv: "A-1", seed: "99999999999" }]) {
      expect((await api(lead, "POST", `/api/lots/${lot.id}/units`, body)).status, JSON.stringify(body)).toBe(400);
    }
    expect(await unitsOf(lot.id)).toBe(0);
  });
});

describe("placeholders and the bench", () => {
  it("numbered placeholders take the serial scanned on the bench; duplicates and bad serials are refused", async () => {
    const lot = await newLot("battery", 20);
    expect((await api(lead, "POST", `/api/lots/${lot.id}/units`, { source: "placeholders" })).status).toBe(201);
    const [first, second] = await listUnits(lot.id);
    expect(first).toMatchObject({ sampleIndex: 1, serial: null, status: "queued" });
    expect((await api(inspector, "PATCH", `/api/units/${first.id}`, { serial: "TR-BAT-24-777001" })).status).toBe(200);
    const dupe = await api<{ error: { message: string } }>(inspector, "PATCH", `/api/units/${second.id}`, { serial: "TR-BAT-24-777001" });
    expect(dupe.status).toBe(409);
    expect(dupe.body.error.message).toMatch(/already has the serial/);
    expect((await api(inspector, "PATCH", `/api/units/${second.id}`, { serial: "has space" })).status).toBe(400);
    expect((await api(inspector, "PATCH", `/api/units/${second.id}`, { serial: "" })).status).toBe(400);
    // No results before the serial is known.
    const early = await api<{ error: { message: string } }>(inspector, "POST", `/api/units/${second.id}/checklist`, { itemId: "swelling", value: { pass: true } });
    expect(early.status).toBe(409);
    expect(early.body.error.message).toMatch(/serial first/);
  });

  it("imported serials are fixed", async () => {
    const lot = await newLot("battery", 20);
    await api(lead, "POST", `/api/lots/${lot.id}/units`, { source: "serials", csv: serials(20).join("\n") });
    const [unit] = await listUnits(lot.id);
    expect((await api(inspector, "PATCH", `/api/units/${unit.id}`, { serial: "TR-BAT-24-999999" })).status).toBe(409);
  });
});

describe("the functional checklist", () => {
  async function batteryUnit() {
    const lot = await newLot("battery", 20);
    await api(lead, "POST", `/api/lots/${lot.id}/units`, { source: "serials", csv: serials(20, `TR-${lot.id.slice(0, 6)}`).join("\n") });
    return { lot, units: await listUnits(lot.id) };
  }
  type Result = { result: { passed: boolean; failureReason: string | null; value: unknown; severityOnFail: string } };

  it("an out-of-limit voltage fails automatically with the reason; in-limit passes; the unit goes onto the bench", async () => {
    const { lot, units } = await batteryUnit();
    const low = await api<Result>(inspector, "POST", `/api/units/${units[0].id}/checklist`, { itemId: "ocv", value: { reading: 2.874 } });
    expect(low.status).toBe(200);
    expect(low.body.result).toMatchObject({ passed: false, failureReason: "2.87 V is below the minimum 3.00 V.", value: { reading: 2.87 }, severityOnFail: "major" });
    const fixed = await api<Result>(inspector, "POST", `/api/units/${units[0].id}/checklist`, { itemId: "ocv", value: { reading: 3.85 } });
    expect(fixed.body.result).toMatchObject({ passed: true, failureReason: null });
    const unit = await api<{ unit: { status: string; leaseHolderId: string }; results: unknown[] }>(inspector, "GET", `/api/units/${units[0].id}`);
    expect(unit.body.unit.status).toBe("on_bench");
    expect(unit.body.results).toHaveLength(1);
    // Another inspector cannot write on it while the lease runs.
    const other = await api<{ error: { message: string } }>(inspector2, "POST", `/api/units/${units[0].id}/checklist`, { itemId: "health", value: { reading: 90 } });
    expect(other.status).toBe(409);
    expect(other.body.error.message).toMatch(/on their bench/);
    const verdict = await api<{ verdict: { verdict: string } }>(lead, "GET", `/api/lots/${lot.id}`);
    expect(verdict.body.verdict.verdict).toBe("pending");
  });

  it("a swollen cell is a critical defect: the lot's running verdict rejects (Ac 0 / Re 1)", async () => {
    const { lot, units } = await batteryUnit();
    const res = await api<Result>(inspector, "POST", `/api/units/${units[1].id}/checklist`, { itemId: "swelling", value: { pass: false } });
    expect(res.body.result).toMatchObject({ passed: false, severityOnFail: "critical" });
    const got = await api<{ verdict: { verdict: string; classes: { critical: { found: number } } } }>(lead, "GET", `/api/lots/${lot.id}`);
    expect(got.body.verdict.verdict).toBe("reject");
    expect(got.body.verdict.classes.critical.found).toBe(1);
  });

  it("bad results → 4xx and nothing stored", async () => {
    const { units } = await batteryUnit();
    const before = (await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM checklist_results WHERE unit_id = ${units[2].id}`)).rows[0].n;
    const cases: [unknown, number, RegExp][] = [
      [{ itemId: "nope", value: { pass: true } }, 400, /not an item/],
      [{ itemId: "ocv", value: { pass: true } }, 400, /takes a reading/],
      [{ itemId: "swelling", value: { reading: 1 } }, 400, /takes pass or fail/],
      [{ itemId: "ocv", value: { reading: "3.8" } }, 400, /not valid/],
      [{ itemId: "ocv", value: { reading: 1e300 } }, 400, /implausibly large/],
      [{ itemId: "ocv" }, 400, /not valid/],
      [{ itemId: "ocv", value: { reading: 3.8 }, passed: true }, 400, /Unknown field/],
    ];
    for (const [body, status, message] of cases) {
      const res = await api<{ error: { message: string } }>(inspector, "POST", `/api/units/${units[2].id}/checklist`, body);
      expect(res.status, JSON.stringify(body)).toBe(status);
      expect(res.body.error.message).toMatch(message);
    }
    const after = (await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM checklist_results WHERE unit_id = ${units[2].id}`)).rows[0].n;
    expect(after).toBe(before);
    const unit = await api<{ unit: { status: string } }>(inspector, "GET", `/api/units/${units[2].id}`);
    expect(unit.body.unit.status).toBe("queued");
  });

  it("a decided lot's units are closed", async () => {
    const { lot, units } = await batteryUnit();
    await api(inspector, "POST", `/api/units/${units[0].id}/checklist`, { itemId: "swelling", value: { pass: false } });
    expect((await api(lead, "POST", `/api/lots/${lot.id}/disposition`, { disposition: "return_to_vendor", reason: "Swollen cell." })).status).toBe(200);
    const res = await api<{ error: { message: string } }>(inspector, "POST", `/api/units/${units[1].id}/checklist`, { itemId: "swelling", value: { pass: true } });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/decided/);
  });

  it("another workspace's units and lots answer 404", async () => {
    const other = await signIn("lead@quillfen.example");
    const { lot, units } = await batteryUnit();
    expect((await api(other, "GET", `/api/units/${units[0].id}`)).status).toBe(404);
    expect((await api(other, "POST", `/api/units/${units[0].id}/checklist`, { itemId: "swelling", value: { pass: true } })).status).toBe(404);
    expect((await api(other, "GET", `/api/lots/${lot.id}`)).status).toBe(404);
    expect((await api(other, "GET", "/api/lots/not-a-uuid")).status).toBe(404);
  });
});
