"use client";
/**
 * The unit's photos by view, with live status: polls while any photo is queued or processing,
 * so each turns ready (or failed, with the reason) without a reload. Every required view gets a
 * slot, so a missing one shows as an empty, marked place. On the Bench a ready photo is picked for
 * the canvas (`onSelect`), and photos with edits not yet saved carry a badge.
 */
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useState, type ReactNode } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { apiFetch } from "@/lib/http/client";
import type { PhotoDto } from "@/lib/photos/dto";
import { missingRequiredViews, type ViewChoice } from "@/lib/photos/views";

const POLL_MS = 1500;

const STATUS: Record<PhotoDto["status"], { text: string; className: string }> = {
  queued: { text: "Queued", className: "bg-gauge-100 text-gauge-800" },
  processing: { text: "Processing…", className: "bg-signal-100 text-signal-700" },
  ready: { text: "Ready", className: "bg-ok-50 text-ok-600" },
  failed: { text: "Failed", className: "bg-fault-50 text-fault-700" },
};

type Selection = { selectedId: string | null; onSelect(photo: PhotoDto): void; unsavedIds?: ReadonlySet<string> };

type PhotoStripProps = {
  unitId: string;
  views: ViewChoice[];
  canManage?: boolean;
  selection?: Selection;
  /** Shown at the end of the heading line (e.g. the Bench's "Add photos" toggle). */
  headerAction?: ReactNode;
};

export function PhotoStrip({ unitId, views, canManage = false, selection, headerAction }: PhotoStripProps) {
  const queryClient = useQueryClient();
  const [message, setMessage] = useState<string | null>(null);
  const photos = useQuery({
    queryKey: ["unit-photos", unitId],
    queryFn: () => apiFetch<{ photos: PhotoDto[] }>(`/api/units/${unitId}/photos`),
    refetchInterval: (query) => (query.state.data?.photos.some((p) => p.status === "queued" || p.status === "processing") ? POLL_MS : false),
  });
  const refresh = () => queryClient.invalidateQueries({ queryKey: ["unit-photos", unitId] });
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

  if (photos.isPending) return <p className="text-sm text-gauge-600">Loading photos…</p>;
  if (photos.isError) return <FormMessage kind="error">{photos.error.message}</FormMessage>;

  const list = photos.data.photos;
  const covered = new Set(list.filter((p) => p.status !== "failed").map((p) => p.viewKey));
  const missing = missingRequiredViews(views, covered);
  const labelOf = (key: string) => views.find((v) => v.key === key)?.label ?? key;
  const known = new Set(views.map((v) => v.key));
  const groups = [...views.map((v) => ({ key: v.key, label: v.label, required: v.required })), ...[...new Set(list.map((p) => p.viewKey))].filter((k) => !known.has(k)).map((k) => ({ key: k, label: k, required: false }))];

  return (
    <section className="space-y-3" aria-labelledby="photo-strip-title" data-testid="photo-strip">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="photo-strip-title" className="text-lg font-semibold">
          Photos <span className="text-sm font-normal text-gauge-600">({list.filter((p) => p.status === "ready").length} ready)</span>
        </h2>
        <div className="flex flex-wrap items-center gap-3">
          {missing.length > 0 && <p className="text-sm text-signal-700">Still needed: {missing.map((v) => v.label).join(", ")}</p>}
          {headerAction}
        </div>
      </div>
      {message && <FormMessage kind="error">{message}</FormMessage>}
      {/* With required views, their empty slots already say what is missing. */}
      {list.length === 0 && missing.length === 0 && <p className="text-sm text-gauge-600">No photos yet.</p>}
      <div className="flex flex-wrap gap-3">
        {groups
          .filter((g) => g.required || list.some((p) => p.viewKey === g.key))
          .map((group) => {
            const own = list.filter((p) => p.viewKey === group.key);
            const isMissing = missing.some((v) => v.key === group.key);
            return (
              <div key={group.key} className={`space-y-1.5 rounded-lg border p-2 ${isMissing ? "border-dashed border-signal-500 bg-signal-50" : "border-gauge-200 bg-white"}`} data-testid="photo-view-group" data-view={group.key}>
                <h3 className="text-sm font-medium text-gauge-800">
                  {group.label}
                  {group.required && <span className="ml-1 text-xs font-normal text-gauge-600">required</span>}
                </h3>
                {isMissing && own.length === 0 ? (
                  <p className="flex h-16 w-28 items-center justify-center rounded border border-dashed border-signal-500 px-2 text-center text-xs font-medium text-signal-700" data-testid="missing-view">
                    Missing — photograph this view
                  </p>
                ) : (
                  <ul className="flex flex-wrap gap-2">
                    {own.map((photo) => (
                      <PhotoCard
                        key={photo.id}
                        photo={photo}
                        viewLabel={labelOf(photo.viewKey)}
                        canManage={canManage}
                        busy={retry.isPending || dismiss.isPending}
                        onRetry={() => retry.mutate(photo.id)}
                        onDismiss={() => dismiss.mutate(photo.id)}
                        selected={selection?.selectedId === photo.id}
                        unsaved={selection?.unsavedIds?.has(photo.id) ?? false}
                        onSelect={selection ? () => selection.onSelect(photo) : undefined}
                      />
                    ))}
                  </ul>
                )}
              </div>
            );
          })}
      </div>
    </section>
  );
}

function PhotoCard(props: {
  photo: PhotoDto;
  viewLabel: string;
  canManage: boolean;
  busy: boolean;
  onRetry: () => void;
  onDismiss: () => void;
  selected: boolean;
  unsaved: boolean;
  onSelect?: () => void;
}) {
  const { photo, viewLabel, canManage, busy, onRetry, onDismiss, selected, unsaved, onSelect } = props;
  const status = STATUS[photo.status];
  const image =
    photo.urls && photo.thumbnail ? (
      // eslint-disable-next-line @next/next/no-img-element -- served by our own access-checked route
      <img src={photo.urls.thumbnail} width={photo.thumbnail.width} height={photo.thumbnail.height} alt={`${viewLabel} photo, ${photo.fileName}`} className="max-h-full max-w-full object-contain" data-testid="photo-thumbnail" />
    ) : (
      <span className="px-2 text-center text-xs text-gauge-600">{photo.status === "failed" ? "No image" : "Processing…"}</span>
    );
  const frame = "flex h-16 w-full items-center justify-center overflow-hidden rounded-t-md bg-gauge-100";
  return (
    <li className={`card relative w-36 overflow-hidden ${selected ? "ring-2 ring-signal-500" : ""}`} data-testid="photo-card" data-photo-id={photo.id} data-status={photo.status} data-selected={selected ? "true" : "false"}>
      {onSelect && photo.status === "ready" ? (
        <button type="button" className={`${frame} hover:opacity-90`} aria-pressed={selected} aria-label={`Open the ${viewLabel} photo ${photo.fileName} on the canvas`} onClick={onSelect} data-testid="photo-select">
          {image}
        </button>
      ) : photo.urls ? (
        <a href={photo.urls.preview} target="_blank" rel="noreferrer" className={frame}>
          {image}
        </a>
      ) : (
        <div className={frame}>{image}</div>
      )}
      {unsaved && (
        // Over the thumbnail, not a line of its own: the strip keeps its height and the canvas below it does not move.
        <span className="absolute top-1 left-1 rounded bg-signal-500 px-1.5 py-0.5 text-xs font-semibold text-gauge-900 shadow" data-testid="photo-unsaved">
          Unsaved edits
        </span>
      )}
      <div className="space-y-1 p-1.5 text-xs">
        <div className="flex items-center justify-between gap-1">
          <span className={`rounded px-1.5 py-0.5 font-medium ${status.className}`} data-testid="photo-status">
            {status.text}
          </span>
          {photo.width && photo.height && (
            <span className="text-gauge-600">
              {photo.width} × {photo.height}
            </span>
          )}
        </div>
        <p className="truncate text-gauge-700" title={photo.fileName}>
          {photo.fileName}
        </p>
        {photo.retryNote && <p className="text-signal-700">{photo.retryNote}</p>}
        {photo.failure && (
          <p className="text-fault-700" role="alert">
            {photo.failure.reason}
          </p>
        )}
        {photo.possibleReuse && (
          <p className="rounded bg-signal-50 px-1.5 py-1 text-signal-700" data-testid="possible-reuse">
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
              <button type="button" className="btn-secondary px-2 py-1 text-xs" disabled={busy} onClick={onRetry}>
                Retry
              </button>
            )}
            <button type="button" className="btn-secondary px-2 py-1 text-xs" disabled={busy} onClick={onDismiss}>
              Dismiss
            </button>
          </div>
        )}
      </div>
    </li>
  );
}
