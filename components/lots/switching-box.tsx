"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { apiFetch } from "@/lib/http/client";
import { InspectionSeverityBadge } from "./badges";
import { lotKeys } from "@/lib/query-keys/lots";

export type SwitchingView = {
  state: { severity: "normal" | "tightened" | "reduced"; reason: string; progress: string; discontinued: boolean; reducedEligible: boolean };
  settings: { reducedAllowed: boolean; steadyProduction: boolean };
  decidedLots: number;
};

/**
 * Where the ISO 2859-1 switching rules stand for the next lot of a supplier + part type, and why;
 * a lead can allow reduced inspection, mark production as not steady, or record corrective action.
 */
export function SwitchingBox({
  supplierId,
  partTypeId,
  view,
  canEdit,
  title = "Next lot's inspection",
}: {
  supplierId: string;
  partTypeId: string;
  view: SwitchingView;
  canEdit: boolean;
  title?: string;
}) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [message, setMessage] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  const save = useMutation({
    mutationFn: (change: { reducedAllowed?: boolean; steadyProduction?: boolean; recordCorrectiveAction?: true }) =>
      apiFetch<SwitchingView>("/api/inspection-schemes", { method: "PUT", body: { supplierId, partTypeId, ...change } }),
    onSuccess: (next) => {
      queryClient.setQueryData(lotKeys.switching(supplierId, partTypeId), next);
      setMessage({ kind: "success", text: "Saved." });
      router.refresh();
    },
    onError: (err) => setMessage({ kind: "error", text: err.message }),
  });
  const { state, settings } = view;
  return (
    <section className="card space-y-2 p-4" aria-labelledby="switching-title" data-testid="switching-box">
      <div className="flex flex-wrap items-center gap-2">
        <h2 id="switching-title" className="text-sm font-semibold uppercase tracking-wide text-gauge-600">
          {title}
        </h2>
        {state.discontinued ? <span className="text-sm font-semibold text-fault-700">Discontinued</span> : <InspectionSeverityBadge severity={state.severity} />}
      </div>
      <p className="text-sm" data-testid="switching-reason">
        {state.reason}
      </p>
      <p className="text-xs text-gauge-600">
        {state.progress} {view.decidedLots} decided lot{view.decidedLots === 1 ? "" : "s"} on record for this supplier and part type.
      </p>
      {canEdit && (
        <div className="flex flex-wrap gap-x-6 gap-y-2 border-t border-gauge-100 pt-2 text-sm">
          <label className="flex items-center gap-2">
            <input type="checkbox" checked={settings.reducedAllowed} disabled={save.isPending} onChange={(e) => save.mutate({ reducedAllowed: e.target.checked })} />
            Allow reduced inspection when the switching score reaches 30
          </label>
          <label className="flex items-center gap-2">
            <input type="checkbox" checked={settings.steadyProduction} disabled={save.isPending} onChange={(e) => save.mutate({ steadyProduction: e.target.checked })} />
            Supplier&apos;s production is steady
          </label>
          {state.discontinued && (
            <button type="button" className="btn-secondary py-1 text-xs" disabled={save.isPending} onClick={() => save.mutate({ recordCorrectiveAction: true })}>
              Record corrective action (resume on tightened)
            </button>
          )}
        </div>
      )}
      {message && <FormMessage kind={message.kind}>{message.text}</FormMessage>}
    </section>
  );
}
