/** Who may mark regions on the Bench right now (mirrors lib/regions/regions.ts). */
import { describe, expect, it } from "vitest";
import { annotateLock, benchNotice, otherHolder } from "@/components/bench/annotate-lock";
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
const inspector = { id: "me", isLead: false, canRecord: true };

describe("annotate lock", () => {
  it("lets the lease holder and a waiting unit's inspector edit", () => {
    expect(annotateLock(view(), inspector, now)).toBeNull();
    expect(annotateLock(view({ status: "queued", leaseHolderId: null, leaseExpiresAt: null }), inspector, now)).toBeNull();
  });

  it("is read-only while someone else's lease runs, for leads too; an expired lease frees it", () => {
    const other = view({ leaseHolderId: "ines" });
    expect(annotateLock(other, inspector, now)).toMatch(/^Ines has this unit on their bench \(lease until .+\), so it is read-only for you\.$/);
    expect(annotateLock(other, { ...inspector, isLead: true }, now)).not.toBeNull();
    expect(otherHolder(other, inspector, now)).toBe("Ines");
    expect(annotateLock(view({ leaseHolderId: "ines", leaseExpiresAt: "2026-12-02T09:59:59Z" }), inspector, now)).toBeNull();
  });

  it("closes graded units, decided lots and people without the inspector role", () => {
    expect(annotateLock(view({ status: "graded" }), inspector, now)).toBe("This unit is graded; its regions are part of the record and can no longer change.");
    expect(annotateLock(view({}, { status: "decided" }), inspector, now)).toMatch(/lot is decided/);
    expect(annotateLock(view(), { ...inspector, canRecord: false }, now)).toMatch(/needs the inspector role/);
  });
});

describe("the Bench's one read-only banner", () => {
  it("says nothing when the unit is yours to change", () => {
    expect(benchNotice(view(), inspector, now)).toBeNull();
  });

  it("names the holder once, and tells a lead what they may still do", () => {
    const other = view({ leaseHolderId: "ines" });
    expect(benchNotice(other, inspector, now)).toEqual({ tone: "held", text: annotateLock(other, inspector, now) });
    expect(benchNotice(other, { ...inspector, isLead: true }, now)?.text).toMatch(/so it is read-only for you\. As a lead you may still correct checklist results\.$/);
  });

  it("tells closed units and view-only people apart", () => {
    expect(benchNotice(view({ status: "graded" }), inspector, now)?.tone).toBe("closed");
    expect(benchNotice(view(), { ...inspector, canRecord: false }, now)?.tone).toBe("view-only");
  });
});
