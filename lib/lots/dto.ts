/** What the lot API sends: plain JSON shapes for the list and the lot page. */
import type { LotRow } from "@/db/queries/lots";
import type { LotProgress } from "./progress";

export function lotSummary(row: Pick<LotRow, "lot" | "supplierName" | "partTypeName">, progress: LotProgress) {
  const { lot } = row;
  return {
    id: lot.id,
    purchaseRef: lot.purchaseRef,
    supplierId: lot.supplierId,
    supplierName: row.supplierName,
    partTypeId: lot.partTypeId,
    partTypeName: row.partTypeName,
    modelFamily: lot.modelFamily,
    quantity: lot.quantity,
    receivedOn: lot.receivedOn,
    dueOn: lot.dueOn,
    inspectionLevel: lot.inspectionLevel,
    inspectionSeverity: lot.inspectionSeverity,
    promisedGrade: lot.promisedGrade,
    sampleSize: lot.plan.sampleSize,
    hundredPercent: lot.plan.hundredPercent,
    unitsCreated: progress.unitsCreated,
    unitsInspected: progress.verdict.unitsInspected,
    // A decided lot shows the verdict it was decided on; an open one its running verdict.
    verdict: lot.status === "decided" && lot.verdict ? lot.verdict : progress.verdict.verdict,
    status: lot.status,
    disposition: lot.disposition,
    // An ISO string, as JSON carries it: the Lots page hands the same object to the browser's cache.
    createdAt: lot.createdAt.toISOString(),
  };
}
export type LotSummary = ReturnType<typeof lotSummary>;
