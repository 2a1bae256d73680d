"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { apiFetch } from "@/lib/http/client";

/** Take the next blind recheck and open it; says so in place when nothing waits for this person. */
export function TakeNextRecheck() {
  const router = useRouter();
  const take = useMutation({
    mutationFn: () => apiFetch<{ recheck: { id: string } } | undefined>("/api/rechecks/next", { method: "POST" }),
    onSuccess: (res) => {
      if (res?.recheck) router.push(`/recheck/${res.recheck.id}`);
    },
  });
  const opening = take.isPending || Boolean(take.data?.recheck);
  return (
    <div className="flex items-center gap-3">
      <button type="button" className="btn-primary" onClick={() => take.mutate()} disabled={opening}>
        Take the next recheck
      </button>
      <span role="status" className={`text-sm ${take.isError ? "text-fault-700" : "text-gauge-700"}`}>
        {take.isError ? take.error.message : take.isSuccess && !take.data?.recheck ? "Nothing is waiting for you." : opening && !take.isPending ? "Opening…" : ""}
      </span>
    </div>
  );
}
