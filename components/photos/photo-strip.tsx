"use client";
/**
 * The unit's photos as one compact strip under the canvas: a tile per photo in the part type's
 * view order, a dashed tile for each required view still missing, live status (polls while a
 * photo is queued or processing). A ready tile opens the photo on the canvas; tiles with edits
 * not yet saved carry a mark. The strip has a fixed height, so nothing in it moves the canvas.
 * Details and changes (failures, retry, view, removal) live in the Photos panel (photo-list.tsx).
 */
import type { ReactNode } from "react";
import type { PhotoDto } from "@/lib/photos/dto";
import { missingRequiredViews, type ViewChoice } from "@/lib/photos/views";
import { usePhotos } from "./use-photos";

type Selection = { selectedId: string | null; onSelect(photo: PhotoDto): void; unsavedIds?: ReadonlySet<string> };

type PhotoStripProps = {
  unitId: string;
  views: ViewChoice[];
  selection?: Selection;
  /** At the strip's end (the Bench's "Add photos" and the save status). */
  end?: ReactNode;
};

/** Photos ordered by the part type's views (unknown views last), each view's in upload order. */
export function photosInViewOrder(photos: readonly PhotoDto[], views: readonly ViewChoice[]): PhotoDto[] {
  const rank = new Map(views.map((v, i) => [v.key, i]));
  return photos
    .map((p, i) => ({ p, i }))
    .sort((a, b) => (rank.get(a.p.viewKey) ?? views.length) - (rank.get(b.p.viewKey) ?? views.length) || a.i - b.i)
    .map(({ p }) => p);
}

const STATUS_TEXT: Record<PhotoDto["status"], string> = { queued: "Queued", processing: "Processing…", ready: "Ready", failed: "Failed" };

export function PhotoStrip({ unitId, views, selection, end }: PhotoStripProps) {
  const photos = usePhotos(unitId);
  const list = photos.data?.photos ?? [];
  const covered = new Set(list.filter((p) => p.status !== "failed").map((p) => p.viewKey));
  // Nothing is "missing" before the photos have loaded.
  const missing = photos.isSuccess ? missingRequiredViews(views, covered) : [];
  const labelOf = (key: string) => views.find((v) => v.key === key)?.label ?? key;
  const ready = list.filter((p) => p.status === "ready").length;

  return (
    <section className="flex h-[4.5rem] shrink-0 items-center gap-2 rounded-lg border border-gauge-200 bg-white px-2" aria-labelledby="photo-strip-title" data-testid="photo-strip">
      <h2 id="photo-strip-title" className="w-14 shrink-0 text-xs leading-tight font-semibold text-gauge-800">
        Photos
        <span className="block font-normal text-gauge-600">{photos.isPending ? "…" : `${ready} ready`}</span>
      </h2>
      <ul className="relative flex h-full min-w-0 flex-1 items-center gap-1.5 overflow-x-auto py-1">
        {photosInViewOrder(list, views).map((photo) => (
          <PhotoTile
            key={photo.id}
            photo={photo}
            viewLabel={labelOf(photo.viewKey)}
            selected={selection?.selectedId === photo.id}
            unsaved={selection?.unsavedIds?.has(photo.id) ?? false}
            onSelect={selection ? () => selection.onSelect(photo) : undefined}
          />
        ))}
        {missing.map((view) => (
          <li
            key={view.key}
            className="flex h-14 w-24 shrink-0 flex-col items-center justify-center rounded border border-dashed border-signal-500 bg-signal-50 px-1 text-center text-[11px] leading-tight font-medium text-signal-700"
            data-testid="missing-view"
            data-view={view.key}
          >
            {view.label}
            <span className="font-normal">Missing — photograph this view</span>
          </li>
        ))}
        {photos.isError && <li className="text-sm text-fault-700">{photos.error.message}</li>}
      </ul>
      {end}
    </section>
  );
}

function PhotoTile({ photo, viewLabel, selected, unsaved, onSelect }: { photo: PhotoDto; viewLabel: string; selected: boolean; unsaved: boolean; onSelect?: () => void }) {
  const image =
    photo.urls && photo.thumbnail ? (
      // eslint-disable-next-line @next/next/no-img-element -- served by our own access-checked route
      <img
        src={photo.urls.thumbnail}
        width={photo.thumbnail.width}
        height={photo.thumbnail.height}
        alt={`${viewLabel} photo, ${photo.fileName}`}
        className="h-full w-full object-cover"
        data-testid="photo-thumbnail"
      />
    ) : (
      <span className="px-1 text-center text-[11px] text-gauge-600">{photo.status === "failed" ? "No image" : "Processing…"}</span>
    );
  const body = (
    <>
      {image}
      <span className="absolute inset-x-0 bottom-0 truncate bg-gauge-950/70 px-1 text-left text-[11px] leading-4 text-white">{viewLabel}</span>
      {photo.status !== "ready" && (
        <span
          className={`absolute top-0.5 left-0.5 rounded px-1 text-[10px] font-semibold ${photo.status === "failed" ? "bg-fault-600 text-white" : "bg-signal-100 text-signal-700"}`}
          data-testid="photo-status"
        >
          {STATUS_TEXT[photo.status]}
        </span>
      )}
      {unsaved && (
        <span className="absolute top-0.5 right-0.5 rounded bg-signal-500 px-1 text-[10px] font-semibold text-gauge-900" data-testid="photo-unsaved">
          Unsaved
        </span>
      )}
    </>
  );
  const frame = `relative flex h-14 w-20 items-center justify-center overflow-hidden rounded bg-gauge-100 ${selected ? "ring-3 ring-signal-500" : "ring-1 ring-gauge-200"}`;
  return (
    <li
      className="shrink-0"
      data-testid="photo-card"
      data-photo-id={photo.id}
      data-status={photo.status}
      data-selected={selected ? "true" : "false"}
      title={`${viewLabel} · ${photo.fileName}${photo.width ? ` · ${photo.width} × ${photo.height} px` : ""}`}
    >
      {onSelect && photo.status === "ready" ? (
        <button
          type="button"
          className={`${frame} hover:opacity-90`}
          aria-pressed={selected}
          aria-label={`Open the ${viewLabel} photo ${photo.fileName} on the canvas`}
          onClick={onSelect}
          data-testid="photo-select"
        >
          {body}
        </button>
      ) : (
        <div className={frame}>{body}</div>
      )}
    </li>
  );
}
