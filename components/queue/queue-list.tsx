"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { useRef } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { revealTop } from "@/components/ui/use-list-params";
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
  const { params, go, isBehindUrl } = useQueueListParams(options);
  const top = useRef<HTMLDivElement>(null);
  const list = useQuery({
    queryKey: queueKeys.list(params),
    queryFn: () => apiFetch<QueuePage>(`/api/queue${queueApiSearch(params)}`),
    placeholderData: keepPreviousData,
    refetchInterval: 15_000,
  });
  const page = params.page ?? 1;
  const data = list.data;
  // While a new filter's page loads (or the URL has moved on and this render has not caught up),
  // the rows and cursors shown are the previous list's: paging from them would open a page of the
  // wrong list.
  const settled = !list.isPlaceholderData;
  const firstPage = { cursor: undefined, before: undefined, page: undefined };
  const turn = (patch: Parameters<typeof go>[0]) => {
    if (isBehindUrl()) return;
    go(patch);
    revealTop(top.current);
  };
  const previous = () => turn(page === 2 || !data?.prevCursor ? firstPage : { cursor: undefined, before: data.prevCursor, page: page - 1 });
  const next = () => data?.nextCursor && turn({ cursor: data.nextCursor, before: undefined, page: page + 1 });
  const emptyLaterPage = list.isSuccess && !list.isPlaceholderData && page > 1 && data?.units.length === 0;
  const filtered = Boolean(params.partTypeId || params.supplierId || params.lotId);
  const emptyText = emptyLaterPage ? "Nothing is left on this page: the units were taken or their lots closed." : filtered ? "No units in open lots match these filters." : undefined;

  return (
    <div ref={top} className="scroll-mt-4 space-y-3">
      {list.isError && <FormMessage kind="error">{list.error.message}</FormMessage>}
      <div className={list.isPlaceholderData ? "opacity-60" : ""} aria-busy={list.isFetching}>
        <QueueTable rows={data?.units ?? []} loading={list.isPending} emptyText={emptyText} />
      </div>
      {(page > 1 || data?.nextCursor) && (
        <nav className="flex flex-wrap items-center justify-end gap-2 text-sm" aria-label="Queue pages">
          <button type="button" className="btn-secondary py-1" onClick={previous} disabled={page <= 1 || !settled}>
            Previous
          </button>
          <span className="tabular-nums text-gauge-700" data-testid="queue-page">
            Page {page}
          </span>
          <button type="button" className="btn-secondary py-1" onClick={next} disabled={!data?.nextCursor || !settled}>
            Next
          </button>
        </nav>
      )}
    </div>
  );
}
