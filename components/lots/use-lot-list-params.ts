"use client";

import { useMemo } from "react";
import { useListParams } from "@/components/ui/use-list-params";
import { LOT_LIST_PAGE_KEYS, lotListAllowed, lotListParamsSchema } from "@/lib/lots/list-params";

export type LotFilterOptions = { suppliers: { id: string; name: string }[]; partTypes: { id: string; name: string }[] };

/** The Lots list's filters, sort and page, from the URL (the filters and the table read the same). */
export function useLotListParams(options: LotFilterOptions) {
  const allowed = useMemo(() => lotListAllowed(options), [options]);
  return useListParams(lotListParamsSchema, { allowed, pageKeys: LOT_LIST_PAGE_KEYS });
}
