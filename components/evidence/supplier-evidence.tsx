"use client";

import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/http/client";
import { evidenceKeys } from "@/lib/query-keys/evidence";
import { EvidencePackItem } from "./evidence-pack-item";
import type { EvidencePackView } from "./types";

/** The supplier's claims (one per evidence pack), newest first, open ones counted. */
export function SupplierEvidence({ supplierId }: { supplierId: string }) {
  const data = useQuery({ queryKey: evidenceKeys.supplier(supplierId), queryFn: () => apiFetch<{ packs: EvidencePackView[] }>(`/api/suppliers/${supplierId}/evidence`) });
  const packs = data.data?.packs ?? [];
  const open = packs.filter((p) => p.claimStatus === "open").length;
  return (
    <section className="card space-y-3 p-5" aria-labelledby="claims-title" data-testid="supplier-claims">
      <h2 id="claims-title" className="text-lg font-semibold">
        Claims{" "}
        {packs.length > 0 && (
          <span className="text-sm font-normal text-gauge-600">
            ({open} open of {packs.length})
          </span>
        )}
      </h2>
      {data.isPending && <p className="text-sm text-gauge-600">Loading claims…</p>}
      {data.error && <p className="text-sm text-fault-700">{data.error.message}</p>}
      {data.isSuccess && packs.length === 0 && <p className="text-sm text-gauge-700">No evidence was sent to this supplier yet.</p>}
      <ul className="space-y-2">
        {packs.map((p) => (
          <EvidencePackItem key={p.id} pack={p} showLot />
        ))}
      </ul>
    </section>
  );
}
