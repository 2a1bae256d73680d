"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { IgnoredParamsNote } from "@/components/ui/ignored-params-note";
import { apiFetch } from "@/lib/http/client";
import type { QueueStats } from "@/lib/queue/list";
import { QUEUE_LIST_LABELS, type QueueFilterOptions } from "@/lib/queue/list-params";
import { queueKeys } from "@/lib/query-keys/queue";
import { QueueFiltersBar } from "./queue-filters";
import { useQueueListParams } from "./use-queue-list-params";

/** The Queue screen's controls: depth and throughput, the filters (in the URL) and Take next with the same filters. The list is QueueList. */
export function QueueBoard({ options }: { options: QueueFilterOptions }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const { params, ignored, setFilters } = useQueueListParams(options);
  const filters = { partTypeId: params.partTypeId, supplierId: params.supplierId, lotId: params.lotId };
  const [message, setMessage] = useState<{ kind: "error" | "success"; text: string } | null>(null);

  const stats = useQuery({ queryKey: queueKeys.stats(), queryFn: () => apiFetch<QueueStats>("/api/queue/stats"), refetchInterval: 15_000 });
  const takeNext = useMutation({
    mutationFn: () => apiFetch<{ unit: { id: string } } | undefined>("/api/queue/next", { method: "POST", body: Object.fromEntries(Object.entries(filters).filter(([, v]) => v)) }),
    onSuccess: (data) => {
      if (!data) {
        setMessage({ kind: "success", text: "Nothing is waiting for these filters. Well done." });
        void queryClient.invalidateQueries({ queryKey: queueKeys.all });
        return;
      }
      router.push(`/units/${data.unit.id}`);
    },
    onError: (err) => setMessage({ kind: "error", text: err.message }),
  });

  return (
    <div className="space-y-5">
      <section aria-label="Queue depth and throughput" className="grid gap-3 sm:grid-cols-3" data-testid="queue-stats">
        {[
          ["Waiting", stats.data?.waiting],
          ["On a bench", stats.data?.onBench],
          ["Graded today", stats.data?.gradedToday],
        ].map(([label, value]) => (
          <div key={label as string} className="card p-4">
            <div className="text-sm text-gauge-600">{label}</div>
            <div className="text-2xl font-semibold">{value ?? "…"}</div>
          </div>
        ))}
      </section>

      <IgnoredParamsNote ignored={ignored} labels={QUEUE_LIST_LABELS} />
      <div className="card flex flex-wrap items-end gap-4 p-4" role="search" aria-label="Filter the queue">
        <QueueFiltersBar
          options={options}
          filters={filters}
          onChange={(patch) => {
            setMessage(null);
            setFilters(patch);
          }}
        />
        <button type="button" className="btn-primary px-6 py-3 text-base" onClick={() => takeNext.mutate()} disabled={takeNext.isPending} data-testid="take-next">
          {takeNext.isPending ? "Taking…" : "Take next"}
        </button>
      </div>
      {message && <FormMessage kind={message.kind}>{message.text}</FormMessage>}

      {stats.data && stats.data.byPartType.length > 0 && (
        <section aria-labelledby="by-part-type" className="card overflow-x-auto">
          <h2 id="by-part-type" className="px-4 pt-3 text-sm font-semibold text-gauge-700">
            By part type
          </h2>
          <table className="min-w-full text-sm">
            <thead className="text-left text-xs uppercase tracking-wide text-gauge-600">
              <tr>
                <th scope="col" className="px-4 py-2">
                  Part type
                </th>
                <th scope="col" className="px-4 py-2">
                  Waiting
                </th>
                <th scope="col" className="px-4 py-2">
                  On a bench
                </th>
                <th scope="col" className="px-4 py-2">
                  Median minutes per unit (30 days)
                </th>
              </tr>
            </thead>
            <tbody className="divide-y divide-gauge-100">
              {stats.data.byPartType.map((p) => (
                <tr key={p.partTypeId}>
                  <td className="px-4 py-1.5">{p.name}</td>
                  <td className="px-4 py-1.5">{p.waiting}</td>
                  <td className="px-4 py-1.5">{p.onBench}</td>
                  <td className="px-4 py-1.5">{p.medianMinutes ?? "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
      )}
    </div>
  );
}
