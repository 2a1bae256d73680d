"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { apiFetch } from "@/lib/http/client";
import { STATUS_LABELS } from "@/lib/units/state-machine";
import { benchLock, unitQueryKey, useUnit, type UnitView } from "./use-unit";

/** Lot, part type, serial (editable for placeholders) and status of the unit on the Bench. */
export function UnitHeader({ initial, me }: { initial: UnitView; me: { id: string; isLead: boolean; canRecord: boolean } }) {
  const { data: view } = useUnit(initial.unit.id, initial);
  const queryClient = useQueryClient();
  const [serial, setSerial] = useState(view.unit.serial ?? "");
  const [message, setMessage] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  const save = useMutation({
    mutationFn: (value: string) => apiFetch(`/api/units/${view.unit.id}`, { method: "PATCH", body: { serial: value } }),
    onSuccess: () => {
      setMessage({ kind: "success", text: "Serial saved." });
      void queryClient.invalidateQueries({ queryKey: unitQueryKey(view.unit.id) });
    },
    onError: (err) => setMessage({ kind: "error", text: err.message }),
  });
  const lock = benchLock(view, me);
  const editable = view.unit.placeholder && lock === null;
  const leaseRunning = view.unit.status === "on_bench" && view.unit.leaseExpiresAt !== null && new Date(view.unit.leaseExpiresAt) > new Date();
  // Whose bench, in the status itself ("on your bench", not "on a bench — on your bench").
  const statusText =
    view.unit.status !== "on_bench"
      ? STATUS_LABELS[view.unit.status]
      : !leaseRunning
        ? `${STATUS_LABELS.on_bench} — the lease ran out; it is free to take`
        : view.unit.leaseHolderId === me.id
          ? "on your bench"
          : `on ${view.leaseHolderName ?? "another inspector"}'s bench`;

  return (
    <header className="space-y-3" data-testid="unit-header">
      <Link href={`/lots/${view.lot.id}`} className="text-sm text-gauge-600 underline">
        ← Lot {view.lot.purchaseRef}
      </Link>
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <div>
          <h1 className="page-title font-mono">{view.unit.serial ?? `Unit ${view.unit.sampleIndex}`}</h1>
          <p className="text-gauge-700">
            {view.partType.name} · {view.supplierName} · unit {view.unit.sampleIndex} of {view.lot.sampleSize} in the sample
          </p>
        </div>
        <p className="text-sm" data-testid="unit-status">
          Status: <strong className="font-medium">{statusText}</strong>
        </p>
      </div>
      {view.unit.placeholder && (
        <form
          className="flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            save.mutate(serial.trim());
          }}
        >
          <div>
            <label htmlFor="unit-serial" className="field-label">Serial (scan or type)</label>
            <input id="unit-serial" className="field-input w-72 font-mono" value={serial} onChange={(e) => setSerial(e.target.value)} disabled={!editable} autoComplete="off" />
          </div>
          <button type="submit" className="btn-secondary" disabled={!editable || save.isPending || serial.trim() === "" || serial.trim() === view.unit.serial}>
            Save serial
          </button>
        </form>
      )}
      {message && <FormMessage kind={message.kind}>{message.text}</FormMessage>}
      {lock && <p className="text-sm text-signal-700" data-testid="bench-lock">{lock}</p>}
    </header>
  );
}
