"use client";

import { useMutation, useQuery } from "@tanstack/react-query";
import { useEffect, useRef } from "react";
import { useRouter } from "next/navigation";
import { FormMessage } from "@/components/ui/form-field";
import { useTimeZone } from "@/components/ui/time-zone";
import { apiFetch } from "@/lib/http/client";
import { formatTime } from "@/lib/time/format";
import { unitSessionKeys } from "@/lib/query-keys/units";

/**
 * Mounted on the Bench of a unit the user holds: renews the lease every minute while the page is
 * open (so a closed tab lets it expire), and offers to put the unit back in the queue.
 */
export function LeaseHeartbeat({
  unitId,
  leaseUrl = `/api/units/${unitId}/lease`,
  intervalMs = 60_000,
  onRenewed,
  showPutBack = true,
}: {
  unitId: string;
  leaseUrl?: string;
  intervalMs?: number;
  onRenewed?: () => void;
  showPutBack?: boolean;
}) {
  const router = useRouter();
  const timeZone = useTimeZone();
  const heartbeat = useQuery({
    queryKey: unitSessionKeys.leaseHeartbeat(unitId),
    queryFn: () => apiFetch<{ leaseExpiresAt: string }>(leaseUrl, { method: "PUT" }),
    refetchInterval: intervalMs,
    refetchIntervalInBackground: true,
    retry: 1,
    staleTime: 0,
  });
  // Whatever shows the unit's status reads it again once the lease is renewed (it may have run out before).
  const renewedAt = heartbeat.dataUpdatedAt;
  const onRenewedRef = useRef(onRenewed);
  useEffect(() => {
    onRenewedRef.current = onRenewed;
  });
  useEffect(() => {
    if (renewedAt) onRenewedRef.current?.();
  }, [renewedAt]);
  const release = useMutation({
    mutationFn: () => apiFetch(`/api/units/${unitId}/lease`, { method: "DELETE" }),
    onSuccess: () => router.push("/queue"),
  });
  const until = heartbeat.data ? formatTime(heartbeat.data.leaseExpiresAt, timeZone) : null;
  return (
    <div className="flex shrink-0 items-center gap-2 text-sm" data-testid="lease-status">
      {heartbeat.isError ? (
        <FormMessage kind="error">{heartbeat.error.message}</FormMessage>
      ) : (
        <span className="text-gauge-700" title="The reservation is renewed every minute while this page is open; closing it lets the reservation run out.">
          {/* Narrow screens keep the header on one line with the short form. */}
          <span className="max-lg:sr-only">Reserved for you </span>
          {until ? `until ${until}` : <span className="lg:sr-only">reserved for you</span>}
        </span>
      )}
      {showPutBack && (
        <button type="button" className="btn-secondary h-8 py-0 text-sm" onClick={() => release.mutate()} disabled={release.isPending} title="Put the unit back in the queue for someone else">
          Put back
        </button>
      )}
      {release.isError && <FormMessage kind="error">{release.error.message}</FormMessage>}
    </div>
  );
}
