import { describe, expect, it } from "vitest";
import { toUnitView } from "@/lib/units/dto";

const recordedAt = new Date("2026-11-30T09:10:11.123Z");
const leaseExpiresAt = new Date("2026-11-30T09:40:00.000Z");
// Only the fields toUnitView reads; the row types come from the queries.
const detail = {
  unit: { id: "u1", sampleIndex: 3, serial: "SN-1", placeholder: false, status: "on_bench", leaseHolderId: "p1", leaseExpiresAt, workspaceId: "w1", lotId: "l1" },
  leaseHolderName: "Inspector",
  lot: { id: "l1", purchaseRef: "PO-1", status: "open", sampleSize: 13, quantity: 120 },
  supplierName: "Supplier",
  partType: { id: "pt1", name: "Flex", category: "flex", checklist: [] },
} as unknown as Parameters<typeof toUnitView>[0];
const results = [
  { id: "r1", unitId: "u1", itemId: "power", value: { pass: false }, passed: false, failureReason: "Failed.", severityOnFail: "major", note: "", recordedAt, recordedByName: "Inspector" },
] as Parameters<typeof toUnitView>[1];

describe("toUnitView", () => {
  it("gives dates as ISO text, so the page's first data equals the API's JSON", () => {
    const view = toUnitView(detail, results);
    expect(view.unit.leaseExpiresAt).toBe("2026-11-30T09:40:00.000Z");
    expect(view.results[0].recordedAt).toBe("2026-11-30T09:10:11.123Z");
    expect(JSON.parse(JSON.stringify(view))).toEqual(view);
  });

  it("sends only what the Bench reads (no workspace or lot ids of the row, no unit id per result)", () => {
    const view = toUnitView(detail, results);
    expect(Object.keys(view.unit).sort()).toEqual(["id", "leaseExpiresAt", "leaseHolderId", "placeholder", "sampleIndex", "serial", "status"]);
    expect(view.results[0]).not.toHaveProperty("unitId");
    expect(toUnitView({ ...detail, unit: { ...detail.unit, leaseExpiresAt: null } }, []).unit.leaseExpiresAt).toBeNull();
  });
});
