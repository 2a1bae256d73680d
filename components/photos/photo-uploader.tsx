"use client";
/**
 * Adds photos to a unit: several files at once (picker or drag and drop) or the device camera,
 * each assigned to a view of the part type; per-file and batch progress, cancel and retry.
 * Self-contained (props only), so the Bench page can host it as it is.
 */
import { useQuery } from "@tanstack/react-query";
import { useEffect, useMemo, useRef, useState } from "react";
import { useHydrated } from "@/components/ui/use-hydrated";
import { apiFetch } from "@/lib/http/client";
import type { PhotoDto } from "@/lib/photos/dto";
import { suggestViews, type ViewChoice } from "@/lib/photos/views";
import { batchProgress, isActive, usePhotoUploads, type UploadItem } from "./use-photo-uploads";
import { ProgressBar } from "./progress-bar";
import { unitKeys } from "@/lib/query-keys/units";

const sizeText = (bytes: number) => (bytes >= 1024 * 1024 ? `${(bytes / (1024 * 1024)).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} KB`);

const PHASE_TEXT: Record<UploadItem["phase"], string> = {
  selected: "Ready to upload",
  waiting: "Waiting…",
  requesting: "Preparing…",
  uploading: "Uploading…",
  finalising: "Checking the file…",
  ready: "Ready",
  processing: "Uploaded — processing",
  failed: "Failed",
  cancelled: "Cancelled",
};

export function PhotoUploader({ unitId, views }: { unitId: string; views: ViewChoice[] }) {
  const uploads = usePhotoUploads(unitId);
  // Files chosen before hydration would reach no handler and vanish without a word.
  const hydrated = useHydrated();
  const [dragging, setDragging] = useState(false);
  const pickerRef = useRef<HTMLInputElement>(null);
  const cameraRef = useRef<HTMLInputElement>(null);
  // The strip's data (shared query) says which views already have a photo.
  const existing = useQuery({
    queryKey: unitKeys.photos(unitId),
    queryFn: () => apiFetch<{ photos: PhotoDto[] }>(`/api/units/${unitId}/photos`),
  });
  const covered = useMemo(() => {
    const keys = new Set((existing.data?.photos ?? []).filter((p) => p.status !== "failed").map((p) => p.viewKey));
    for (const item of uploads.items) if (item.phase !== "cancelled" && item.phase !== "failed") keys.add(item.viewKey);
    return keys;
  }, [existing.data, uploads.items]);

  const addFiles = (list: FileList | null) => {
    const files = [...(list ?? [])];
    if (files.length) uploads.add(files, suggestViews(views, covered, files.length));
  };

  const progress = batchProgress(uploads.items);
  const selected = uploads.items.filter((item) => item.phase === "selected");
  const percent = progress.totalBytes ? Math.round((progress.loadedBytes / progress.totalBytes) * 100) : 0;

  return (
    <section className="card space-y-4 p-4 sm:p-5" aria-labelledby="photo-uploader-title" data-testid="photo-uploader">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="photo-uploader-title" className="text-lg font-semibold">
          Add photos
        </h2>
        <p className="text-xs text-gauge-600">JPEG, PNG or WebP, up to 40 MB and 50 megapixels each.</p>
      </div>

      <div
        data-testid="photo-drop-zone"
        onDragOver={(e) => {
          e.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={(e) => {
          e.preventDefault();
          setDragging(false);
          addFiles(e.dataTransfer.files);
        }}
        className={`flex flex-col items-center gap-3 rounded-lg border-2 border-dashed px-4 py-6 text-center transition-colors ${dragging ? "border-signal-500 bg-signal-50" : "border-gauge-300 bg-gauge-50"}`}
      >
        <p className="text-sm text-gauge-800">Drop photos here, or</p>
        <div className="flex flex-wrap justify-center gap-2">
          <button type="button" className="btn-secondary" disabled={!hydrated} onClick={() => pickerRef.current?.click()}>
            Choose photos
          </button>
          <button type="button" className="btn-secondary" disabled={!hydrated} onClick={() => cameraRef.current?.click()}>
            Use camera
          </button>
        </div>
        <input
          ref={pickerRef}
          type="file"
          accept="image/*"
          multiple
          className="sr-only"
          aria-label="Choose photos"
          data-testid="photo-file-input"
          disabled={!hydrated}
          onChange={(e) => {
            addFiles(e.target.files);
            e.target.value = "";
          }}
        />
        <input
          ref={cameraRef}
          type="file"
          accept="image/*"
          capture="environment"
          className="sr-only"
          aria-label="Take a photo with the camera"
          disabled={!hydrated}
          onChange={(e) => {
            addFiles(e.target.files);
            e.target.value = "";
          }}
        />
      </div>

      {progress.total > 0 && (
        <div data-testid="batch-progress" className="space-y-1">
          <div className="flex justify-between text-sm">
            <span>
              {progress.done} of {progress.total} uploaded{progress.failed ? ` · ${progress.failed} failed` : ""}
            </span>
            <span>{percent} %</span>
          </div>
          <ProgressBar label="All files" value={percent} />
        </div>
      )}

      {uploads.items.length > 0 && (
        <ul className="divide-y divide-gauge-100" aria-label="Files to upload">
          {uploads.items.map((item) => (
            <UploadRow key={item.id} item={item} views={views} onView={uploads.setView} onCancel={uploads.cancel} onRetry={uploads.retry} onRemove={uploads.remove} />
          ))}
        </ul>
      )}

      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-primary" disabled={selected.length === 0 || selected.some((item) => !item.viewKey)} onClick={uploads.start}>
          {selected.length ? `Upload ${selected.length} photo${selected.length === 1 ? "" : "s"}` : "Upload"}
        </button>
        {uploads.items.some((item) => ["ready", "processing", "cancelled"].includes(item.phase)) && (
          <button type="button" className="btn-secondary" onClick={uploads.clearFinished}>
            Clear finished
          </button>
        )}
      </div>
    </section>
  );
}

function LocalPreview({ file }: { file: File }) {
  const ref = useRef<HTMLImageElement>(null);
  // The blob URL is an external resource: made and revoked with the element that shows it.
  useEffect(() => {
    const objectUrl = URL.createObjectURL(file);
    if (ref.current) ref.current.src = objectUrl;
    return () => URL.revokeObjectURL(objectUrl);
  }, [file]);
  // eslint-disable-next-line @next/next/no-img-element -- a local blob, not an optimisable asset
  return <img ref={ref} alt="" className="h-14 w-14 shrink-0 rounded border border-gauge-200 bg-gauge-100 object-cover" />;
}

function UploadRow({
  item,
  views,
  onView,
  onCancel,
  onRetry,
  onRemove,
}: {
  item: UploadItem;
  views: ViewChoice[];
  onView: (id: string, key: string) => void;
  onCancel: (id: string) => void;
  onRetry: (id: string) => void;
  onRemove: (id: string) => void;
}) {
  const active = isActive(item) || item.phase === "waiting";
  const percent = item.uploaded || item.phase === "ready" || item.phase === "processing" ? 100 : Math.round((item.loaded / Math.max(1, item.file.size)) * 100);
  const selectId = `${item.id}-view`;
  return (
    <li className="flex flex-col gap-2 py-3 sm:flex-row sm:items-center" data-testid="upload-row" data-phase={item.phase}>
      <div className="flex min-w-0 flex-1 items-center gap-3">
        <LocalPreview file={item.file} />
        <div className="min-w-0 flex-1 space-y-1">
          <div className="flex items-baseline justify-between gap-2 text-sm">
            <span className="truncate font-medium" title={item.file.name}>
              {item.file.name}
            </span>
            <span className="shrink-0 text-xs text-gauge-600">{sizeText(item.file.size)}</span>
          </div>
          <ProgressBar label={`Upload of ${item.file.name}`} value={percent} tone={item.phase === "failed" ? "fault" : item.phase === "ready" ? "ok" : "normal"} />
          <p className={`text-xs ${item.phase === "failed" ? "text-fault-700" : "text-gauge-700"}`} role={item.phase === "failed" ? "alert" : undefined} data-testid="upload-status">
            {item.error ?? item.note ?? PHASE_TEXT[item.phase]}
          </p>
        </div>
      </div>
      <div className="flex items-center gap-2 sm:w-auto">
        <label htmlFor={selectId} className="sr-only">
          View of {item.file.name}
        </label>
        <select
          id={selectId}
          className="field-input min-w-36 flex-1 py-1.5 sm:w-auto sm:flex-none"
          value={item.viewKey}
          disabled={item.phase !== "selected"}
          onChange={(e) => onView(item.id, e.target.value)}
        >
          {!item.viewKey && <option value="">Choose the view</option>}
          {views.map((v) => (
            <option key={v.key} value={v.key}>
              {v.label}
              {v.required ? "" : " (optional)"}
            </option>
          ))}
        </select>
        {active && (
          <button type="button" className="btn-secondary py-1.5" onClick={() => onCancel(item.id)}>
            Cancel
          </button>
        )}
        {(item.phase === "failed" && item.retryable) || item.phase === "cancelled" ? (
          <button type="button" className="btn-secondary py-1.5" onClick={() => onRetry(item.id)}>
            Retry
          </button>
        ) : null}
        {(item.phase === "selected" || item.phase === "failed" || item.phase === "cancelled") && (
          <button type="button" className="btn-secondary py-1.5" aria-label={`Remove ${item.file.name}`} onClick={() => onRemove(item.id)}>
            Remove
          </button>
        )}
      </div>
    </li>
  );
}
