"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useState, type ReactNode } from "react";
import { apiFetch } from "@/lib/http/client";
import { leaseRunningAt } from "@/lib/units/editability";
import { STATUS_LABELS } from "@/lib/units/state-machine";
import type { UnitView } from "@/lib/units/dto";
import { unitLock, type BenchPerson } from "./unit-lock";
import { useUnit } from "./use-unit";
import { unitKeys } from "@/lib/query-keys/units";

/** Whose bench, in the status itself ("on your bench", not "on a bench — on your bench"). */
function statusText(view: UnitView, me: BenchPerson): string {
  const { unit } = view;
  if (unit.status !== "on_bench") return STATUS_LABELS[unit.status];
  if (!leaseRunningAt(unit)) return `${STATUS_LABELS.on_bench} — the lease ran out; it is free to take`;
  return unit.leaseHolderId === me.id ? "on your bench" : `on ${view.leaseHolderName ?? "another inspector"}'s bench`;
}

/** A placeholder unit's serial, typed or scanned in the header line itself. */
function SerialForm({ view, editable }: { view: UnitView; editable: boolean }) {
  const queryClient = useQueryClient();
  const [serial, setSerial] = useState(view.unit.serial ?? "");
  const save = useMutation({
    mutationFn: (value: string) => apiFetch(`/api/units/${view.unit.id}`, { method: "PATCH", body: { serial: value } }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: unitKeys.view(view.unit.id) }),
  });
  return (
    <form
      className="flex shrink-0 items-center gap-1.5"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate(serial.trim());
      }}
    >
      <label htmlFor="unit-serial" className="text-xs font-medium text-gauge-700">
        Serial (scan or type)
      </label>
      <input
        id="unit-serial"
        className="field-input h-8 w-44 py-0 font-mono"
        value={serial}
        onChange={(e) => setSerial(e.target.value)}
        disabled={!editable}
        autoComplete="off"
        aria-describedby="unit-serial-message"
      />
      <button type="submit" className="btn-secondary h-8 py-0 text-sm" disabled={!editable || save.isPending || serial.trim() === "" || serial.trim() === view.unit.serial}>
        Save serial
      </button>
      <span id="unit-serial-message" role="status" className={`text-xs ${save.isError ? "text-fault-700" : "text-ok-600"}`}>
        {save.isError ? save.error.message : save.isSuccess ? "Saved." : ""}
      </span>
    </form>
  );
}

/**
 * The unit in one line: back to its lot, the serial, part type, supplier and place in the sample,
 * the status, then the page's own controls (the lease, Take next) at the end. Long text is cut,
 * never wrapped, so the workspace below keeps its place.
 */
export function UnitHeader({ initial, me, end }: { initial: UnitView; me: BenchPerson; end?: ReactNode }) {
  const { data: view } = useUnit(initial.unit.id, initial);
  const editable = view.unit.placeholder && unitLock(view, me, "serial") === null;
  const title = `${view.partType.name} · ${view.supplierName} · unit ${view.unit.sampleIndex} of ${view.lot.sampleSize} in the sample`;
  return (
    <header className={`flex min-h-10 shrink-0 items-center gap-x-4 gap-y-1 ${view.unit.placeholder ? "flex-wrap" : ""}`} data-testid="unit-header">
      <Link href={`/lots/${view.lot.id}`} className="shrink-0 text-sm text-gauge-600 underline" title={`Back to lot ${view.lot.purchaseRef}`}>
        ← {view.lot.purchaseRef}
      </Link>
      <h1 className="shrink-0 font-mono text-lg font-semibold">{view.unit.serial ?? `Unit ${view.unit.sampleIndex}`}</h1>
      {view.unit.placeholder && <SerialForm view={view} editable={editable} />}
      <p className="min-w-0 flex-1 truncate text-sm text-gauge-700" title={title}>
        {title}
      </p>
      <p className="shrink-0 text-sm" data-testid="unit-status">
        <span className="sr-only">Status: </span>
        <strong className="rounded bg-gauge-100 px-2 py-0.5 font-medium text-gauge-900">{statusText(view, me)}</strong>
      </p>
      {end}
    </header>
  );
}
