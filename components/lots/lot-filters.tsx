"use client";

import { useEffect, useState } from "react";
import { IgnoredParamsNote } from "@/components/ui/ignored-params-note";
import { LOT_LIST_LABELS } from "@/lib/lots/list-params";
import { useLotListParams, type LotFilterOptions } from "./use-lot-list-params";

/** Typing waits this long before the list follows, so each keystroke is not a request. */
const SEARCH_DELAY_MS = 300;

/** The Lots filters; they write the URL, which the table reads. */
export function LotFilters({ options }: { options: LotFilterOptions }) {
  const { params, ignored, setFilters } = useLotListParams(options);
  const [search, setSearch] = useState(params.search ?? "");
  // When the URL's search changes from outside (back, forward, a link), the box follows it.
  const [searchInUrl, setSearchInUrl] = useState(params.search);
  if (params.search !== searchInUrl) {
    setSearchInUrl(params.search);
    setSearch(params.search ?? "");
  }
  useEffect(() => {
    const wanted = search.trim();
    if (wanted === (params.search ?? "")) return;
    // Typing replaces the history entry: back leaves the list, not the last keystroke.
    const timer = setTimeout(() => setFilters({ search: wanted || undefined }, "replace"), SEARCH_DELAY_MS);
    return () => clearTimeout(timer);
  }, [search, params.search, setFilters]);

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
