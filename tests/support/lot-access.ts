/** Fixture ids for the lot, unit, part type and checklist routes in the access matrix (routes.ts). */
import { api, type Session } from "./http";

let n = 0;
const tag = () => `${Date.now().toString(36)}-${++n}`;

async function must<T>(result: Promise<{ status: number; body: T }>, status: number, what: string): Promise<T> {
  const res = await result;
  if (res.status !== status) throw new Error(`Fixture ${what} failed (${res.status}): ${JSON.stringify(res.body)}`);
  return res.body;
}

export function lotBody(ids: { supplierId: string; partTypeId: string }, quantity = 50) {
  return {
    supplierId: ids.supplierId,
    partTypeId: ids.partTypeId,
    purchaseRef: `PO-FX-${tag()}`,
    quantity,
    receivedOn: "2026-11-20",
    dueOn: "2026-11-27",
    inspectionLevel: "II",
    aqlCritical: null,
    aqlMajor: 1.0,
    aqlMinor: 2.5,
  };
}

/** Seeded part types (by slug) of the caller's workspace. */
export async function partTypeIdsBySlug(lead: Session): Promise<Record<string, string>> {
  const body = await must(api<{ partTypes: { id: string; slug: string }[] }>(lead, "GET", "/api/part-types"), 200, "part type list");
  return Object.fromEntries(body.partTypes.map((p) => [p.slug, p.id]));
}

async function placeholderLot(lead: Session, supplierId: string, partTypeId: string, quantity: number) {
  const { lot } = await must(api<{ lot: { id: string } }>(lead, "POST", "/api/lots", lotBody({ supplierId, partTypeId }, quantity)), 201, "lot");
  await must(api(lead, "POST", `/api/lots/${lot.id}/units`, { source: "placeholders" }), 201, "placeholders");
  const { units } = await must(api<{ units: { id: string }[] }>(lead, "GET", `/api/lots/${lot.id}/units`), 200, "unit list");
  return { lotId: lot.id, unitIds: units.map((u) => u.id) };
}

export async function lotFixtureIds(lead: Session, supplierId: string): Promise<Record<string, string>> {
  const slugs = await partTypeIdsBySlug(lead);
  const flex = slugs["button-flex"];
  const { partType: editable } = await must(
    api<{ partType: { id: string } }>(lead, "POST", "/api/part-types", {
      name: `Fixture flex ${tag()}`,
      category: "flex",
      views: [{ key: "front", label: "Front", required: true, zones: [] }],
      defectClasses: [{ key: "scratch", label: "Scratch", severity: "minor" }],
      checklist: [{ id: "power", label: "Power button responds", kind: "pass_fail", severityOnFail: "major" }],
    }),
    201,
    "part type",
  );
  const bench = await placeholderLot(lead, supplierId, flex, 50);
  await must(api(lead, "PATCH", `/api/units/${bench.unitIds[0]}`, { serial: `FX-BENCH-${tag()}` }), 200, "serial");
  const { lot: empty } = await must(api<{ lot: { id: string } }>(lead, "POST", "/api/lots", lotBody({ supplierId, partTypeId: flex })), 201, "empty lot");
  // A battery lot of 2: any critical defect rejects, so one swollen cell gives a verdict to act on.
  const decidable = await placeholderLot(lead, supplierId, slugs.battery, 2);
  await must(api(lead, "PATCH", `/api/units/${decidable.unitIds[0]}`, { serial: `FX-BAT-${tag()}` }), 200, "battery serial");
  await must(api(lead, "POST", `/api/units/${decidable.unitIds[0]}/checklist`, { itemId: "swelling", value: { pass: false } }), 200, "swelling result");
  return {
    lotId: bench.lotId,
    lotPartTypeId: flex,
    editPartTypeId: editable.id,
    benchUnitId: bench.unitIds[0],
    serialUnitId: bench.unitIds[1],
    emptyLotId: empty.id,
    decidableLotId: decidable.lotId,
  };
}
