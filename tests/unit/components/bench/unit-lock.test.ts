/**
 * Who may change a unit on the Bench right now: the Bench's reading of lib/units/editability.ts
 * (the rule table itself is tests/unit/units/editability.test.ts), with the browser's clock.
 */
import { describe, expect, it } from "vitest";
import { benchNotice, unitLock, type BenchPerson } from "@/components/bench/unit-lock";
import type { UnitView } from "@/lib/units/dto";

const now = new Date("2026-12-02T10:00:00Z");
function view(unit: Partial<UnitView["unit"]> = {}, lot: Partial<UnitView["lot"]> = {}): UnitView {
  return {
    unit: { id: "u", sampleIndex: 1, serial: "S", placeholder: false, status: "on_bench", leaseHolderId: "me", leaseExpiresAt: "2026-12-02T10:20:00Z", ...unit },
    leaseHolderName: "Ines",
    lot: { id: "l", purchaseRef: "PO", status: "open", sampleSize: 5, quantity: 50, ...lot },
    supplierName: "S",
    partType: { id: "p", name: "P", category: "camera", checklist: [] },
    results: [],
  };
}
const inspector: BenchPerson = { id: "me", roles: ["inspector"], timeZone: "UTC" };
const lead: BenchPerson = { id: "me", roles: ["lead"], timeZone: "UTC" };
const auditor: BenchPerson = { id: "me", roles: ["auditor"], timeZone: "UTC" };

describe("unit lock", () => {
  it("lets the lease holder and a waiting unit's inspector edit", () => {
    expect(unitLock(view(), inspector, "regions", now)).toBeNull();
    expect(unitLock(view({ status: "queued", leaseHolderId: null, leaseExpiresAt: null }), inspector, "regions", now)).toBeNull();
  });

  it("is read-only while someone else's lease runs, for a lead's regions too; an expired lease frees it", () => {
    const other = view({ leaseHolderId: "ines" });
    expect(unitLock(other, inspector, "regions", now)).toBe("Ines has this unit on their bench (lease until 10:20), so it is read-only for you.");
    expect(unitLock(other, { ...lead, id: "lead" }, "regions", now)).not.toBeNull();
    expect(unitLock(other, { ...lead, id: "lead" }, "checklist", now)).toBeNull();
    expect(unitLock(view({ leaseHolderId: "ines", leaseExpiresAt: "2026-12-02T09:59:59Z" }), inspector, "regions", now)).toBeNull();
  });

  it("closes graded units, decided lots and people without the inspector role", () => {
    expect(unitLock(view({ status: "graded" }), inspector, "regions", now)).toBe("This unit is graded, so its regions are part of the record and can no longer change.");
    expect(unitLock(view({}, { status: "decided" }), inspector, "checklist", now)).toMatch(/lot is decided/);
    expect(unitLock(view(), auditor, "regions", now)).toMatch(/needs the Inspector role/);
  });

  it("lets photos be added on someone else's bench, but not changed", () => {
    const other = view({ leaseHolderId: "ines" });
    expect(unitLock(other, inspector, "upload", now)).toBeNull();
    expect(unitLock(other, inspector, "photos", now)).toMatch(/read-only for you/);
  });
});

describe("the Bench's one read-only banner", () => {
  it("says nothing when the unit is yours to change", () => {
    expect(benchNotice(view(), inspector, now)).toBeNull();
  });

  it("names the holder once, and tells a lead what they may still do", () => {
    const other = view({ leaseHolderId: "ines" });
    expect(benchNotice(other, inspector, now)).toEqual({ tone: "held", text: unitLock(other, inspector, "regions", now) });
    expect(benchNotice(other, { ...lead, id: "lead" }, now)?.text).toMatch(/so it is read-only for you\. As a lead you may still correct checklist results\.$/);
  });

  it("tells closed units and view-only people apart", () => {
    expect(benchNotice(view({ status: "graded" }), inspector, now)?.tone).toBe("closed");
    expect(benchNotice(view(), auditor, now)?.tone).toBe("view-only");
  });
});
