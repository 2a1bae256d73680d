"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { apiFetch } from "@/lib/http/client";

/**
 * After grading: claim the next waiting unit straight from the Bench and open it — the next of
 * this lot (same part type, same test set-up on the bench), or the queue's next in its own order.
 * When nothing waits, it says so in place.
 */
export function TakeNext({ lotId }: { lotId: string }) {
  const router = useRouter();
  const take = useMutation({
    mutationFn: (scope: "lot" | "queue") => apiFetch<{ unit: { id: string } } | undefined>("/api/queue/next", { method: "POST", body: scope === "lot" ? { lotId } : {} }),
    onSuccess: (res) => {
      if (res?.unit) router.push(`/units/${res.unit.id}`);
    },
  });
  const opening = take.isPending || Boolean(take.data?.unit);
  const nothing = take.isSuccess && !take.data?.unit ? (take.variables === "lot" ? "Nothing else waits in this lot." : "Nothing is waiting in the queue.") : "";
  return (
    <div className="flex shrink-0 items-center gap-2" data-testid="bench-take-next">
      <span role="status" className={`text-sm ${take.isError ? "text-fault-700" : "text-gauge-700"}`}>
        {take.isError ? take.error.message : opening && !take.isPending ? "Opening the next unit…" : nothing}
      </span>
      <button type="button" className="btn-primary h-8 py-0 text-sm" onClick={() => take.mutate("lot")} disabled={opening}>
        Take next in this lot
      </button>
      <button type="button" className="btn-secondary h-8 py-0 text-sm" onClick={() => take.mutate("queue")} disabled={opening}>
        Take next from the queue
      </button>
    </div>
  );
}
