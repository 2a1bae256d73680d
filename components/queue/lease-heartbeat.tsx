"use client";

import { useMutation, useQuery } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { FormMessage } from "@/components/ui/form-field";
import { useTimeZone } from "@/components/ui/time-zone";
import { apiFetch } from "@/lib/http/client";
import { formatTime } from "@/lib/time/format";

/**
 * Mounted on the Bench of a unit the user holds: renews the lease every minute while the page is
 * open (so a closed tab lets it expire), and offers to put the unit back in the queue.
 */
export function LeaseHeartbeat({ unitId, intervalMs = 60_000 }: { unitId: string; intervalMs?: number }) {
  const router = useRouter();
  const timeZone = useTimeZone();
  const heartbeat = useQuery({
    queryKey: ["lease", unitId],
    queryFn: () => apiFetch<{ leaseExpiresAt: string }>(`/api/units/${unitId}/lease`, { method: "PUT" }),
    refetchInterval: intervalMs,
    refetchIntervalInBackground: true,
    retry: 1,
    staleTime: 0,
  });
  const release = useMutation({
    mutationFn: () => apiFetch(`/api/units/${unitId}/lease`, { method: "DELETE" }),
    onSuccess: () => router.push("/queue"),
  });
  return (
    <div className="flex flex-wrap items-center gap-3 text-sm" data-testid="lease-status">
      {heartbeat.isError ? (
        <FormMessage kind="error">{heartbeat.error.message}</FormMessage>
      ) : (
        <span className="text-gauge-700">
          Reserved for you{heartbeat.data ? ` until ${formatTime(heartbeat.data.leaseExpiresAt, timeZone)}` : ""}, renewed while this page is open.
        </span>
      )}
      <button type="button" className="btn-secondary py-1" onClick={() => release.mutate()} disabled={release.isPending}>
        Put back in the queue
      </button>
      {release.isError && <FormMessage kind="error">{release.error.message}</FormMessage>}
    </div>
  );
}
