"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useCallback } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { IgnoredParamsNote } from "@/components/ui/ignored-params-note";
import { useListParams } from "@/components/ui/use-list-params";
import { useSearchBox } from "@/components/ui/use-search-box";
import { apiFetch } from "@/lib/http/client";
import { supplierKeys } from "@/lib/query-keys/suppliers";
import { supplierListQuerySchema } from "@/lib/suppliers/schemas";
import { listParamsSearch } from "@/lib/url-state/list-params";

type SupplierRow = { id: string; name: string; contactName: string | null; contactEmail: string; active: boolean };

/** The Suppliers list; its search is in the URL (`/suppliers?search=…`). */
export function SupplierList() {
  const { params, ignored, setFilters } = useListParams(supplierListQuerySchema);
  const [search, setSearch] = useSearchBox(
    params.search,
    useCallback((value: string | undefined) => setFilters({ search: value }, "replace"), [setFilters]),
  );
  const suppliers = useQuery({
    queryKey: supplierKeys.list(params),
    queryFn: () => apiFetch<{ suppliers: SupplierRow[] }>(`/api/suppliers${listParamsSearch(supplierListQuerySchema, params)}`).then((d) => d.suppliers),
    placeholderData: keepPreviousData,
  });
  return (
    <div className="space-y-3">
      <IgnoredParamsNote ignored={ignored} labels={{ search: "search" }} />
      <label className="block max-w-xs">
        <span className="field-label">Search</span>
        <input className="field-input" value={search} maxLength={100} onChange={(e) => setSearch(e.target.value)} placeholder="Name or e-mail" />
      </label>
      {suppliers.isError && <FormMessage kind="error">{suppliers.error.message}</FormMessage>}
      <div className="card overflow-x-auto">
        <table className="min-w-full text-sm" data-testid="supplier-table">
          <thead className="bg-gauge-50 text-left text-xs uppercase tracking-wide text-gauge-600">
            <tr>
              <th scope="col" className="px-4 py-2">
                Supplier
              </th>
              <th scope="col" className="px-4 py-2">
                Contact
              </th>
              <th scope="col" className="px-4 py-2">
                E-mail
              </th>
              <th scope="col" className="px-4 py-2">
                Status
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-gauge-100">
            {suppliers.data?.map((s) => (
              <tr key={s.id}>
                <td className="px-4 py-2">
                  <Link href={`/suppliers/${s.id}`} className="font-medium text-gauge-700 underline">
                    {s.name}
                  </Link>
                </td>
                <td className="px-4 py-2">{s.contactName ?? "—"}</td>
                <td className="px-4 py-2">{s.contactEmail}</td>
                <td className="px-4 py-2">{s.active ? "Active" : "Inactive"}</td>
              </tr>
            ))}
            {suppliers.data?.length === 0 && (
              <tr>
                <td colSpan={4} className="px-4 py-6 text-center text-gauge-600">
                  No suppliers{params.search ? " match that search" : " yet"}.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
