"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { apiFetch } from "@/lib/http/client";

export type AssignablePerson = { id: string; name: string; assignedDue: string | null };

/** Assign the set to people with a due date; someone already assigned keeps their attempt and gets the new date. */
export function AssignForm({ setId, people, defaultDue }: { setId: string; people: AssignablePerson[]; defaultDue: string }) {
  const router = useRouter();
  const [chosen, setChosen] = useState<string[]>([]);
  const [dueOn, setDueOn] = useState(defaultDue);
  const dueId = useId();
  const assign = useMutation({
    mutationFn: () => apiFetch<{ assigned: number }>(`/api/calibration/sets/${setId}/assignments`, { method: "POST", body: { userIds: chosen, dueOn } }),
    onSuccess: () => {
      setChosen([]);
      router.refresh();
    },
  });
  if (people.length === 0) return <p className="text-sm text-gauge-700">Nobody in this workspace can take a set yet: invite inspectors on the People screen.</p>;
  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        assign.mutate();
      }}
      data-testid="assign-form"
    >
      <fieldset>
        <legend className="field-label">People (active inspectors and leads)</legend>
        <ul className="mt-1 grid gap-1 sm:grid-cols-2">
          {people.map((p) => (
            <li key={p.id}>
              <label className="flex items-center gap-2 text-sm">
                <input
                  type="checkbox"
                  checked={chosen.includes(p.id)}
                  onChange={() => setChosen((now) => (now.includes(p.id) ? now.filter((id) => id !== p.id) : [...now, p.id]))}
                  data-testid="assign-person"
                  data-name={p.name}
                />
                {p.name}
                {p.assignedDue && <span className="text-xs text-gauge-600">(assigned, due {p.assignedDue})</span>}
              </label>
            </li>
          ))}
        </ul>
      </fieldset>
      <div className="flex flex-wrap items-end gap-3">
        <div>
          <label htmlFor={dueId} className="field-label">
            Due on
          </label>
          <input id={dueId} type="date" className="field-input" value={dueOn} onChange={(e) => setDueOn(e.target.value)} data-testid="assign-due" />
        </div>
        <button type="submit" className="btn-primary" disabled={assign.isPending || chosen.length === 0} data-testid="assign-submit">
          {assign.isPending ? "Assigning…" : `Assign${chosen.length ? ` (${chosen.length})` : ""}`}
        </button>
      </div>
      {assign.error && <FormMessage kind="error">{assign.error.message}</FormMessage>}
      {assign.isSuccess && <FormMessage kind="success">Assigned. It shows on their Calibration screen.</FormMessage>}
    </form>
  );
}
