"use client";
/**
 * The Bench's Photos panel: every photo of the unit with its details — file, size, status, why it
 * failed, a possible reuse of the same file on another unit — and what may still be done with it
 * (retry a failed processing, dismiss a failed upload).
 */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { apiFetch } from "@/lib/http/client";
import type { ViewChoice } from "@/lib/photos/views";
import { photosInViewOrder } from "./photo-strip";
import { photosQueryKey, usePhotos } from "./use-photos";

const STATUS = { queued: "Queued", processing: "Processing…", ready: "Ready", failed: "Failed" } as const;

export function PhotoList({ unitId, views, canManage }: { unitId: string; views: ViewChoice[]; canManage: boolean }) {
  const queryClient = useQueryClient();
  const photos = usePhotos(unitId);
  const [message, setMessage] = useState<string | null>(null);
  const refresh = () => queryClient.invalidateQueries({ queryKey: photosQueryKey(unitId) });
  const retry = useMutation({
    mutationFn: (id: string) => apiFetch(`/api/photos/${id}/retry`, { method: "POST" }),
    onSuccess: () => setMessage(null),
    onError: (err) => setMessage(err.message),
    onSettled: refresh,
  });
  const dismiss = useMutation({
    mutationFn: (id: string) => apiFetch(`/api/photos/${id}`, { method: "DELETE" }),
    onSuccess: () => setMessage(null),
    onError: (err) => setMessage(err.message),
    onSettled: refresh,
  });
  const busy = retry.isPending || dismiss.isPending;
  const labelOf = (key: string) => views.find((v) => v.key === key)?.label ?? key;

  if (photos.isPending) return <p className="text-sm text-gauge-600">Loading photos…</p>;
  if (photos.isError) return <FormMessage kind="error">{photos.error.message}</FormMessage>;
  const list = photosInViewOrder(photos.data.photos, views);
  return (
    <div className="space-y-2" data-testid="photo-list">
      {message && <FormMessage kind="error">{message}</FormMessage>}
      {list.length === 0 && <p className="text-sm text-gauge-600">No photos yet.</p>}
      <ul className="space-y-2">
        {list.map((photo) => (
          <li key={photo.id} className="rounded-md border border-gauge-200 p-2 text-xs" data-testid="photo-row" data-photo-id={photo.id}>
            <div className="flex items-center justify-between gap-2">
              <span className="min-w-0 truncate font-medium text-gauge-900" title={photo.fileName}>
                {labelOf(photo.viewKey)} · {photo.fileName}
              </span>
              <span className={`shrink-0 rounded px-1.5 py-0.5 font-medium ${photo.status === "failed" ? "bg-fault-50 text-fault-700" : photo.status === "ready" ? "bg-ok-50 text-ok-600" : "bg-signal-100 text-signal-700"}`}>
                {STATUS[photo.status]}
              </span>
            </div>
            {photo.width && photo.height && (
              <p className="text-gauge-600">
                {photo.width} × {photo.height} px
              </p>
            )}
            {photo.retryNote && <p className="text-signal-700">{photo.retryNote}</p>}
            {photo.failure && (
              <p className="text-fault-700" role="alert">
                {photo.failure.reason}
              </p>
            )}
            {photo.possibleReuse && (
              <p className="mt-1 rounded bg-signal-50 px-1.5 py-1 text-signal-700" data-testid="possible-reuse">
                Possible reused photo: the same file is evidence for{" "}
                <Link className="underline" href={`/units/${photo.possibleReuse.unitId}`}>
                  {photo.possibleReuse.unitLabel}
                </Link>
                .
              </p>
            )}
            {canManage && photo.status === "failed" && (
              <div className="flex gap-1 pt-1">
                {photo.failure?.code === "processing_failed" && (
                  <button type="button" className="btn-secondary px-2 py-1 text-xs" disabled={busy} onClick={() => retry.mutate(photo.id)}>
                    Retry
                  </button>
                )}
                <button type="button" className="btn-secondary px-2 py-1 text-xs" disabled={busy} onClick={() => dismiss.mutate(photo.id)}>
                  Dismiss
                </button>
              </div>
            )}
          </li>
        ))}
      </ul>
    </div>
  );
}
