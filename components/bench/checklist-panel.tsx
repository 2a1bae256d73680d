"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { BatteryCaution, StaticCaution, SuspectCaution } from "@/components/ui/cautions";
import { FormMessage } from "@/components/ui/form-field";
import { suspectReading } from "@/lib/checklist/evaluate";
import { apiFetch } from "@/lib/http/client";
import { STATIC_SENSITIVE, type PartCategory } from "@/lib/part-types/schemas";
import { ChecklistItemRow } from "./checklist-item-row";
import type { UnitView } from "@/lib/units/dto";
import { unitLock, type BenchPerson } from "./unit-lock";
import { useUnit } from "./use-unit";
import { unitKeys } from "@/lib/query-keys/units";
import type { ChecklistValue } from "@/lib/units/schemas";

/** Items whose failure means a battery is unsafe to handle normally. */
const BATTERY_HAZARD_ITEMS = ["swelling", "not-hot"];

/** "7 of 7 recorded · 1 failed". */
export function checklistSummary(view: UnitView): string {
  const items = view.partType.checklist;
  const results = view.results.filter((r) => items.some((i) => i.id === r.itemId));
  const failed = results.filter((r) => !r.passed).length;
  return `${results.length} of ${items.length} recorded${failed ? ` · ${failed} failed` : ""}`;
}

/**
 * The functional checklist of one unit. Each result is judged on the server against the item's
 * limits; a failed item becomes a functional defect of its severity (it counts toward the lot's
 * verdict at once).
 */
export function ChecklistPanel({ initial, me, framed = true }: { initial: UnitView; me: BenchPerson; framed?: boolean }) {
  const { data: view } = useUnit(initial.unit.id, initial);
  const queryClient = useQueryClient();
  const [error, setError] = useState<string | null>(null);
  const record = useMutation({
    mutationFn: (input: { itemId: string; value: ChecklistValue; note: string }) => apiFetch(`/api/units/${view.unit.id}/checklist`, { body: input }),
    onSuccess: () => {
      setError(null);
      void queryClient.invalidateQueries({ queryKey: unitKeys.view(view.unit.id) });
    },
    onError: (err) => setError(err.message),
  });
  const items = view.partType.checklist;
  const byItem = new Map(view.results.map((r) => [r.itemId, r]));
  const failed = items.map((i) => byItem.get(i.id)).filter((r) => r && !r.passed);
  // Why it is closed is said once, in the Bench's banner; only the serial is this panel's own hint.
  const closed = unitLock(view, me, "checklist");
  const needsSerial = closed === null && view.unit.serial === null;
  const lock = closed ?? (needsSerial ? "Scan or type the serial first." : null);
  const battery = view.partType.category === "battery";
  const hazard = battery && failed.some((r) => r && BATTERY_HAZARD_ITEMS.includes(r.itemId));
  const suspects = items.flatMap((item) => {
    const result = byItem.get(item.id);
    const suspect = result ? suspectReading(item, result.value) : null;
    return suspect ? [`${item.label} ${suspect.reading} is below ${suspect.level}`] : [];
  });

  return (
    <section className={framed ? "card space-y-3 p-5" : "space-y-3"} aria-label="Functional checklist" data-testid="checklist-panel">
      {framed && (
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 className="text-lg font-semibold">Functional checklist</h2>
          <span className="text-sm text-gauge-700">{checklistSummary(view)}</span>
        </div>
      )}
      {battery && <BatteryCaution />}
      {STATIC_SENSITIVE.includes(view.partType.category as PartCategory) && <StaticCaution />}
      {hazard && (
        <div role="alert" className="rounded-md border-2 border-fault-600 bg-fault-50 p-3 text-sm font-medium text-fault-700" data-testid="battery-hazard">
          Unsafe cell: swollen or hot. Stop testing, isolate it in a fire-safe container, do not charge or press it, and follow local rules for damaged lithium batteries.
        </div>
      )}
      {suspects.length > 0 && <SuspectCaution battery={battery} findings={suspects} />}
      {error && <FormMessage kind="error">{error}</FormMessage>}
      {needsSerial && <p className="text-sm text-signal-700">Scan or type the serial first (in the line above).</p>}
      {items.length === 0 ? (
        <p className="text-sm text-gauge-700">This part type has no checklist items.</p>
      ) : (
        <ol className="divide-y divide-gauge-100">
          {items.map((item) => (
            <ChecklistItemRow
              key={item.id}
              item={item}
              result={byItem.get(item.id)}
              disabled={lock !== null}
              saving={record.isPending}
              onRecord={(value, note) => record.mutate({ itemId: item.id, value, note })}
            />
          ))}
        </ol>
      )}
    </section>
  );
}
