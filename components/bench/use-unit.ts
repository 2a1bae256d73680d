"use client";

import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/http/client";
import { unitKeys } from "@/lib/query-keys/units";
import type { UnitView } from "@/lib/units/dto";

/** The unit as the Bench shows it; header and panels share one query. */
export function useUnit(unitId: string, initial: UnitView) {
  return useQuery({ queryKey: unitKeys.view(unitId), queryFn: () => apiFetch<UnitView>(`/api/units/${unitId}`), initialData: initial });
}

/** Whether the signed-in person can change this unit now, and if not, why. */
export function benchLock(view: UnitView, me: { id: string; isLead: boolean; canRecord: boolean }): string | null {
  if (!me.canRecord) return "Only inspectors and leads record checklist results.";
  if (view.lot.status !== "open") return "The lot is decided; this unit is closed.";
  if (view.unit.status !== "queued" && view.unit.status !== "on_bench") return "This unit is graded; its checklist is closed.";
  const leasedByOther = view.unit.status === "on_bench" && view.unit.leaseHolderId !== me.id && view.unit.leaseExpiresAt !== null && new Date(view.unit.leaseExpiresAt) > new Date();
  if (leasedByOther && !me.isLead) return `${view.leaseHolderName ?? "Another inspector"} has this unit on their bench; it is read-only for you.`;
  return null;
}
