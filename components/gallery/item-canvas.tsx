"use client";

import { useMemo, useState } from "react";
import { AnnotationCanvasLazy } from "@/components/annotate/annotation-canvas-lazy";
import type { AllowedDefect } from "@/components/annotate/types";
import type { GalleryCardDto } from "@/lib/gallery/dto";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { DefectClassDefinition, ViewDefinition } from "@/lib/part-types/schemas";

export type ItemPartType = { views: ViewDefinition[]; defectClasses: DefectClassDefinition[] };

/**
 * A gallery item's photo on the one annotation canvas of the app (components/annotate): read-only
 * and zoomable for reading and comparing, editable for a trainer. `regions` is read on mount:
 * give it a new `key` to show another set. The canvas fills a box of the given height and the
 * region list goes below that box (portalled into its own slot), so a long list never runs over
 * the canvas.
 */
export function ItemCanvas({
  item,
  regions,
  partType,
  readOnly,
  onChange,
  className = "h-[62vh] min-h-[320px]",
}: {
  item: GalleryCardDto;
  regions: RegionSetPayload;
  partType: ItemPartType;
  readOnly: boolean;
  onChange?: (payload: RegionSetPayload) => void;
  className?: string;
}) {
  const allowedDefects = useMemo<AllowedDefect[]>(() => partType.defectClasses.map((d) => ({ key: d.key, label: d.label, severity: d.severity })), [partType.defectClasses]);
  const zones = useMemo(() => partType.views.find((v) => v.key === item.viewKey)?.zones ?? [], [partType.views, item.viewKey]);
  const [listSlot, setListSlot] = useState<HTMLElement | null>(null);
  const { photo } = item;
  if (!photo.urls || !photo.original || !photo.preview) {
    return (
      <p className={`flex items-center justify-center rounded-lg border border-dashed border-gauge-300 p-6 text-sm text-gauge-700 ${className}`}>
        The photo is still being processed; it shows here once it is ready.
      </p>
    );
  }
  return (
    <div className="space-y-2" data-testid="gallery-canvas" data-read-only={readOnly ? "true" : "false"}>
      <div className={`flex min-h-0 flex-col ${className}`}>
        <AnnotationCanvasLazy
          imageUrl={photo.urls.preview}
          original={photo.original}
          preview={photo.preview}
          allowedDefects={allowedDefects}
          zones={zones}
          initialRegions={regions}
          readOnly={readOnly}
          onChange={readOnly ? undefined : onChange}
          regionListContainer={listSlot}
          className="min-h-0 flex-1"
        />
      </div>
      <div ref={setListSlot} className="max-h-64 overflow-y-auto" data-testid="gallery-region-list" />
    </div>
  );
}
