"use client";

import Link from "next/link";
import { useEffect, useRef, useState } from "react";
import type { GalleryCardDto } from "@/lib/gallery/dto";
import { ItemBadges } from "./item-badges";
import { RegionOverlay } from "./region-overlay";

/**
 * A reference example beside the photo being marked: laid over the right-hand part of the photo
 * (never beside it in the layout, so the canvas keeps its size and place), below the class bar so
 * every class stays in reach, with its regions, grade and caption. Escape or Close puts it away
 * and gives the keyboard back to where it was.
 */
export function ReferenceViewer({ item, classLabels, classKeys, onClose }: { item: GalleryCardDto; classLabels: Readonly<Record<string, string>>; classKeys: readonly string[]; onClose: () => void }) {
  const closeRef = useRef<HTMLButtonElement>(null);
  const rootRef = useRef<HTMLElement>(null);
  const top = useStageTop(rootRef);
  useEffect(() => {
    const before = document.activeElement as HTMLElement | null;
    closeRef.current?.focus({ preventScroll: true });
    return () => before?.focus?.({ preventScroll: true });
  }, [item.id]);
  const { photo } = item;
  return (
    <aside
      ref={rootRef}
      style={{ top }}
      className="absolute right-0 bottom-0 z-30 flex w-[min(44%,28rem)] flex-col gap-2 rounded-lg border border-gauge-300 bg-white p-2 shadow-xl"
      aria-label="Reference example"
      data-testid="reference-viewer"
      data-item-id={item.id}
      onKeyDown={(e) => {
        if (e.key === "Escape") {
          e.stopPropagation();
          onClose();
        }
      }}
    >
      <div className="flex items-start justify-between gap-2">
        <div className="min-w-0 space-y-0.5">
          <ItemBadges grade={item.grade} kind={item.kind} status={item.status} showStatus={false} />
          <p className="truncate text-xs text-gauge-700">{item.defectClasses.map((c) => classLabels[c] ?? c).join(", ") || "Nothing to mark"}</p>
        </div>
        <button ref={closeRef} type="button" className="btn-secondary h-8 shrink-0 px-2 py-0 text-sm" onClick={onClose} data-testid="reference-close">
          Close <span className="sr-only">the reference example</span>
        </button>
      </div>
      <div className="relative min-h-0 flex-1 rounded bg-gauge-900">
        {photo.urls && photo.original && (
          <>
            {/* eslint-disable-next-line @next/next/no-img-element -- served by our own access-checked route */}
            <img src={photo.urls.preview} alt={`Reference: ${item.kind}, grade ${item.grade}`} className="absolute inset-0 h-full w-full object-contain" />
            <RegionOverlay regions={item.regions} original={photo.original} classKeys={classKeys} />
          </>
        )}
      </div>
      <p className="max-h-24 shrink-0 overflow-y-auto text-sm text-gauge-900" data-testid="reference-caption">
        {item.caption}
      </p>
      <Link href={`/gallery/${item.id}`} target="_blank" className="shrink-0 text-xs font-medium text-gauge-800 underline">
        Open in the Gallery (zoom, numbers) ↗
      </Link>
    </aside>
  );
}

/** How far below the top of the viewer's container the photo's stage starts (the class bar's height), kept up to date. */
function useStageTop(ref: React.RefObject<HTMLElement | null>): number {
  const [top, setTop] = useState(0);
  useEffect(() => {
    const container = ref.current?.parentElement;
    if (!container) return;
    const measure = () => {
      const stage = container.querySelector<HTMLElement>("[data-testid=annotation-stage]");
      setTop(stage ? Math.max(0, stage.getBoundingClientRect().top - container.getBoundingClientRect().top) : 0);
    };
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(container);
    return () => observer.disconnect();
  }, [ref]);
  return top;
}
