"use client";

import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/http/client";
import { unitKeys } from "@/lib/query-keys/units";
import type { UnitView } from "@/lib/units/dto";

/** The unit as the Bench shows it; header and panels share one query. */
export function useUnit(unitId: string, initial: UnitView) {
  return useQuery({ queryKey: unitKeys.view(unitId), queryFn: () => apiFetch<UnitView>(`/api/units/${unitId}`), initialData: initial });
}
