/** Minimal part type / supplier / lot / unit rows for tests that need many units quickly. */
import crypto from "node:crypto";
import { db } from "@/db/client";
import { lots, partTypes, suppliers, units, type StoredSamplingPlan } from "@/db/schema";

const tag = () => crypto.randomBytes(4).toString("hex");

export async function createPartTypeAndSupplier(workspaceId: string) {
  const t = tag();
  const [partType] = await db()
    .insert(partTypes)
    .values({
      workspaceId,
      slug: `fixture-${t}`,
      name: `Fixture part ${t}`,
      category: "battery",
      views: [{ key: "front", label: "Front", required: true, zones: [] }],
      defectClasses: [{ key: "scratch", label: "Scratch", severity: "minor" }],
      checklist: [],
    })
    .returning();
  const [supplier] = await db()
    .insert(suppliers)
    .values({ workspaceId, name: `Fixture supplier ${t}`, contactEmail: "fixture@supplier.example" })
    .returning();
  return { partType, supplier };
}

function planFor(quantity: number): StoredSamplingPlan {
  const cell = { aql: 1, codeLetter: "A", planLetter: "A", sampleSize: quantity, accept: 0, reject: 1 };
  return {
    standard: "ISO 2859-1 single sampling",
    lotSize: quantity,
    level: "II",
    severity: "normal",
    sampleSize: quantity,
    hundredPercent: true,
    byDefectSeverity: { critical: cell, major: cell, minor: cell },
    switchingReason: "fixture",
  };
}

/** One open lot with `count` queued units (inserted in chunks). */
export async function createLotWithUnits({
  workspaceId,
  createdBy,
  count,
  dueOn = "2026-12-20",
  receivedOn = "2026-12-01",
  partTypeId,
  supplierId,
}: {
  workspaceId: string;
  createdBy: string;
  count: number;
  dueOn?: string;
  receivedOn?: string;
  partTypeId: string;
  supplierId: string;
}) {
  const [lot] = await db()
    .insert(lots)
    .values({
      workspaceId,
      supplierId,
      partTypeId,
      purchaseRef: `PO-FIX-${tag()}`,
      quantity: count,
      receivedOn,
      dueOn,
      inspectionLevel: "II",
      aqlCritical: null,
      aqlMajor: 1,
      aqlMinor: 2.5,
      inspectionSeverity: "normal",
      plan: planFor(count),
      createdBy,
    })
    .returning();
  for (let start = 0; start < count; start += 2000) {
    const rows = [];
    for (let i = start; i < Math.min(count, start + 2000); i++) {
      rows.push({
        workspaceId,
        lotId: lot.id,
        sampleIndex: i + 1,
        serial: `FX-${lot.id.slice(0, 6)}-${String(i + 1).padStart(6, "0")}`,
        partTypeId,
        supplierId,
        lotDueOn: dueOn,
        lotReceivedOn: receivedOn,
        lotCreatedAt: lot.createdAt,
      });
    }
    await db().insert(units).values(rows);
  }
  return lot;
}
