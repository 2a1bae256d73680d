"use client";
/**
 * The upload queue of the Bench: each file goes intent → PUT to the store (with progress) →
 * finalise, three at a time. A file keeps its ticket once its bytes are in the store, so Retry
 * after an outage only repeats what failed. Cancel aborts the request in flight.
 */
import { useQueryClient } from "@tanstack/react-query";
import { useCallback, useEffect, useReducer, useRef } from "react";
import { ApiError, apiFetch } from "@/lib/http/client";
import type { PhotoDto } from "@/lib/photos/dto";
import { putWithProgress, UploadError } from "./put-with-progress";
import { unitKeys } from "@/lib/query-keys/units";

export type UploadPhase = "selected" | "waiting" | "requesting" | "uploading" | "finalising" | "ready" | "processing" | "failed" | "cancelled";

export type UploadItem = {
  id: string;
  file: File;
  viewKey: string;
  phase: UploadPhase;
  loaded: number;
  error: string | null;
  /** False for a refusal of the file itself: retrying the same bytes cannot help. */
  retryable: boolean;
  ticket: string | null;
  /** The bytes are in the store under `ticket`; a retry only finalises again. */
  uploaded: boolean;
  photoId: string | null;
  note: string | null;
};

type IntentResponse = { photoId: string; ticket: string; upload: { url: string; headers: Record<string, string> } };
type FinaliseResponse = { photo: PhotoDto; outcome: "accepted" | "replayed" | "duplicate" };

type Action =
  { type: "add"; files: File[]; viewKeys: string[] } | { type: "patch"; id: string; patch: Partial<UploadItem> } | { type: "remove"; id: string } | { type: "start" } | { type: "clearFinished" };

const ACTIVE: UploadPhase[] = ["requesting", "uploading", "finalising"];
export const isActive = (item: UploadItem) => ACTIVE.includes(item.phase);
const PARALLEL = 3;
let counter = 0;

function reducer(items: UploadItem[], action: Action): UploadItem[] {
  switch (action.type) {
    case "add":
      return [
        ...items,
        ...action.files.map((file, i) => ({
          id: `upload-${Date.now().toString(36)}-${++counter}`,
          file,
          viewKey: action.viewKeys[i] ?? "",
          phase: "selected" as const,
          loaded: 0,
          error: null,
          retryable: true,
          ticket: null,
          uploaded: false,
          photoId: null,
          note: null,
        })),
      ];
    case "patch":
      return items.map((item) => (item.id === action.id ? { ...item, ...action.patch } : item));
    case "remove":
      return items.filter((item) => item.id !== action.id || isActive(item));
    case "start":
      return items.map((item) => (item.phase === "selected" ? { ...item, phase: "waiting", error: null } : item));
    case "clearFinished":
      return items.filter((item) => !["ready", "processing", "cancelled"].includes(item.phase));
  }
}

export type BatchProgress = { total: number; done: number; failed: number; loadedBytes: number; totalBytes: number; running: boolean };

export function batchProgress(items: UploadItem[]): BatchProgress {
  const batch = items.filter((item) => item.phase !== "selected" && item.phase !== "cancelled");
  const sent = (item: UploadItem) => (item.uploaded || item.phase === "ready" || item.phase === "processing" ? item.file.size : item.loaded);
  return {
    total: batch.length,
    done: batch.filter((item) => item.phase === "ready" || item.phase === "processing").length,
    failed: batch.filter((item) => item.phase === "failed").length,
    loadedBytes: batch.reduce((sum, item) => sum + sent(item), 0),
    totalBytes: batch.reduce((sum, item) => sum + item.file.size, 0),
    running: batch.some((item) => item.phase === "waiting" || isActive(item)),
  };
}

export function usePhotoUploads(unitId: string) {
  const [items, dispatch] = useReducer(reducer, []);
  const controllers = useRef(new Map<string, AbortController>());
  const queryClient = useQueryClient();
  const patch = useCallback((id: string, p: Partial<UploadItem>) => dispatch({ type: "patch", id, patch: p }), []);

  const run = useCallback(
    async (item: UploadItem) => {
      const controller = new AbortController();
      controllers.current.set(item.id, controller);
      const { signal } = controller;
      try {
        let ticket = item.ticket;
        if (!item.uploaded || !ticket) {
          patch(item.id, { phase: "requesting", loaded: 0, error: null });
          const intent = await apiFetch<IntentResponse>(`/api/units/${unitId}/photos/uploads`, {
            body: { viewKey: item.viewKey, fileName: item.file.name, contentType: item.file.type || "application/octet-stream", bytes: item.file.size },
            signal,
          });
          ticket = intent.ticket;
          patch(item.id, { phase: "uploading", ticket, photoId: intent.photoId });
          await putWithProgress(intent.upload.url, item.file, { headers: intent.upload.headers, signal, onProgress: (loaded) => patch(item.id, { loaded }) });
          patch(item.id, { uploaded: true, loaded: item.file.size });
        }
        patch(item.id, { phase: "finalising" });
        const result = await apiFetch<FinaliseResponse>(`/api/units/${unitId}/photos`, { body: { ticket }, signal });
        const note = result.outcome === "duplicate" ? "This exact file is already a photo of this unit; it was not added twice." : null;
        patch(item.id, { phase: result.photo.status === "ready" ? "ready" : "processing", photoId: result.photo.id, note });
      } catch (err) {
        if (signal.aborted || (err instanceof UploadError && err.kind === "cancelled")) {
          patch(item.id, { phase: "cancelled", error: null });
        } else if (err instanceof ApiError) {
          // A refused file (its own code) will be refused again; a bad or stale ticket needs a fresh upload.
          const refused = ["empty", "too_large", "unsupported_format", "too_many_pixels", "corrupt"].includes(err.code);
          const fresh = err.code === "bad_request" || err.code === "conflict";
          patch(item.id, { phase: "failed", error: err.message, retryable: !refused, ...(fresh ? { uploaded: false, ticket: null } : {}) });
        } else {
          patch(item.id, { phase: "failed", error: err instanceof Error ? err.message : String(err), retryable: true });
        }
      } finally {
        controllers.current.delete(item.id);
        void queryClient.invalidateQueries({ queryKey: unitKeys.photos(unitId) });
      }
    },
    [patch, queryClient, unitId],
  );

  // Start waiting files while fewer than PARALLEL are in flight.
  useEffect(() => {
    const free = PARALLEL - items.filter(isActive).length;
    const next = items.filter((item) => item.phase === "waiting").slice(0, Math.max(0, free));
    for (const item of next) {
      patch(item.id, { phase: "requesting" });
      void run(item);
    }
  }, [items, patch, run]);

  useEffect(() => {
    const inFlight = controllers.current;
    return () => inFlight.forEach((controller) => controller.abort());
  }, []);

  return {
    items,
    add: (files: File[], viewKeys: string[]) => dispatch({ type: "add", files, viewKeys }),
    setView: (id: string, viewKey: string) => patch(id, { viewKey }),
    remove: (id: string) => dispatch({ type: "remove", id }),
    start: () => dispatch({ type: "start" }),
    cancel: (id: string) => {
      const controller = controllers.current.get(id);
      if (controller) controller.abort();
      else patch(id, { phase: "cancelled" });
    },
    retry: (id: string) => patch(id, { phase: "waiting", error: null }),
    clearFinished: () => dispatch({ type: "clearFinished" }),
  };
}
