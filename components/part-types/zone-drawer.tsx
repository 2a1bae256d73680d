"use client";

import { useQuery } from "@tanstack/react-query";
import { useRef, useState } from "react";
import { AnnotationCanvasLazy, type AnnotationCanvasHandle } from "@/components/annotate/annotation-canvas-lazy";
import { FormMessage } from "@/components/ui/form-field";
import type { ZoneDefinition } from "@/db/schema/lots";
import type { PolygonShape } from "@/lib/geometry/shape";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { apiFetch } from "@/lib/http/client";
import { drawingFromZones, zonesFromDrawing } from "@/lib/part-types/zone-drawing";

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

/**
 * Drawing a view's zones on a sample photo of the part type, with the Bench's annotation canvas:
 * each zone is a class of its own (pick it, draw it with Box or Outline), the part's Surface is
 * kept from the photo or traced with Surface. "Use these zones" writes them back into the part
 * type form (saved with it); lib/part-types/zone-drawing.ts does the conversion.
 */
export function ZoneDrawer({ partTypeId, view, zones, onApply, onClose }: { partTypeId: string; view: { key: string; label: string }; zones: ZoneDefinition[]; onApply(zones: ZoneDefinition[]): void; onClose(): void }) {
  const canvas = useRef<AnnotationCanvasHandle>(null);
  const [photoIndex, setPhotoIndex] = useState(0);
  const [working, setWorking] = useState<ZoneDefinition[]>(zones);
  // The drawing survives a re-mount (a zone added, another photo): the canvas takes it back.
  const [drawing, setDrawing] = useState<RegionSetPayload | null>(null);
  const [mount, setMount] = useState(0);
  const [newZone, setNewZone] = useState({ id: "", label: "" });
  const [message, setMessage] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  const samples = useQuery({
    queryKey: ["sample-photos", partTypeId, view.key],
    queryFn: () => apiFetch<{ photos: SamplePhoto[] }>(`/api/part-types/${partTypeId}/sample-photos?view=${encodeURIComponent(view.key)}`),
  });
  const photo = samples.data?.photos[photoIndex] ?? null;
  const drawable = working.filter((z) => z.polygon.length >= 3);
  const initial = drawing ?? (photo ? drawingFromZones(drawable, photo.surfaces) : null);

  const current = () => canvas.current?.getRegions() ?? initial ?? { surfaces: [], regions: [], ruler: null };
  const remount = (next: RegionSetPayload | null) => {
    setDrawing(next);
    setMount((m) => m + 1);
  };
  const addZone = () => {
    const id = newZone.id.trim();
    const label = newZone.label.trim() || id;
    if (!ZONE_KEY.test(id)) return setMessage({ kind: "error", text: "A zone key is lower-case letters, digits and single hyphens (e.g. lens-window)." });
    if (working.some((z) => z.id === id)) return setMessage({ kind: "error", text: `There is already a zone “${id}”.` });
    setWorking([...working, { id, label, polygon: [] }]);
    setNewZone({ id: "", label: "" });
    setMessage({ kind: "success", text: `Pick “${label}” in the classes and draw it with Box or Outline.` });
    remount(current());
  };
  const removeZone = (zone: ZoneDefinition) => {
    setWorking(working.filter((z) => z.id !== zone.id));
    const now = current();
    remount({ ...now, regions: now.regions.filter((r) => r.defect !== zone.id) });
    setMessage({ kind: "success", text: `“${zone.label}” removed. Use these zones, then save the part type, to drop it for good.` });
  };
  const apply = () => {
    const result = zonesFromDrawing(current(), working);
    if (result.problems.length > 0) return setMessage({ kind: "error", text: result.problems.join(" ") });
    const missing = result.zones.filter((z) => z.polygon.length < 3).map((z) => z.label);
    onApply(result.zones.filter((z) => z.polygon.length >= 3));
    const notes = [...(result.unchanged.length ? [`kept as they were: ${result.unchanged.join(", ")}`] : []), ...(missing.length ? [`not added (nothing drawn): ${missing.join(", ")}`] : [])];
    setMessage({ kind: "success", text: `Zones of ${view.label} taken into the form${notes.length ? `; ${notes.join("; ")}` : ""}. Save the part type to keep them.` });
  };

  return (
    <div className="fixed inset-0 z-50 flex flex-col overflow-y-auto bg-white p-4" role="dialog" aria-modal="true" aria-labelledby="zone-drawer-title" data-testid="zone-drawer">
      <div className="mb-3 flex flex-wrap items-center justify-between gap-3">
        <h2 id="zone-drawer-title" className="text-lg font-semibold">Zones of the {view.label} view</h2>
        <div className="flex flex-wrap items-center gap-2">
          {samples.data && samples.data.photos.length > 1 && (
            <label className="flex items-center gap-2 text-sm">
              <span>Sample photo</span>
              <select className="field-input py-1" value={photoIndex} onChange={(e) => { setPhotoIndex(Number(e.target.value)); remount(null); }}>
                {samples.data.photos.map((p, i) => <option key={p.id} value={i}>{p.unitLabel}</option>)}
              </select>
            </label>
          )}
          <button type="button" className="btn-primary" onClick={apply} disabled={!photo}>Use these zones</button>
          <button type="button" className="btn-secondary" onClick={onClose}>Close</button>
        </div>
      </div>
      {message && <FormMessage kind={message.kind}>{message.text}</FormMessage>}
      {samples.isPending && <p className="text-sm text-gauge-700" role="status">Looking for photos of this view…</p>}
      {samples.isError && <FormMessage kind="error">{samples.error.message}</FormMessage>}
      {samples.data && !photo && (
        <p className="text-sm text-gauge-700" data-testid="zone-drawer-no-photo">
          No photo of the {view.label} view yet. Photograph a unit of this part type on the Bench first; until then, type the zone points in the form.
        </p>
      )}
      {photo && photo.preview && initial && (
        <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_18rem]">
          <AnnotationCanvasLazy
            key={`${photo.id}-${mount}`}
            handleRef={canvas}
            imageUrl={photo.urls.preview}
            original={{ width: photo.width, height: photo.height }}
            preview={photo.preview}
            allowedDefects={working.map((z) => ({ key: z.id, label: z.label, severity: "minor" as const }))}
            initialRegions={initial}
          />
          <aside className="space-y-3 text-sm">
            <p className="text-gauge-700">
              Each zone is one shape, stored relative to the box around the part&apos;s Surface{photo.surfaces.length ? "" : " — this photo has no Surface yet: trace the part with the Surface tool first"}.
              Pick a zone among the classes, draw it with Box or Outline; delete a shape to draw it again.
            </p>
            <section aria-labelledby="zone-list-title" className="space-y-1">
              <h3 id="zone-list-title" className="font-medium">Zones of this view</h3>
              {working.length === 0 && <p className="text-gauge-700">None yet: add one below.</p>}
              <ul className="space-y-1" data-testid="zone-list">
                {working.map((zone) => (
                  <li key={zone.id} className="flex items-center justify-between gap-2">
                    <span>{zone.label} <span className="text-xs text-gauge-600">({zone.id})</span></span>
                    <button type="button" className="btn-secondary py-0.5 text-xs" onClick={() => removeZone(zone)} aria-label={`Remove zone ${zone.label}`}>Remove</button>
                  </li>
                ))}
              </ul>
            </section>
            <fieldset className="space-y-2">
              <legend className="font-medium">Add a zone</legend>
              <label className="block"><span className="field-label">Key</span><input className="field-input py-1" value={newZone.id} onChange={(e) => setNewZone({ ...newZone, id: e.target.value })} placeholder="e.g. lens-window" /></label>
              <label className="block"><span className="field-label">Label</span><input className="field-input py-1" value={newZone.label} onChange={(e) => setNewZone({ ...newZone, label: e.target.value })} placeholder="e.g. Lens window" /></label>
              <button type="button" className="btn-secondary py-1 text-xs" onClick={addZone}>Add zone</button>
            </fieldset>
          </aside>
        </div>
      )}
    </div>
  );
}
