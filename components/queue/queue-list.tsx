"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { FormMessage } from "@/components/ui/form-field";
import { apiFetch } from "@/lib/http/client";
import type { QueuePage } from "@/lib/queue/list";
import { queueApiSearch, type QueueFilterOptions } from "@/lib/queue/list-params";
import { queueKeys } from "@/lib/query-keys/queue";
import { QueueTable } from "./queue-table";
import { useQueueListParams } from "./use-queue-list-params";

/**
 * The Queue list, one keyset page at a time, refreshed every 15 s. The page is in the URL as the
 * row it starts after (or ends before) plus its number; the Queue page renders the first page
 * on the server into this query's cache.
 */
export function QueueList({ options }: { options: QueueFilterOptions }) {
  const { params, go } = useQueueListParams(options);
  const list = useQuery({
    queryKey: queueKeys.list(params),
    queryFn: () => apiFetch<QueuePage>(`/api/queue${queueApiSearch(params)}`),
    placeholderData: keepPreviousData,
    refetchInterval: 15_000,
  });
  const page = params.page ?? 1;
  const data = list.data;
  const firstPage = { cursor: undefined, before: undefined, page: undefined };
  const previous = () => go(page === 2 || !data?.prevCursor ? firstPage : { cursor: undefined, before: data.prevCursor, page: page - 1 });
  const next = () => data?.nextCursor && go({ cursor: data.nextCursor, before: undefined, page: page + 1 });
  const emptyLaterPage = list.isSuccess && !list.isPlaceholderData && page > 1 && data?.units.length === 0;
  const filtered = Boolean(params.partTypeId || params.supplierId || params.lotId);
  const emptyText = emptyLaterPage ? "Nothing is left on this page: the units were taken or their lots closed." : filtered ? "No units in open lots match these filters." : undefined;

  return (
    <div className="space-y-3">
      {list.isError && <FormMessage kind="error">{list.error.message}</FormMessage>}
      <div className={list.isPlaceholderData ? "opacity-60" : ""} aria-busy={list.isFetching}>
        <QueueTable rows={data?.units ?? []} loading={list.isPending} emptyText={emptyText} />
      </div>
      {(page > 1 || data?.nextCursor) && (
        <nav className="flex flex-wrap items-center justify-end gap-2 text-sm" aria-label="Queue pages">
          <button type="button" className="btn-secondary py-1" onClick={previous} disabled={page <= 1}>
            Previous
          </button>
          <span className="tabular-nums text-gauge-700" data-testid="queue-page">
            Page {page}
          </span>
          <button type="button" className="btn-secondary py-1" onClick={next} disabled={!data?.nextCursor}>
            Next
          </button>
        </nav>
      )}
    </div>
  );
}
