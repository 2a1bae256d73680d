"use client";
/**
 * The Bench's Photos panel: every photo of the unit with its details — file, size, status, why it
 * failed, a possible reuse of the same file on another unit — and what may still be done with it:
 * retry a failed processing, dismiss a failed upload, file a photo under the right view, remove a
 * wrong photo with a reason. Photos taken out of the unit are listed apart, with who, when and why.
 */
import { useMutation, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { useTimeZone } from "@/components/ui/time-zone";
import { apiFetch } from "@/lib/http/client";
import type { PhotoDto } from "@/lib/photos/dto";
import type { ViewChoice } from "@/lib/photos/views";
import { formatDate } from "@/lib/time/format";
import { photosInViewOrder } from "./photo-strip";
import { usePhotos } from "./use-photos";
import { unitKeys } from "@/lib/query-keys/units";

const STATUS = { queued: "Queued", processing: "Processing…", ready: "Ready", failed: "Failed" } as const;

type PhotoListProps = {
  unitId: string;
  views: ViewChoice[];
  canManage: boolean;
  /** Runs before a photo is removed (the Bench saves its pending regions first). */
  beforeRemove?: (photoId: string) => Promise<unknown>;
};

export function PhotoList({ unitId, views, canManage, beforeRemove }: PhotoListProps) {
  const queryClient = useQueryClient();
  const photos = usePhotos(unitId);
  const timeZone = useTimeZone();
  const [message, setMessage] = useState<string | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const refresh = () => queryClient.invalidateQueries({ queryKey: unitKeys.photos(unitId) });
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
  const reassign = useMutation({
    mutationFn: ({ id, viewKey }: { id: string; viewKey: string }) => apiFetch(`/api/photos/${id}`, { method: "PATCH", body: { viewKey } }),
    onSuccess: () => setMessage(null),
    onError: (err) => setMessage(err.message),
    onSettled: refresh,
  });
  const busy = retry.isPending || dismiss.isPending || reassign.isPending;
  const labelOf = (key: string) => views.find((v) => v.key === key)?.label ?? key;

  if (photos.isPending) return <p className="text-sm text-gauge-600">Loading photos…</p>;
  if (photos.isError) return <FormMessage kind="error">{photos.error.message}</FormMessage>;
  const list = photosInViewOrder(photos.data.photos, views);
  const removed = photos.data.removed ?? [];
  return (
    <div className="space-y-2" data-testid="photo-list">
      {message && <FormMessage kind="error">{message}</FormMessage>}
      {notice && <FormMessage kind="success">{notice}</FormMessage>}
      {list.length === 0 && <p className="text-sm text-gauge-600">No photos yet.</p>}
      <ul className="space-y-2">
        {list.map((photo) => (
          <li key={photo.id} className="rounded-md border border-gauge-200 p-2 text-xs" data-testid="photo-row" data-photo-id={photo.id}>
            <div className="flex items-center justify-between gap-2">
              <span className="min-w-0 truncate font-medium text-gauge-900" title={photo.fileName}>
                {labelOf(photo.viewKey)} · {photo.fileName}
              </span>
              <span
                className={`shrink-0 rounded px-1.5 py-0.5 font-medium ${photo.status === "failed" ? "bg-fault-50 text-fault-700" : photo.status === "ready" ? "bg-ok-50 text-ok-600" : "bg-signal-100 text-signal-700"}`}
              >
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
            {canManage && photo.status === "ready" && (
              <div className="mt-1 flex flex-wrap items-center gap-2">
                <label className="flex items-center gap-1 text-gauge-700">
                  View
                  <select
                    className="field-input h-7 w-auto py-0 text-xs"
                    value={photo.viewKey}
                    disabled={busy}
                    onChange={(e) => reassign.mutate({ id: photo.id, viewKey: e.target.value })}
                    aria-label={`View of ${photo.fileName}`}
                    data-testid="photo-view-select"
                  >
                    {views.map((v) => (
                      <option key={v.key} value={v.key}>
                        {v.label}
                      </option>
                    ))}
                  </select>
                </label>
                <RemovePhoto photo={photo} beforeRemove={beforeRemove} onDone={(text) => (setMessage(null), setNotice(text), void refresh())} />
              </div>
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
      {removed.length > 0 && (
        <section aria-label="Taken out of this unit" className="space-y-1 border-t border-gauge-100 pt-2" data-testid="removed-photos">
          <h3 className="text-xs font-semibold text-gauge-800">Taken out of this unit (kept as a record)</h3>
          <ul className="space-y-1 text-xs text-gauge-700">
            {removed.map((p) => (
              <li key={p.id} data-testid="removed-photo">
                {labelOf(p.viewKey)} · {p.fileName}: “{p.removal?.reason}” — {p.removal?.byName ?? "someone"}, {p.removal && formatDate(p.removal.at, timeZone)}
              </li>
            ))}
          </ul>
        </section>
      )}
    </div>
  );
}

/** "Remove…": asks for the reason first, then says whether the photo was deleted or kept as a record. */
function RemovePhoto({ photo, beforeRemove, onDone }: { photo: PhotoDto; beforeRemove?: (photoId: string) => Promise<unknown>; onDone(message: string): void }) {
  const [open, setOpen] = useState(false);
  const [reason, setReason] = useState("");
  const remove = useMutation({
    mutationFn: async () => {
      await beforeRemove?.(photo.id);
      return apiFetch<{ outcome: "deleted" | "withdrawn"; message: string }>(`/api/photos/${photo.id}/removal`, { body: { reason } });
    },
    onSuccess: (res) => {
      setOpen(false);
      setReason("");
      onDone(res.message);
    },
  });
  if (!open) {
    return (
      <button type="button" className="btn-secondary h-7 px-2 py-0 text-xs" onClick={() => setOpen(true)} data-testid="photo-remove">
        Remove…
      </button>
    );
  }
  return (
    <form
      className="w-full space-y-1"
      onSubmit={(e) => {
        e.preventDefault();
        remove.mutate();
      }}
    >
      <label htmlFor={`remove-${photo.id}`} className="block font-medium text-gauge-800">
        Why is this photo wrong?
      </label>
      <input
        id={`remove-${photo.id}`}
        className="field-input h-7 py-0 text-xs"
        value={reason}
        maxLength={500}
        onChange={(e) => setReason(e.target.value)}
        placeholder="e.g. another unit's back"
        autoFocus
      />
      {remove.isError && <p className="text-fault-700">{remove.error.message}</p>}
      <p className="text-gauge-600">A photo with regions or a measurement is kept as a record, out of the unit; otherwise it is deleted. Either way the reason is logged.</p>
      <div className="flex gap-1">
        <button type="submit" className="btn-danger h-7 px-2 py-0 text-xs" disabled={remove.isPending || reason.trim().length < 3}>
          Remove photo
        </button>
        <button type="button" className="btn-secondary h-7 px-2 py-0 text-xs" onClick={() => setOpen(false)}>
          Cancel
        </button>
      </div>
    </form>
  );
}
