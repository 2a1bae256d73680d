"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import Link from "next/link";
import { useMemo, useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { apiFetch } from "@/lib/http/client";
import type { LotSummary } from "@/lib/lots/dto";
import { DISPOSITION_LABELS, LOT_PAGE_SIZES, type LotSort } from "@/lib/lots/schemas";
import { InspectionSeverityBadge, VerdictBadge } from "./badges";

type Row = Omit<LotSummary, "createdAt"> & { createdAt: string };
type Page = { lots: Row[]; total: number; page: number; pageSize: number };
type Option = { id: string; name: string };

const column = createColumnHelper<Row>();
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

/** The Lots list: sorting, filters and pages are done by the server (GET /api/lots). */
export function LotTable({ suppliers, partTypes }: { suppliers: Option[]; partTypes: Option[] }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "dueOn", desc: false }]);
  const [pagination, setPagination] = useState({ pageIndex: 0, pageSize: 20 });
  const [filters, setFilters] = useState({ status: "all", supplierId: "", partTypeId: "", search: "" });
  const params = useMemo(() => {
    const p = new URLSearchParams({ page: String(pagination.pageIndex + 1), pageSize: String(pagination.pageSize), status: filters.status });
    if (sorting[0]) {
      p.set("sort", sorting[0].id as LotSort);
      p.set("dir", sorting[0].desc ? "desc" : "asc");
    }
    if (filters.supplierId) p.set("supplierId", filters.supplierId);
    if (filters.partTypeId) p.set("partTypeId", filters.partTypeId);
    if (filters.search.trim()) p.set("search", filters.search.trim());
    return p.toString();
  }, [sorting, pagination, filters]);
  const lots = useQuery({ queryKey: ["lots", params], queryFn: () => apiFetch<Page>(`/api/lots?${params}`), placeholderData: keepPreviousData });
  const total = lots.data?.total ?? 0;
  const table = useReactTable({
    data: lots.data?.lots ?? [],
    columns,
    state: { sorting, pagination },
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    rowCount: total,
    enableSortingRemoval: false,
    onSortingChange: (updater) => {
      setSorting(updater);
      setPagination((p) => ({ ...p, pageIndex: 0 }));
    },
    onPaginationChange: setPagination,
    getCoreRowModel: getCoreRowModel(),
  });
  const setFilter = (key: keyof typeof filters, value: string) => {
    setFilters((f) => ({ ...f, [key]: value }));
    setPagination((p) => ({ ...p, pageIndex: 0 }));
  };

  return (
    <div className="space-y-3">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4" role="search" aria-label="Filter lots">
        <label className="block">
          <span className="field-label">Purchase ref</span>
          <input className="field-input" value={filters.search} onChange={(e) => setFilter("search", e.target.value)} placeholder="e.g. PO-24" />
        </label>
        <label className="block">
          <span className="field-label">Status</span>
          <select className="field-input" value={filters.status} onChange={(e) => setFilter("status", e.target.value)}>
            <option value="all">All lots</option>
            <option value="open">Open</option>
            <option value="decided">Decided</option>
          </select>
        </label>
        <label className="block">
          <span className="field-label">Supplier</span>
          <select className="field-input" value={filters.supplierId} onChange={(e) => setFilter("supplierId", e.target.value)}>
            <option value="">All suppliers</option>
            {suppliers.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </select>
        </label>
        <label className="block">
          <span className="field-label">Part type</span>
          <select className="field-input" value={filters.partTypeId} onChange={(e) => setFilter("partTypeId", e.target.value)}>
            <option value="">All part types</option>
            {partTypes.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </select>
        </label>
      </div>
      {lots.isError && <FormMessage kind="error">{lots.error.message}</FormMessage>}
      <div className="card overflow-x-auto">
        <table className="min-w-full text-sm" data-testid="lot-table" aria-busy={lots.isFetching}>
          <thead className="bg-gauge-50 text-left text-xs uppercase tracking-wide text-gauge-600">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th key={header.id} scope="col" className={`whitespace-nowrap px-2 py-2 font-medium lg:px-3 ${cellClass(header.id)}`} aria-sort={sorted ? (sorted === "asc" ? "ascending" : "descending") : undefined}>
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
          {total === 0 ? "0 lots" : `${pagination.pageIndex * pagination.pageSize + 1}–${Math.min(total, (pagination.pageIndex + 1) * pagination.pageSize)} of ${total} lots`}
        </span>
        <div className="flex items-center gap-2">
          <label className="flex items-center gap-1">
            <span className="text-gauge-700">Per page</span>
            <select className="field-input w-20 py-1" value={pagination.pageSize} onChange={(e) => setPagination({ pageIndex: 0, pageSize: Number(e.target.value) })}>
              {LOT_PAGE_SIZES.map((n) => (
                <option key={n}>{n}</option>
              ))}
            </select>
          </label>
          <button type="button" className="btn-secondary py-1" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
            Previous
          </button>
          <span className="tabular-nums text-gauge-700">
            Page {pagination.pageIndex + 1} of {Math.max(1, table.getPageCount())}
          </span>
          <button type="button" className="btn-secondary py-1" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
            Next
          </button>
        </div>
      </nav>
    </div>
  );
}
