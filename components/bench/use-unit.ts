"use client";

import { useQuery } from "@tanstack/react-query";
import type { ChecklistItem, UnitStatus } from "@/db/schema/lots";
import type { ChecklistValue } from "@/lib/checklist/evaluate";
import { apiFetch } from "@/lib/http/client";
import type { DefectSeverity } from "@/lib/part-types/severity";
import { unitKeys } from "@/lib/query-keys/units";

/** What GET /api/units/[id] answers (dates as ISO text). */
export type UnitView = {
  unit: { id: string; sampleIndex: number; serial: string | null; placeholder: boolean; status: UnitStatus; leaseHolderId: string | null; leaseExpiresAt: string | null };
  leaseHolderName: string | null;
  lot: { id: string; purchaseRef: string; status: "open" | "decided"; sampleSize: number; quantity: number };
  supplierName: string;
  partType: { id: string; name: string; category: string; checklist: ChecklistItem[] };
  results: { id: string; itemId: string; value: ChecklistValue; passed: boolean; failureReason: string | null; severityOnFail: DefectSeverity; note: string; recordedAt: string; recordedByName: string }[];
};

/** The unit as the Bench shows it; header and panels share one query. */
export function useUnit(unitId: string, initial: UnitView) {
  return useQuery({ queryKey: unitKeys.view(unitId), queryFn: () => apiFetch<UnitView>(`/api/units/${unitId}`), initialData: initial });
}
