"use client";

import { useMemo } from "react";
import { useListParams } from "@/components/ui/use-list-params";
import { QUEUE_LIST_PAGE_KEYS, queueListAllowed, queueListParamsSchema, type QueueFilterOptions } from "@/lib/queue/list-params";

/** The Queue's filters and page, from the URL (the filters, Take next and the list read the same). */
export function useQueueListParams(options: QueueFilterOptions) {
  const allowed = useMemo(() => queueListAllowed(options), [options]);
  return useListParams(queueListParamsSchema, { allowed, pageKeys: QUEUE_LIST_PAGE_KEYS });
}
