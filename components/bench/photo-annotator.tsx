"use client";

import { useQuery } from "@tanstack/react-query";
import { useCallback, useRef, useState, useSyncExternalStore } from "react";
import { createPortal } from "react-dom";
import { AnnotationCanvasLazy, type AnnotationCanvasHandle, type AnnotationCanvasProps } from "@/components/annotate/annotation-canvas-lazy";
import type { AllowedDefect, GhostShape, ZoneInput } from "@/components/annotate/types";
import { FormMessage } from "@/components/ui/form-field";
import type { PhotoDto } from "@/lib/photos/dto";
import { ConflictDialog, type ConflictChoice } from "./conflict-dialog";
import type { RegionAutosaver, SaveStatus, ServerSet } from "./region-autosaver";
import { fetchRegionSet } from "./regions-api";
import { SaveProblem, SaveStatusLine } from "./save-status";
import type { SaverRegistry } from "./saver-registry";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { SuggestionsBar } from "./suggestions-bar";
import { unitSessionKeys } from "@/lib/query-keys/units";

/** What the canvas needs of a photo (the Bench passes its PhotoDto; the recheck a blind subset). */
export type AnnotatablePhoto = Pick<PhotoDto, "id" | "fileName" | "width" | "height" | "preview" | "urls">;

type PhotoAnnotatorProps = {
  photo: AnnotatablePhoto;
  /** Loads the photo's saved set (default: the photo's own regions, GET /api/photos/:id/regions). */
  loadSet?: (photoId: string) => Promise<ServerSet>;
  /** Keeps the region sessions of different sets of one photo apart (the recheck's from the Bench's). */
  sessionScope?: "bench" | "recheck";
  viewLabel: string;
  allowedDefects: readonly AllowedDefect[];
  zones: readonly ZoneInput[];
  /** Why this person cannot change the regions now, or null. */
  lock: string | null;
  screenView: boolean;
  registry: SaverRegistry;
  /** Where the Bench shows this photo's region list, its suggestions and its save status. */
  slots: { regions: HTMLElement | null; suggestions: HTMLElement | null; status: HTMLElement | null };
  /** How the canvas joins the rest of the Bench: keys, focus, the tool carried from photo to photo. */
  link: CanvasLink;
};

export type CanvasLink = Pick<AnnotationCanvasProps, "keyArea" | "autoFocus" | "startWith" | "onToolChange" | "pageShortcuts">;

const NOT_LOADED: SaveStatus = { kind: "saved", version: 0, at: null };
const noSubscription = () => () => {};

function useSaverStatus(saver: RegionAutosaver | null): SaveStatus {
  return useSyncExternalStore(saver?.subscribe ?? noSubscription, saver?.getStatus ?? (() => NOT_LOADED), saver?.getStatus ?? (() => NOT_LOADED));
}

/**
 * One photo on the Bench: its saved regions loaded (or the unsaved edits kept from earlier in
 * this visit), the canvas, autosave with its status line, the conflict dialog and suggestions.
 * Give it a `key` per photo: switching photos starts a fresh canvas.
 */
export function PhotoAnnotator({ photo, loadSet = fetchRegionSet, sessionScope = "bench", viewLabel, allowedDefects, zones, lock, screenView, registry, slots, link }: PhotoAnnotatorProps) {
  const canvasRef = useRef<AnnotationCanvasHandle>(null);
  const [ghosts, setGhosts] = useState<GhostShape[]>([]);
  const session = useQuery({
    queryKey: [...unitSessionKeys.regionSession(photo.id), sessionScope],
    queryFn: async () => {
      const existing = registry.get(photo.id);
      if (existing?.hasUnsaved()) return { saver: existing, initial: existing.latestRegions() };
      const set = await loadSet(photo.id);
      return { saver: registry.open(photo.id, set), initial: set.regions };
    },
    // Loaded once per visit of the photo; the saver owns the state from then on.
    staleTime: Infinity,
    gcTime: 0,
    refetchOnWindowFocus: false,
  });
  const saver = session.data?.saver ?? null;
  const status = useSaverStatus(saver);
  const readOnly = lock !== null;

  const onChange = useCallback((payload: RegionSetPayload) => saver?.edit(payload), [saver]);
  const resolve = (choice: ConflictChoice, keep: RegionSetPayload) => {
    if (!saver || status.kind !== "conflict") return;
    saver.resolveConflict(status.current, keep);
    if (choice !== "mine") canvasRef.current?.replaceRegions(keep);
    canvasRef.current?.focus();
  };
  const accept = (list: readonly GhostShape[]) =>
    canvasRef.current?.addRegions(list.map((g) => (g.role === "surface" ? { role: "surface" as const, shape: g.shape } : { role: "defect" as const, defect: g.defect, shape: g.shape })));

  if (!photo.urls || !photo.width || !photo.height || !photo.preview) return <p className="text-sm text-gauge-700">This photo is not ready yet.</p>;
  return (
    <section className="relative flex h-full min-h-0 flex-col" aria-label={`Annotate the ${viewLabel} photo ${photo.fileName}`} data-testid="photo-annotator" data-photo-id={photo.id}>
      {session.isError && <FormMessage kind="error">The saved regions could not be loaded: {session.error.message} Reload the page to try again.</FormMessage>}
      {session.isPending && (
        <div className="flex min-h-0 flex-1 items-center justify-center rounded-lg bg-gauge-900 text-sm text-gauge-100" role="status">
          Loading the regions…
        </div>
      )}
      {session.data && (
        <AnnotationCanvasLazy
          key={`${photo.id}-${session.dataUpdatedAt}`}
          handleRef={canvasRef}
          imageUrl={photo.urls.preview}
          original={{ width: photo.width, height: photo.height }}
          preview={photo.preview}
          allowedDefects={allowedDefects}
          zones={zones}
          initialRegions={session.data.initial}
          onChange={readOnly ? undefined : onChange}
          readOnly={readOnly}
          ghosts={ghosts}
          regionListContainer={slots.regions}
          className="min-h-0 flex-1"
          {...link}
        />
      )}
      {!readOnly && (
        // Over the photo's lower edge, not below it: a failed save must not push the canvas up.
        <div className="pointer-events-none absolute inset-x-16 bottom-12 z-10 flex justify-center [&>*]:pointer-events-auto">
          <SaveProblem status={status} />
        </div>
      )}
      {!readOnly && saver && slots.status && createPortal(<SaveStatusLine status={status} onRetry={() => saver.retryNow()} />, slots.status)}
      {!readOnly &&
        session.data &&
        slots.suggestions &&
        createPortal(<SuggestionsBar photoId={photo.id} screenView={screenView} ghosts={ghosts} onGhosts={setGhosts} onAccept={accept} />, slots.suggestions)}
      {saver && status.kind === "conflict" && <ConflictDialog current={status.current} base={saver.lastSaved()} mine={saver.latestRegions()} onChoose={resolve} />}
    </section>
  );
}
