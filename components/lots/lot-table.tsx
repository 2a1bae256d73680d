"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState, type Updater } from "@tanstack/react-table";
import Link from "next/link";
import { useMemo, useRef } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { revealTop } from "@/components/ui/use-list-params";
import { apiFetch } from "@/lib/http/client";
import type { LotSummary } from "@/lib/lots/dto";
import type { LotPage } from "@/lib/lots/list";
import { lotListParamsSchema } from "@/lib/lots/list-params";
import { DISPOSITION_LABELS, LOT_PAGE_SIZES, type LotSort } from "@/lib/lots/schemas";
import { lotKeys } from "@/lib/query-keys/lots";
import { listParamsSearch } from "@/lib/url-state/list-params";
import { InspectionSeverityBadge, VerdictBadge } from "./badges";
import { useLotListParams, type LotFilterOptions } from "./use-lot-list-params";

const column = createColumnHelper<LotSummary>();
const columns = [
  column.accessor("purchaseRef", {
    id: "purchaseRef",
    header: "Purchase ref",
    cell: ({ row }) => (
      <Link href={`/lots/${row.original.id}`} className="font-medium text-gauge-700 underline">
        {row.original.purchaseRef}
      </Link>
    ),
  }),
  column.accessor("supplierName", { id: "supplier", header: "Supplier" }),
  column.accessor("partTypeName", { id: "partType", header: "Part type" }),
  column.accessor("quantity", { id: "quantity", header: "Qty", cell: ({ getValue }) => getValue().toLocaleString("en-GB") }),
  column.accessor("receivedOn", { id: "receivedOn", header: "Received", cell: ({ getValue }) => <span className="whitespace-nowrap tabular-nums">{getValue()}</span> }),
  column.accessor("dueOn", { id: "dueOn", header: "Due", cell: ({ getValue }) => <span className="whitespace-nowrap tabular-nums">{getValue()}</span> }),
  column.display({ id: "inspection", header: "Inspection", cell: ({ row }) => <InspectionSeverityBadge severity={row.original.inspectionSeverity} /> }),
  column.display({
    id: "progress",
    header: "Inspected",
    cell: ({ row }) => {
      const r = row.original;
      return (
        <span className="whitespace-nowrap tabular-nums">
          {r.unitsInspected} / {r.sampleSize}
          {r.hundredPercent ? " (100 %)" : ""}
          {r.unitsCreated === 0 && <span className="ml-1 text-xs text-signal-700">no units yet</span>}
        </span>
      );
    },
  }),
  column.accessor("status", {
    id: "status",
    header: "Verdict",
    cell: ({ row }) => (
      <span className="flex flex-wrap items-center gap-1">
        <VerdictBadge verdict={row.original.verdict} />
        {row.original.status === "decided" && row.original.disposition ? (
          <span className="text-xs text-gauge-600">{DISPOSITION_LABELS[row.original.disposition]}</span>
        ) : (
          <span className="text-xs text-gauge-500">open</span>
        )}
      </span>
    ),
  }),
];
const SORTABLE = new Set<string>(["purchaseRef", "supplier", "partType", "quantity", "receivedOn", "dueOn", "status"]);
/** On tablets the progress and verdict matter more than quantity and received date: those hide below lg. */
const WIDE_ONLY = new Set<string>(["quantity", "receivedOn"]);
const cellClass = (id: string) => (WIDE_ONLY.has(id) ? "hidden lg:table-cell" : "");

/**
 * The Lots list: sorting, filters and pages are done by the server (GET /api/lots) and held in the
 * URL. The Lots page renders the first page on the server into this query's cache (`Prefetched`).
 */
export function LotTable({ options }: { options: LotFilterOptions }) {
  const { params, go, isBehindUrl } = useLotListParams(options);
  const top = useRef<HTMLDivElement>(null);
  const turnTo = (page: number) => {
    if (isBehindUrl()) return;
    go({ page });
    revealTop(top.current);
  };
  const lots = useQuery({
    queryKey: lotKeys.list(params),
    queryFn: () => apiFetch<LotPage>(`/api/lots${listParamsSearch(lotListParamsSchema, params)}`),
    placeholderData: keepPreviousData,
  });
  const total = lots.data?.total ?? 0;
  // Derived from the URL, and kept the same between renders: table state that changes identity on
  // every render makes TanStack Table recompute (and, with its own row models, reset) each time.
  const sorting: SortingState = useMemo(() => [{ id: params.sort, desc: params.dir === "desc" }], [params.sort, params.dir]);
  const pagination = useMemo(() => ({ pageIndex: params.page - 1, pageSize: params.pageSize }), [params.page, params.pageSize]);
  const onSortingChange = (updater: Updater<SortingState>) => {
    const next = (typeof updater === "function" ? updater(sorting) : updater)[0];
    if (next) go({ sort: next.id as LotSort, dir: next.desc ? "desc" : "asc", page: 1 });
  };
  const table = useReactTable({
    data: lots.data?.lots ?? [],
    columns,
    state: { sorting, pagination },
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    rowCount: total,
    enableSortingRemoval: false,
    onSortingChange,
    getCoreRowModel: getCoreRowModel(),
  });
  const pageCount = Math.max(1, table.getPageCount());
  // While a new filter's page loads, or the URL has moved on and this render has not caught up,
  // the count shown is the previous list's: no paging from it.
  const settled = !lots.isPlaceholderData;
  const pastTheEnd = lots.isSuccess && total > 0 && params.page > pageCount;

  return (
    <div ref={top} className="scroll-mt-4 space-y-3">
      {lots.isError && <FormMessage kind="error">{lots.error.message}</FormMessage>}
      <div className="card overflow-x-auto">
        <table className={`min-w-full text-sm ${lots.isPlaceholderData ? "opacity-60" : ""}`} data-testid="lot-table" aria-busy={lots.isFetching}>
          <thead className="bg-gauge-50 text-left text-xs uppercase tracking-wide text-gauge-600">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      className={`whitespace-nowrap px-2 py-2 font-medium lg:px-3 ${cellClass(header.id)}`}
                      aria-sort={sorted ? (sorted === "asc" ? "ascending" : "descending") : undefined}
                    >
                      {SORTABLE.has(header.id) ? (
                        <button type="button" onClick={header.column.getToggleSortingHandler()} className="uppercase">
                          {flexRender(header.column.columnDef.header, header.getContext())}
                          {{ asc: " ↑", desc: " ↓" }[sorted as string] ?? ""}
                        </button>
                      ) : (
                        flexRender(header.column.columnDef.header, header.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className="divide-y divide-gauge-100">
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} data-testid={`lot-row-${row.original.purchaseRef}`}>
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className={`px-2 py-2 align-top lg:px-3 ${cellClass(cell.column.id)}`}>
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {lots.isSuccess && total === 0 && (
              <tr>
                <td colSpan={columns.length} className="px-4 py-6 text-center text-gauge-600">
                  No lots match these filters.
                </td>
              </tr>
            )}
            {pastTheEnd && (
              <tr>
                <td colSpan={columns.length} className="px-4 py-6 text-center text-gauge-600">
                  This list has {pageCount} page{pageCount === 1 ? "" : "s"}; page {params.page} is past its end.{" "}
                  <button type="button" className="font-medium text-gauge-700 underline" onClick={() => go({ page: 1 })}>
                    Go to the first page
                  </button>
                </td>
              </tr>
            )}
            {lots.isPending && (
              <tr>
                <td colSpan={columns.length} className="px-4 py-6 text-center text-gauge-600">
                  Loading lots…
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <nav className="flex flex-wrap items-center justify-between gap-3 text-sm" aria-label="Lot pages">
        <span className="text-gauge-700">
          {total === 0 || pastTheEnd ? `${total} lots` : `${pagination.pageIndex * pagination.pageSize + 1}–${Math.min(total, (pagination.pageIndex + 1) * pagination.pageSize)} of ${total} lots`}
        </span>
        <div className="flex items-center gap-2">
          <label className="flex items-center gap-1">
            <span className="text-gauge-700">Per page</span>
            <select className="field-input w-20 py-1" value={pagination.pageSize} onChange={(e) => go({ pageSize: Number(e.target.value), page: 1 })}>
              {LOT_PAGE_SIZES.map((n) => (
                <option key={n}>{n}</option>
              ))}
            </select>
          </label>
          <button type="button" className="btn-secondary py-1" onClick={() => turnTo(Math.min(params.page, pageCount + 1) - 1)} disabled={params.page <= 1 || !settled}>
            Previous
          </button>
          <span className="tabular-nums text-gauge-700">
            Page {params.page} of {pageCount}
          </span>
          <button type="button" className="btn-secondary py-1" onClick={() => turnTo(params.page + 1)} disabled={params.page >= pageCount || !settled}>
            Next
          </button>
        </div>
      </nav>
    </div>
  );
}
