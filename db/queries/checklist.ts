import "server-only";
import { type DbOrTx } from "@/db/client";
import { checklistResults, type ChecklistResult } from "@/db/schema";

export type ChecklistResultValues = Pick<ChecklistResult, "value" | "passed" | "failureReason" | "severityOnFail" | "note" | "recordedBy" | "recordedAt">;

/** Stores an item's result on a unit; the latest result per item is kept (checklist_results_unit_item_key). */
export async function upsertChecklistResult(tx: DbOrTx, { workspaceId, unitId, itemId, values }: { workspaceId: string; unitId: string; itemId: string; values: ChecklistResultValues }) {
  const [row] = await tx
    .insert(checklistResults)
    .values({ workspaceId, unitId, itemId, ...values })
    .onConflictDoUpdate({ target: [checklistResults.unitId, checklistResults.itemId], set: values })
    .returning();
  return row;
}
