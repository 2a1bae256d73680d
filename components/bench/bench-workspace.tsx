"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect, useMemo, useState, useSyncExternalStore } from "react";
import type { AllowedDefect } from "@/components/annotate/types";
import { GradeHistory } from "@/components/grading/grade-history";
import { GradePanel, type MeasurementLabels } from "@/components/grading/grade-panel";
import { GradeWhatIf } from "@/components/grading/grade-what-if";
import { PhotoStrip } from "@/components/photos/photo-strip";
import { PhotoUploader } from "@/components/photos/photo-uploader";
import { LeaseHeartbeat } from "@/components/queue/lease-heartbeat";
import type { DefectClassDefinition, ViewDefinition } from "@/db/schema/lots";
import { apiFetch } from "@/lib/http/client";
import type { PhotoDto } from "@/lib/photos/dto";
import { benchClassOrder, startingClass } from "@/lib/annotate/class-order";
import { isScreenView } from "@/lib/regions/suggestion-mapping";
import { annotateLock, otherHolder, type BenchPerson } from "./annotate-lock";
import { ChecklistPanel } from "./checklist-panel";
import { PhotoAnnotator, type CanvasLink } from "./photo-annotator";
import { PHOTO_SHORTCUTS, usePhotoKeys } from "./photo-keys";
import { useToolInHand } from "./tool-in-hand";
import { putRegionSet } from "./regions-api";
import { SaverRegistry } from "./saver-registry";
import { UnitHeader } from "./unit-header";
import { unitQueryKey, useUnit, type UnitView } from "./use-unit";
import { useMediaQuery } from "./use-media-query";

export type BenchPartType = {
  views: ViewDefinition[];
  defectClasses: DefectClassDefinition[];
  panelResolution: { width: number; height: number } | null;
};

type BenchWorkspaceProps = {
  initial: UnitView;
  me: BenchPerson;
  canCorrect: boolean;
  partType: BenchPartType;
  rubricVersions: { version: number; status: "draft" | "published" }[];
  initialPhotoId: string | null;
};

/** A switch waits this long for the previous photo's save; past it the save goes on in the background. */
const SWITCH_FLUSH_MS = 4000;

function useUnsavedPhotos(registry: SaverRegistry): ReadonlySet<string> {
  const key = useSyncExternalStore(registry.subscribe, registry.unsavedPhotoIds, () => "");
  return useMemo(() => new Set(key ? key.split(" ") : []), [key]);
}

/**
 * The Bench for one unit: header with the lease, photos by view, the canvas of the selected photo
 * with autosave, the region list, checklist, measurement and grade. Owns the selected photo and
 * one autosaver per photo (so a switch never loses an edit); the panels own their own data.
 * Desktop: the canvas large on the left, panels in a column beside it; narrower: stacked, canvas first.
 */
export function BenchWorkspace({ initial, me, canCorrect, partType, rubricVersions, initialPhotoId }: BenchWorkspaceProps) {
  const unitId = initial.unit.id;
  const queryClient = useQueryClient();
  const { data: view } = useUnit(unitId, initial);
  const [registry] = useState(() => new SaverRegistry(putRegionSet, () => void queryClient.invalidateQueries({ queryKey: ["unit-measurement", unitId] })));
  const unsaved = useUnsavedPhotos(registry);
  const photos = useQuery({ queryKey: ["unit-photos", unitId], queryFn: () => apiFetch<{ photos: PhotoDto[] }>(`/api/units/${unitId}/photos`) });
  const [selectedId, setSelectedId] = useState<string | null>(initialPhotoId);
  const [uploadOpen, setUploadOpen] = useState<boolean | null>(null);
  const wide = useMediaQuery("(min-width: 1280px)");
  const [sideSlot, setSideSlot] = useState<HTMLElement | null>(null);
  const [belowSlot, setBelowSlot] = useState<HTMLElement | null>(null);
  const [markingArea, setMarkingArea] = useState<HTMLElement | null>(null);
  // The next canvas takes the keyboard once the inspector has switched photos.
  const [switched, setSwitched] = useState(false);

  const ready = (photos.data?.photos ?? []).filter((p) => p.status === "ready");
  const selected = ready.find((p) => p.id === selectedId) ?? ready[0] ?? null;
  const lock = annotateLock(view, me);
  const classKeys = useMemo(() => benchClassOrder(partType.defectClasses).map((d) => d.key), [partType.defectClasses]);
  const { hand, setHand } = useToolInHand({ area: markingArea, classKeys, startingDefect: startingClass(partType.defectClasses), readOnly: lock !== null });
  const holder = otherHolder(view, me);
  const holdsLease = view.unit.status === "on_bench" && view.unit.leaseHolderId === me.id;
  const views = useMemo(() => partType.views.map((v) => ({ key: v.key, label: v.label, required: v.required })), [partType.views]);
  const allowedDefects = useMemo<AllowedDefect[]>(() => partType.defectClasses.map((d) => ({ key: d.key, label: d.label, severity: d.severity })), [partType.defectClasses]);
  const labels = useMemo<MeasurementLabels>(
    () => ({ defects: Object.fromEntries(partType.defectClasses.map((d) => [d.key, d.label])), zones: Object.fromEntries(partType.views.flatMap((v) => v.zones.map((z) => [z.id, z.label]))), views: Object.fromEntries(views.map((v) => [v.key, v.label])) }),
    [partType, views],
  );
  const selectedView = selected ? partType.views.find((v) => v.key === selected.viewKey) : undefined;
  const canUpload = me.canRecord && (view.unit.status === "queued" || view.unit.status === "on_bench");
  // A unit without photos opens with the uploader; otherwise it waits behind "Add photos" so the
  // canvas sits high. Decided once, when the photos first load, so the uploader does not close
  // under the inspector when the first upload turns into a photo.
  const hasPhotos = photos.isSuccess && photos.data.photos.length > 0;
  if (uploadOpen === null && photos.isSuccess) setUploadOpen(photos.data.photos.length === 0);
  const uploaderShown = uploadOpen === true;

  // Leaving the page (closing the tab, reloading) while edits are unsaved asks first.
  useEffect(() => {
    const warn = (e: BeforeUnloadEvent) => {
      if (!registry.anyUnsaved()) return;
      e.preventDefault();
      e.returnValue = "";
    };
    const online = () => registry.retryAll();
    window.addEventListener("beforeunload", warn);
    window.addEventListener("online", online);
    return () => {
      window.removeEventListener("beforeunload", warn);
      window.removeEventListener("online", online);
      // Navigating elsewhere in the app: whatever is owed is still sent.
      void registry.flushAll();
    };
  }, [registry]);

  const select = async (photo: PhotoDto) => {
    if (selected && photo.id !== selected.id) {
      await Promise.race([registry.get(selected.id)?.flush(), new Promise((r) => setTimeout(r, SWITCH_FLUSH_MS))]);
    }
    setSelectedId(photo.id);
    setSwitched(true);
    const url = new URL(window.location.href);
    url.searchParams.set("photo", photo.id);
    window.history.replaceState(window.history.state, "", url);
  };

  usePhotoKeys({ area: markingArea, ids: ready.map((p) => p.id), currentId: selected?.id ?? null, onOpen: (id) => void select(ready.find((p) => p.id === id)!) });
  const link = useMemo<CanvasLink>(
    () => ({ keyArea: markingArea, autoFocus: switched, startWith: hand, onToolChange: setHand, pageShortcuts: [{ title: "Photos", shortcuts: PHOTO_SHORTCUTS }] }),
    [markingArea, switched, hand, setHand],
  );

  const regions = <div ref={wide ? setSideSlot : setBelowSlot} className="max-h-[45vh] overflow-y-auto rounded-lg border border-gauge-200 bg-white p-3 xl:max-h-[40vh]" data-testid="region-slot" />;
  return (
    <div className="space-y-4">
      <UnitHeader initial={initial} me={me} />
      {holdsLease && <LeaseHeartbeat unitId={unitId} />}
      {holder && (
        <div role="status" className="rounded-md border-2 border-signal-500 bg-signal-50 px-4 py-3 text-sm font-medium text-signal-700" data-testid="read-only-banner">
          Read-only: {lock}
        </div>
      )}
      <div className="flex flex-col gap-6 xl:flex-row xl:items-start">
        <div ref={setMarkingArea} className="min-w-0 flex-1 space-y-4">
          <div id="photos" className="space-y-2">
            <PhotoStrip
              unitId={unitId}
              views={views}
              canManage={canUpload}
              selection={{ selectedId: selected?.id ?? null, onSelect: (p) => void select(p), unsavedIds: unsaved }}
              headerAction={
                canUpload && (hasPhotos || uploaderShown) ? (
                  <button type="button" className="btn-secondary px-3 py-1 text-sm" aria-expanded={uploaderShown} aria-controls="bench-uploader" onClick={() => setUploadOpen((open) => !open)} data-testid="add-photos-toggle">
                    {uploaderShown ? "Hide the uploader" : "Add photos"}
                  </button>
                ) : null
              }
            />
            {canUpload && (
              // Hidden, not unmounted, so uploads in flight carry on while the uploader is out of the way.
              <div id="bench-uploader" hidden={!uploaderShown}>
                <PhotoUploader unitId={unitId} views={views} />
              </div>
            )}
          </div>
          {selected ? (
            <PhotoAnnotator
              key={selected.id}
              photo={selected}
              viewLabel={selectedView?.label ?? selected.viewKey}
              allowedDefects={allowedDefects}
              zones={selectedView?.zones ?? []}
              lock={lock}
              screenView={isScreenView(partType, selected.viewKey)}
              registry={registry}
              regionListContainer={wide ? sideSlot : belowSlot}
              link={link}
            />
          ) : (
            <p className="rounded-lg border border-dashed border-gauge-300 p-6 text-center text-sm text-gauge-700">
              {photos.isPending ? "Loading photos…" : "No processed photo yet. Add photos of the required views; each opens here for marking once it is ready."}
            </p>
          )}
          {!wide && selected && regions}
        </div>
        <aside className="w-full space-y-4 xl:sticky xl:top-4 xl:max-h-[calc(100vh-2rem)] xl:w-[24rem] xl:shrink-0 xl:overflow-y-auto" aria-label="Unit panels">
          {wide && selected && regions}
          <ChecklistPanel initial={initial} me={me} />
          <div id="grade" className="space-y-4">
            <GradePanel
              unitId={unitId}
              canGrade={me.canRecord}
              canCorrect={canCorrect}
              labels={labels}
              unsavedRegions={unsaved.size > 0}
              beforeMeasure={() => registry.flushAll()}
              onGraded={() => void queryClient.invalidateQueries({ queryKey: unitQueryKey(unitId) })}
            />
            <GradeHistory unitId={unitId} />
            <GradeWhatIf unitId={unitId} versions={rubricVersions} />
          </div>
        </aside>
      </div>
    </div>
  );
}
