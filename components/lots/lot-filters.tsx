"use client";

import { useCallback } from "react";
import { IgnoredParamsNote } from "@/components/ui/ignored-params-note";
import { useSearchBox } from "@/components/ui/use-search-box";
import { LOT_LIST_LABELS } from "@/lib/lots/list-params";
import { useLotListParams, type LotFilterOptions } from "./use-lot-list-params";

/** The Lots filters; they write the URL, which the table reads. */
export function LotFilters({ options }: { options: LotFilterOptions }) {
  const { params, ignored, setFilters } = useLotListParams(options);
  const [search, setSearch] = useSearchBox(
    params.search,
    useCallback((value: string | undefined) => setFilters({ search: value }, "replace"), [setFilters]),
  );

  return (
    <div className="space-y-3">
      <IgnoredParamsNote ignored={ignored} labels={LOT_LIST_LABELS} />
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4" role="search" aria-label="Filter lots">
        <label className="block">
          <span className="field-label">Purchase ref</span>
          <input className="field-input" value={search} maxLength={60} onChange={(e) => setSearch(e.target.value)} placeholder="e.g. PO-24" />
        </label>
        <label className="block">
          <span className="field-label">Status</span>
          <select className="field-input" value={params.status} onChange={(e) => setFilters({ status: e.target.value as typeof params.status })}>
            <option value="all">All lots</option>
            <option value="open">Open</option>
            <option value="decided">Decided</option>
          </select>
        </label>
        <label className="block">
          <span className="field-label">Supplier</span>
          <select className="field-input" value={params.supplierId ?? ""} onChange={(e) => setFilters({ supplierId: e.target.value || undefined })}>
            <option value="">All suppliers</option>
            {options.suppliers.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </select>
        </label>
        <label className="block">
          <span className="field-label">Part type</span>
          <select className="field-input" value={params.partTypeId ?? ""} onChange={(e) => setFilters({ partTypeId: e.target.value || undefined })}>
            <option value="">All part types</option>
            {options.partTypes.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </select>
        </label>
      </div>
    </div>
  );
}
