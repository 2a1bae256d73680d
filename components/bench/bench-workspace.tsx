"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { UnitCertificates } from "@/components/certificates/unit-certificates";
import { useMemo, useState } from "react";
import type { AllowedDefect } from "@/components/annotate/types";
import { AddToGallery } from "@/components/gallery/add-to-gallery";
import { ReferencePanel, type ReferenceChoice } from "@/components/gallery/reference-panel";
import { ReferenceViewer } from "@/components/gallery/reference-viewer";
import type { GalleryCardDto } from "@/lib/gallery/dto";
import { GradeBadge } from "@/components/grading/grade-badge";
import { GradeHistory } from "@/components/grading/grade-history";
import { GradePanel, type MeasurementLabels } from "@/components/grading/grade-panel";
import { GradeWhatIf } from "@/components/grading/grade-what-if";
import type { GradeView } from "@/components/grading/types";
import { PhotoList } from "@/components/photos/photo-list";
import { PhotoStrip } from "@/components/photos/photo-strip";
import { PhotoUploader } from "@/components/photos/photo-uploader";
import { LeaseHeartbeat } from "@/components/queue/lease-heartbeat";
import { benchClassOrder, startingClass } from "@/lib/annotate/class-order";
import { can } from "@/lib/auth/permissions";
import { apiFetch } from "@/lib/http/client";
import { isScreenView } from "@/lib/regions/suggestion-mapping";
import { checklistSummary, ChecklistPanel } from "./checklist-panel";
import { PhotoAnnotator, type CanvasLink } from "./photo-annotator";
import { PHOTO_SHORTCUTS } from "./photo-keys";
import { openSection, SidePanels, usePanelState, type PanelSection } from "./side-panels";
import { TakeNext } from "./take-next";
import { useToolInHand } from "./tool-in-hand";
import { UnitHeader } from "./unit-header";
import { benchNotice, unitLock, type BenchPerson } from "./unit-lock";
import { useBenchPhotos } from "./use-bench-photos";
import type { UnitView } from "@/lib/units/dto";
import { useUnit } from "./use-unit";
import { unitKeys } from "@/lib/query-keys/units";
import type { DefectClassDefinition, ViewDefinition } from "@/lib/part-types/schemas";

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
  /** May add a graded unit's photo to the Gallery (trainers and leads). */
  canPromote: boolean;
  /** May issue and revoke condition certificates (leads). */
  canCertify?: boolean;
};

const BANNER_TONE = {
  held: "border-signal-500 bg-signal-50 text-signal-700",
  closed: "border-gauge-300 bg-gauge-50 text-gauge-800",
  "view-only": "border-gauge-300 bg-gauge-50 text-gauge-800",
} as const;

/**
 * The Bench for one unit, as a workspace that fills the window: the unit in one header line, the
 * read-only reason (if any) once, then the photo on the canvas with the tool rail and class bar,
 * the photos as a strip under it, and the panels (regions, checklist, measurement and grade,
 * photos) in a column that folds. Landscape screens put the panels beside the canvas, portrait
 * ones below it. Owns the selected photo and the tool in hand; the panels own their own data.
 */
export function BenchWorkspace({ initial, me, canCorrect, partType, rubricVersions, initialPhotoId, canPromote, canCertify = false }: BenchWorkspaceProps) {
  const unitId = initial.unit.id;
  const queryClient = useQueryClient();
  const { data: view } = useUnit(unitId, initial);
  const [markingArea, setMarkingArea] = useState<HTMLElement | null>(null);
  const [regionSlot, setRegionSlot] = useState<HTMLElement | null>(null);
  const [suggestionSlot, setSuggestionSlot] = useState<HTMLElement | null>(null);
  const [statusSlot, setStatusSlot] = useState<HTMLElement | null>(null);
  const [uploadOpen, setUploadOpen] = useState<boolean | null>(null);
  const [panels, setPanels] = usePanelState();
  const [referenceChoice, setReferenceChoice] = useState<ReferenceChoice>("hand");
  const [reference, setReference] = useState<GalleryCardDto | null>(null);
  const { photos, selected, select, registry, unsaved, switched } = useBenchPhotos({ unitId, initialPhotoId, keyArea: markingArea });
  const grades = useQuery({ queryKey: unitKeys.grades(unitId), queryFn: () => apiFetch<{ grades: GradeView[] }>(`/api/units/${unitId}/grades`) });

  const lock = unitLock(view, me, "regions");
  const notice = benchNotice(view, me);
  const holdsLease = view.unit.status === "on_bench" && view.unit.leaseHolderId === me.id;
  const classKeys = useMemo(() => benchClassOrder(partType.defectClasses).map((d) => d.key), [partType.defectClasses]);
  const { hand, setHand } = useToolInHand({ area: markingArea, classKeys, startingDefect: startingClass(partType.defectClasses), readOnly: lock !== null });
  const views = useMemo(() => partType.views.map((v) => ({ key: v.key, label: v.label, required: v.required })), [partType.views]);
  const allowedDefects = useMemo<AllowedDefect[]>(() => partType.defectClasses.map((d) => ({ key: d.key, label: d.label, severity: d.severity })), [partType.defectClasses]);
  const labels = useMemo<MeasurementLabels>(
    () => ({
      defects: Object.fromEntries(partType.defectClasses.map((d) => [d.key, d.label])),
      zones: Object.fromEntries(partType.views.flatMap((v) => v.zones.map((z) => [z.id, z.label]))),
      views: Object.fromEntries(views.map((v) => [v.key, v.label])),
    }),
    [partType, views],
  );
  const selectedView = selected ? partType.views.find((v) => v.key === selected.viewKey) : undefined;
  const classLabels = labels.defects;
  // A reference belongs to a view: switching to a photo of another view puts it away.
  const shownReference = reference && selected && reference.viewKey === selected.viewKey ? reference : null;
  const canUpload = unitLock(view, me, "upload") === null;
  const canManagePhotos = unitLock(view, me, "photos") === null;
  const gradeLock = unitLock(view, me, "grade");
  const noPhotos = photos.isSuccess && photos.data.photos.length === 0;
  const graded = view.unit.status === "graded" || view.unit.status === "in_recheck" || view.unit.status === "final";
  // A unit without photos opens with the uploader where the canvas will be; later it opens over the
  // canvas on demand. Decided once, when the photos first load, so the uploader does not close under
  // the inspector when the first upload turns into a photo.
  if (uploadOpen === null && photos.isSuccess) setUploadOpen(noPhotos);
  const uploaderShown = canUpload && uploadOpen === true;
  const current = grades.data?.grades.at(-1) ?? null;
  const link = useMemo<CanvasLink>(
    () => ({ keyArea: markingArea, autoFocus: switched, startWith: hand, onToolChange: setHand, pageShortcuts: [{ title: "Photos", shortcuts: PHOTO_SHORTCUTS }] }),
    [markingArea, switched, hand, setHand],
  );

  const showPhotoPanel = () => openSection(setPanels, "photos");

  const sections: PanelSection[] = [
    {
      id: "regions",
      title: "Regions",
      content: (
        <div className="space-y-2">
          <div ref={setSuggestionSlot} />
          <div ref={setRegionSlot} data-testid="region-slot">
            {!selected && <p className="text-sm text-gauge-700">Regions are marked on a photo; open one from the strip.</p>}
          </div>
        </div>
      ),
    },
    {
      id: "references",
      title: "Reference examples",
      summary: shownReference ? "one open beside the photo" : undefined,
      content: selected ? (
        <ReferencePanel
          partTypeId={view.partType.id}
          viewKey={selected.viewKey}
          viewLabel={selectedView?.label ?? selected.viewKey}
          classInHand={hand.defect}
          classes={partType.defectClasses}
          choice={referenceChoice}
          onChoice={setReferenceChoice}
          openId={shownReference?.id ?? null}
          onOpen={(item) => setReference((open) => (open?.id === item.id ? null : item))}
        />
      ) : (
        <p className="text-sm text-gauge-700">Open a photo: the examples shown are those of its view.</p>
      ),
    },
    { id: "checklist", title: "Functional checklist", summary: checklistSummary(view), content: <ChecklistPanel initial={initial} me={me} framed={false} /> },
    {
      id: "grade",
      title: "Measurement and grade",
      summary: current ? <GradeBadge grade={current.finalGrade} size="sm" /> : undefined,
      content: (
        <div id="grade" className="space-y-4">
          <GradePanel
            unitId={unitId}
            canGrade={can(me, "grades.record")}
            canCorrect={canCorrect}
            labels={labels}
            unsavedRegions={unsaved.size > 0}
            beforeMeasure={() => registry.flushAll()}
            onGraded={() => void queryClient.invalidateQueries({ queryKey: unitKeys.view(unitId) })}
            readOnlyReason={gradeLock !== null && !(canCorrect && view.unit.status === "graded") ? gradeLock : null}
            framed={false}
          />
          <GradeHistory unitId={unitId} framed={false} />
          {canCertify && <UnitCertificates unitId={unitId} graded={current !== null && current !== undefined} />}
          <GradeWhatIf unitId={unitId} versions={rubricVersions} framed={false} />
        </div>
      ),
    },
    {
      id: "photos",
      title: "Photos",
      summary: `${photos.data?.photos.length ?? 0}`,
      content: <PhotoList unitId={unitId} views={views} canManage={canManagePhotos} beforeRemove={(id) => registry.get(id)?.flush() ?? Promise.resolve(true)} />,
    },
  ];

  return (
    <div className="flex h-full min-h-0 flex-col gap-2" data-testid="bench">
      <UnitHeader
        initial={initial}
        me={me}
        end={
          <>
            {holdsLease && <LeaseHeartbeat unitId={unitId} onRenewed={() => void queryClient.invalidateQueries({ queryKey: unitKeys.view(unitId) })} />}
            {can(me, "queue.work") && view.unit.status === "graded" && <TakeNext lotId={view.lot.id} />}
          </>
        }
      />
      {notice && (
        <p role="status" className={`shrink-0 truncate rounded-md border px-3 py-1.5 text-sm font-medium ${BANNER_TONE[notice.tone]}`} title={notice.text} data-testid="read-only-banner">
          Read-only: {notice.text}
        </p>
      )}
      <div className="flex min-h-0 flex-1 flex-col gap-2 lg:flex-row">
        {/* Portrait: the marking area keeps a fixed share of the height (never the panels' content
            size, which changes while marking) and takes all of it once the panels are folded. */}
        <div
          ref={setMarkingArea}
          className={`flex min-h-[26rem] min-w-0 flex-col gap-2 lg:min-h-0 lg:flex-1 lg:basis-auto ${panels.folded ? "flex-1" : "shrink-0 basis-[74%]"}`}
          data-testid="marking-area"
        >
          <div className="relative flex min-h-0 flex-1 flex-col">
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
                slots={{ regions: regionSlot, suggestions: suggestionSlot, status: statusSlot }}
                link={link}
              />
            ) : (
              <p className="flex flex-1 items-center justify-center rounded-lg border border-dashed border-gauge-300 p-6 text-center text-sm text-gauge-700">
                {photos.isPending ? "Loading photos…" : "No processed photo yet. Add photos of the required views; each opens here for marking once it is ready."}
              </p>
            )}
            {shownReference && <ReferenceViewer item={shownReference} classLabels={classLabels} classKeys={classKeys} onClose={() => setReference(null)} />}
            {canUpload && (
              // Hidden, not unmounted, so uploads in flight carry on while the uploader is out of the way.
              <div id="bench-uploader" hidden={!uploaderShown} className="absolute inset-0 z-20 overflow-y-auto rounded-lg border border-gauge-200 bg-white p-4 shadow-lg">
                {photos.data?.photos.some((p) => p.status === "ready") && (
                  <button type="button" className="btn-secondary float-right h-8 py-0 text-sm" onClick={() => setUploadOpen(false)}>
                    Back to the photo
                  </button>
                )}
                <PhotoUploader unitId={unitId} views={views} />
              </div>
            )}
          </div>
          <PhotoStrip
            unitId={unitId}
            views={views}
            selection={{ selectedId: selected?.id ?? null, onSelect: (p) => void select(p), unsavedIds: unsaved }}
            end={
              <div className="flex shrink-0 flex-col items-end gap-1">
                {canUpload && !noPhotos && (
                  <div className="flex gap-1">
                    <button
                      type="button"
                      className="btn-secondary h-8 px-2 py-0 text-sm"
                      onClick={showPhotoPanel}
                      title="File a photo under the right view, or remove a wrong one"
                      data-testid="manage-photos"
                    >
                      View or remove…
                    </button>
                    <button
                      type="button"
                      className="btn-secondary h-8 py-0 text-sm"
                      aria-expanded={uploaderShown}
                      aria-controls="bench-uploader"
                      onClick={() => setUploadOpen((open) => !open)}
                      data-testid="add-photos-toggle"
                    >
                      {uploaderShown ? "Hide the uploader" : "Add photos"}
                    </button>
                  </div>
                )}
                {canPromote && graded && selected && <AddToGallery key={selected.id} photoId={selected.id} />}
                <div ref={setStatusSlot} className="text-xs" />
              </div>
            }
          />
        </div>
        <SidePanels sections={sections} state={panels} onChange={setPanels} className={`lg:flex-none ${panels.folded ? "flex-none lg:w-11" : "min-h-0 flex-1 lg:w-[19rem] xl:w-[23rem]"}`} />
      </div>
    </div>
  );
}
