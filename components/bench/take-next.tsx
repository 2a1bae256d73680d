"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { apiFetch } from "@/lib/http/client";

/**
 * After grading: claim the next waiting unit straight from the Bench (the queue's Take next, with
 * the queue's own order) and open it; when nothing waits, say so in place.
 */
export function TakeNext() {
  const router = useRouter();
  const take = useMutation({
    mutationFn: () => apiFetch<{ unit: { id: string } } | undefined>("/api/queue/next", { method: "POST", body: {} }),
    onSuccess: (res) => {
      if (res?.unit) router.push(`/units/${res.unit.id}`);
    },
  });
  const nothing = take.isSuccess && !take.data?.unit;
  return (
    <div className="flex shrink-0 items-center gap-2" data-testid="take-next">
      <span role="status" className={`text-sm ${take.isError ? "text-fault-700" : "text-gauge-700"}`}>
        {take.isError ? take.error.message : nothing ? "Nothing is waiting in the queue." : ""}
      </span>
      <button type="button" className="btn-primary h-8 py-0 text-sm" onClick={() => take.mutate()} disabled={take.isPending || (take.isSuccess && !nothing)}>
        {take.isPending || (take.isSuccess && !nothing) ? "Taking the next unit…" : "Take next"}
      </button>
    </div>
  );
}
