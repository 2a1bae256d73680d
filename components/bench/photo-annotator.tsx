"use client";

import { useQuery } from "@tanstack/react-query";
import { useCallback, useRef, useState, useSyncExternalStore } from "react";
import { AnnotationCanvasLazy, type AnnotationCanvasHandle, type AnnotationCanvasProps } from "@/components/annotate/annotation-canvas-lazy";
import type { AllowedDefect, GhostShape, ZoneInput } from "@/components/annotate/types";
import { FormMessage } from "@/components/ui/form-field";
import type { PhotoDto } from "@/lib/photos/dto";
import { ConflictDialog, type ConflictChoice } from "./conflict-dialog";
import type { RegionAutosaver, SaveStatus } from "./region-autosaver";
import { fetchRegionSet } from "./regions-api";
import { SaveProblem, SaveStatusLine } from "./save-status";
import type { SaverRegistry } from "./saver-registry";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { SuggestionsBar } from "./suggestions-bar";

type PhotoAnnotatorProps = {
  photo: PhotoDto;
  viewLabel: string;
  allowedDefects: readonly AllowedDefect[];
  zones: readonly ZoneInput[];
  /** Why this person cannot change the regions now, or null. */
  lock: string | null;
  screenView: boolean;
  registry: SaverRegistry;
  regionListContainer: HTMLElement | null;
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
export function PhotoAnnotator({ photo, viewLabel, allowedDefects, zones, lock, screenView, registry, regionListContainer, link }: PhotoAnnotatorProps) {
  const canvasRef = useRef<AnnotationCanvasHandle>(null);
  const [ghosts, setGhosts] = useState<GhostShape[]>([]);
  const session = useQuery({
    queryKey: ["bench-region-session", photo.id],
    queryFn: async () => {
      const existing = registry.get(photo.id);
      if (existing?.hasUnsaved()) return { saver: existing, initial: existing.latestRegions() };
      const set = await fetchRegionSet(photo.id);
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
    <section className="space-y-3" aria-label={`Annotate the ${viewLabel} photo ${photo.fileName}`} data-testid="photo-annotator" data-photo-id={photo.id}>
      <div className="flex items-center justify-between gap-3">
        <h2 className="min-w-0 truncate text-lg font-semibold" title={`${viewLabel} · ${photo.fileName} · ${photo.width} × ${photo.height} px`}>
          {viewLabel} <span className="text-sm font-normal text-gauge-700">· {photo.fileName} · {photo.width} × {photo.height} px</span>
        </h2>
        {!readOnly && saver && <SaveStatusLine status={status} onRetry={() => saver.retryNow()} />}
      </div>
      {session.isError && <FormMessage kind="error">The saved regions could not be loaded: {session.error.message} Reload the page to try again.</FormMessage>}
      {session.isPending && <div className="flex h-[65vh] min-h-[360px] items-center justify-center rounded-lg bg-gauge-900 text-sm text-gauge-100" role="status">Loading the regions…</div>}
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
          regionListContainer={regionListContainer}
          {...link}
        />
      )}
      {!readOnly && <SaveProblem status={status} />}
      {!readOnly && session.data && <SuggestionsBar photoId={photo.id} screenView={screenView} ghosts={ghosts} onGhosts={setGhosts} onAccept={accept} />}
      {saver && status.kind === "conflict" && <ConflictDialog current={status.current} base={saver.lastSaved()} mine={saver.latestRegions()} onChoose={resolve} />}
    </section>
  );
}
