"use client";

import { useMutation, useQuery } from "@tanstack/react-query";
import { useEffect, useRef, useState } from "react";
import { createPortal } from "react-dom";
import { AnnotationCanvasLazy, type AnnotationCanvasHandle } from "@/components/annotate/annotation-canvas-lazy";
import { requestSuggestions } from "@/components/bench/regions-api";
import { FormMessage } from "@/components/ui/form-field";
import type { PolygonShape } from "@/lib/geometry/shape";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { apiFetch } from "@/lib/http/client";
import { drawingFromZones, zonesFromDrawing, zonesToPlace } from "@/lib/part-types/zone-drawing";
import { partTypeKeys } from "@/lib/query-keys/part-types";
import { ZoneDrawerPanel } from "./zone-drawer-panel";
import type { ZoneDefinition } from "@/lib/part-types/schemas";

type SamplePhoto = {
  id: string;
  unitLabel: string;
  width: number;
  height: number;
  preview: { width: number; height: number } | null;
  surfaces: { id: string; shape: PolygonShape }[];
  urls: { preview: string };
};

const ZONE_KEY = /^[a-z0-9]+(-[a-z0-9]+)*$/;
const EMPTY: RegionSetPayload = { surfaces: [], regions: [], ruler: null };

/**
 * Drawing a view's zones on a sample photo of the part type, with the Bench's annotation canvas:
 * each zone is a class of its own (pick it, draw it with Box or Outline), the part's Surface is
 * kept from the photo, traced with Surface or suggested. "Use these zones" writes them back into
 * the part type form (saved with it); lib/part-types/zone-drawing.ts does the conversion. Nothing
 * here is saved on the photo. A full-window dialog, put on document.body so that it is not inside
 * the part type's <form> (Enter in its fields would submit the part type).
 */
export function ZoneDrawer({
  partTypeId,
  view,
  zones,
  onApply,
  onClose,
}: {
  partTypeId: string;
  view: { key: string; label: string };
  zones: ZoneDefinition[];
  onApply(zones: ZoneDefinition[]): void;
  onClose(): void;
}) {
  const canvas = useRef<AnnotationCanvasHandle>(null);
  const dialog = useRef<HTMLDivElement>(null);
  const [photoIndex, setPhotoIndex] = useState(0);
  const [working, setWorking] = useState<ZoneDefinition[]>(zones);
  // The drawing survives a re-mount (a zone added, another photo): the canvas takes it back.
  const [drawing, setDrawing] = useState<RegionSetPayload | null>(null);
  const [mount, setMount] = useState(0);
  const [shapeList, setShapeList] = useState<HTMLElement | null>(null);
  // Whether the canvas has a Surface, once it has told us (null: as the photo came).
  const [surfaceDrawn, setSurfaceDrawn] = useState<boolean | null>(null);
  // Edits not yet taken into the form: Close then asks once more rather than dropping them.
  const [unapplied, setUnapplied] = useState(false);
  const [closing, setClosing] = useState(false);
  const [message, setMessage] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  const samples = useQuery({
    queryKey: partTypeKeys.samplePhotos(partTypeId, view.key),
    queryFn: () => apiFetch<{ photos: SamplePhoto[] }>(`/api/part-types/${partTypeId}/sample-photos?view=${encodeURIComponent(view.key)}`),
  });
  const photo = samples.data?.photos[photoIndex] ?? null;
  const initial =
    drawing ??
    (photo
      ? drawingFromZones(
          working.filter((z) => z.polygon.length >= 3),
          photo.surfaces,
        )
      : null);
  const hasSurface = surfaceDrawn ?? (initial?.surfaces.length ?? 0) > 0;

  // Focus moves into the dialog and back to the button that opened it.
  useEffect(() => {
    const opener = document.activeElement instanceof HTMLElement ? document.activeElement : null;
    dialog.current?.focus();
    return () => opener?.focus();
  }, []);

  const current = () => canvas.current?.getRegions() ?? initial ?? EMPTY;
  const edited = (text: string | null = null) => {
    setUnapplied(true);
    setClosing(false);
    if (text) setMessage({ kind: "success", text });
  };
  const remount = (next: RegionSetPayload | null) => {
    setDrawing(next);
    setSurfaceDrawn(null);
    setMount((m) => m + 1);
  };
  const placeStoredZones = (now: RegionSetPayload) => {
    const shapes = zonesToPlace(now, working);
    if (shapes.length > 0) canvas.current?.addRegions(shapes.map((s) => ({ role: "defect" as const, ...s })));
  };
  const onChange = (payload: RegionSetPayload) => {
    edited();
    const had = hasSurface;
    setSurfaceDrawn(payload.surfaces.length > 0);
    // The first Surface gives the stored zones a box: show them in it (one more Undo step).
    if (!had && payload.surfaces.length > 0) placeStoredZones(payload);
  };
  const suggest = useMutation({
    mutationFn: (photoId: string) => requestSuggestions(photoId, "surface"),
    onSuccess: (res) => {
      const found = res.ghosts.find((g) => g.role === "surface");
      if (!found || found.role !== "surface") return setMessage({ kind: "error", text: res.note });
      canvas.current?.addRegions([{ role: "surface", shape: found.shape }]);
      setMessage({ kind: "success", text: `${found.label}: check that it follows the part's edge (Undo takes it back). ${res.note}` });
    },
    onError: (error) => setMessage({ kind: "error", text: `No Surface could be suggested: ${error.message}` }),
  });

  const addZone = ({ id: rawId, label: rawLabel }: { id: string; label: string }) => {
    const id = rawId.trim();
    const label = rawLabel.trim() || id;
    if (!ZONE_KEY.test(id)) return "A zone key is lower-case letters, digits and single hyphens (e.g. lens-window).";
    if (working.some((z) => z.id === id)) return `There is already a zone “${id}”.`;
    setWorking([...working, { id, label, polygon: [] }]);
    edited(`Pick “${label}” in the Zones bar and draw it with Box or Outline.`);
    remount(current());
    return null;
  };
  const removeZone = (zone: ZoneDefinition) => {
    setWorking(working.filter((z) => z.id !== zone.id));
    const now = current();
    remount({ ...now, regions: now.regions.filter((r) => r.defect !== zone.id) });
    edited(`“${zone.label}” removed. Use these zones, then save the part type, to drop it for good.`);
  };
  const apply = () => {
    const result = zonesFromDrawing(current(), working);
    if (result.problems.length > 0) return setMessage({ kind: "error", text: result.problems.join(" ") });
    const missing = result.zones.filter((z) => z.polygon.length < 3).map((z) => z.label);
    onApply(result.zones.filter((z) => z.polygon.length >= 3));
    setWorking(result.zones);
    setUnapplied(false);
    setClosing(false);
    const notes = [...(result.unchanged.length ? [`kept as they were: ${result.unchanged.join(", ")}`] : []), ...(missing.length ? [`not added (nothing drawn): ${missing.join(", ")}`] : [])];
    setMessage({ kind: "success", text: `Zones of ${view.label} taken into the form${notes.length ? `; ${notes.join("; ")}` : ""}. Save the part type to keep them.` });
  };
  const close = () => {
    if (!unapplied || closing) return onClose();
    setClosing(true);
    setMessage({ kind: "error", text: "What you drew here is not in the form yet. Press “Use these zones” to keep it, or Close again to leave it." });
  };

  const notice = message && <FormMessage kind={message.kind}>{message.text}</FormMessage>;
  return createPortal(
    <div ref={dialog} tabIndex={-1} className="fixed inset-0 z-50 flex flex-col bg-white outline-none" role="dialog" aria-modal="true" aria-labelledby="zone-drawer-title" data-testid="zone-drawer">
      <header className="flex flex-wrap items-center justify-between gap-x-3 gap-y-2 border-b border-gauge-100 px-4 py-2">
        <h2 id="zone-drawer-title" className="text-lg font-semibold">
          Zones of the {view.label} view
        </h2>
        <div className="flex flex-wrap items-center gap-2">
          {samples.data && samples.data.photos.length > 1 && (
            <label className="flex items-center gap-2 text-sm">
              <span>Sample photo</span>
              <select
                className="field-input py-1"
                value={photoIndex}
                onChange={(e) => {
                  setPhotoIndex(Number(e.target.value));
                  remount(null);
                }}
              >
                {samples.data.photos.map((p, i) => (
                  <option key={p.id} value={i}>
                    {p.unitLabel}
                    {p.surfaces.length ? "" : " (no Surface)"}
                  </option>
                ))}
              </select>
            </label>
          )}
          <button type="button" className="btn-primary" onClick={apply} disabled={!photo}>
            Use these zones
          </button>
          <button type="button" className="btn-secondary" onClick={close}>
            {closing ? "Close without using" : "Close"}
          </button>
        </div>
      </header>
      <div className="flex min-h-0 flex-1 flex-col gap-3 overflow-y-auto p-4">
        {message && !photo && notice}
        {samples.isPending && (
          <p className="text-sm text-gauge-700" role="status">
            Looking for photos of this view…
          </p>
        )}
        {samples.isError && <FormMessage kind="error">{samples.error.message}</FormMessage>}
        {samples.data && !photo && (
          <p className="text-sm text-gauge-700" data-testid="zone-drawer-no-photo">
            No photo of the {view.label} view yet. Photograph a unit of this part type on the Bench first; until then, type the zone points in the form.
          </p>
        )}
        {photo && photo.preview && initial && (
          <div className="grid min-h-0 flex-1 gap-4 lg:grid-cols-[minmax(0,1fr)_18rem]">
            <AnnotationCanvasLazy
              key={`${photo.id}-${mount}`}
              handleRef={canvas}
              imageUrl={photo.urls.preview}
              original={{ width: photo.width, height: photo.height }}
              preview={photo.preview}
              allowedDefects={working.map((z) => ({ key: z.id, label: z.label, severity: "minor" as const }))}
              initialRegions={initial}
              onChange={onChange}
              regionListContainer={shapeList}
              classKind="Zones"
              className="min-h-0"
            />
            <ZoneDrawerPanel
              notice={notice}
              zones={working}
              hasSurface={hasSurface}
              suggesting={suggest.isPending}
              onSuggestSurface={() => suggest.mutate(photo.id)}
              onAdd={addZone}
              onRemove={removeZone}
              listRef={setShapeList}
            />
          </div>
        )}
      </div>
    </div>,
    document.body,
  );
}
