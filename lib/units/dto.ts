/**
 * What the API says about one unit on the Bench: GET /api/units/:id answers it, and the unit page
 * hands the same value to the Bench as its first data, so the panels' queries start from what
 * they will refetch. Dates are ISO text on both paths (toUnitView makes them so, instead of a
 * JSON round trip and a cast); only the fields the Bench reads leave the server.
 */
import type { getUnitDetail, listUnitResults } from "@/db/queries/units";

type UnitDetail = NonNullable<Awaited<ReturnType<typeof getUnitDetail>>>;
type UnitResultRow = Awaited<ReturnType<typeof listUnitResults>>[number];

export type UnitResultView = Omit<UnitResultRow, "unitId" | "recordedAt"> & { recordedAt: string };

export type UnitView = {
  unit: Pick<UnitDetail["unit"], "id" | "sampleIndex" | "serial" | "placeholder" | "status" | "leaseHolderId"> & { leaseExpiresAt: string | null };
  leaseHolderName: string | null;
  lot: UnitDetail["lot"];
  supplierName: string;
  partType: UnitDetail["partType"];
  results: UnitResultView[];
};

export function toUnitView(detail: UnitDetail, results: readonly UnitResultRow[]): UnitView {
  const { unit, lot, partType } = detail;
  return {
    unit: {
      id: unit.id,
      sampleIndex: unit.sampleIndex,
      serial: unit.serial,
      placeholder: unit.placeholder,
      status: unit.status,
      leaseHolderId: unit.leaseHolderId,
      leaseExpiresAt: unit.leaseExpiresAt?.toISOString() ?? null,
    },
    leaseHolderName: detail.leaseHolderName,
    lot: { id: lot.id, purchaseRef: lot.purchaseRef, status: lot.status, sampleSize: lot.sampleSize, quantity: lot.quantity },
    supplierName: detail.supplierName,
    partType: { id: partType.id, name: partType.name, category: partType.category, checklist: partType.checklist },
    results: results.map((r) => ({
      id: r.id,
      itemId: r.itemId,
      value: r.value,
      passed: r.passed,
      failureReason: r.failureReason,
      severityOnFail: r.severityOnFail,
      note: r.note,
      recordedAt: r.recordedAt.toISOString(),
      recordedByName: r.recordedByName,
    })),
  };
}
