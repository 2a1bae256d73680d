"use client";

import { useQuery } from "@tanstack/react-query";
import { useId } from "react";
import { GradeBadge } from "@/components/grading/grade-badge";
import type { GalleryCardDto } from "@/lib/gallery/dto";
import { apiFetch } from "@/lib/http/client";
import { galleryKeys } from "@/lib/query-keys/gallery";
import { RegionOverlay } from "./region-overlay";

export type ReferenceClass = { key: string; label: string };

/** "hand": follow the class in hand on the canvas; "" any class; otherwise a class key. */
export type ReferenceChoice = "hand" | string;

/**
 * The Bench's reference panel: published gallery items of the unit's part type and the photo's
 * view, narrowed to a defect class — by default the one in hand on the canvas — normal first, then
 * A → Reject (the server's order). Choosing one puts it beside the photo being marked
 * (ReferenceViewer); the list itself lives in a side panel, so opening or closing it never moves
 * the canvas.
 */
export function ReferencePanel({
  partTypeId,
  viewKey,
  viewLabel,
  classInHand,
  classes,
  choice,
  onChoice,
  openId,
  onOpen,
}: {
  partTypeId: string;
  viewKey: string;
  viewLabel: string;
  classInHand: string | null;
  classes: readonly ReferenceClass[];
  choice: ReferenceChoice;
  onChoice: (choice: ReferenceChoice) => void;
  openId: string | null;
  onOpen: (item: GalleryCardDto) => void;
}) {
  const selectId = useId();
  const defect = choice === "hand" ? classInHand : choice || null;
  const query = useQuery({
    queryKey: galleryKeys.reference(partTypeId, viewKey, defect),
    queryFn: () => apiFetch<{ items: GalleryCardDto[] }>(`/api/gallery/reference?${new URLSearchParams({ partType: partTypeId, view: viewKey, ...(defect ? { defect } : {}) })}`),
    staleTime: 60_000,
  });
  const label = (key: string | null) => classes.find((c) => c.key === key)?.label ?? key ?? "";
  const classKeys = classes.map((c) => c.key);
  return (
    <div className="space-y-2" data-testid="reference-panel">
      <div>
        <label htmlFor={selectId} className="text-xs font-medium text-gauge-800">
          Examples of the {viewLabel.toLowerCase()} view showing
        </label>
        <select id={selectId} className="field-input mt-0.5 py-1 text-sm" value={choice} onChange={(e) => onChoice(e.target.value)} data-testid="reference-class">
          <option value="hand">{classInHand ? `the class in hand (${label(classInHand)})` : "the class in hand (none)"}</option>
          <option value="">any class</option>
          {classes.map((c) => (
            <option key={c.key} value={c.key}>
              {c.label}
            </option>
          ))}
        </select>
      </div>
      {query.isPending && (
        <p className="text-sm text-gauge-700" role="status">
          Loading the examples…
        </p>
      )}
      {query.isError && <p className="text-sm text-fault-700">The examples could not be loaded: {query.error.message}</p>}
      {query.data && query.data.items.length === 0 && (
        <p className="text-sm text-gauge-700">No published example of this view{defect ? ` shows ${label(defect).toLowerCase()}` : ""} yet. Trainers add them in the Gallery.</p>
      )}
      {query.data && query.data.items.length > 0 && (
        <ul className="grid grid-cols-2 gap-2" aria-label="Reference examples">
          {query.data.items.map((item) => (
            <li key={item.id}>
              <button
                type="button"
                className={`block w-full overflow-hidden rounded-md border text-left hover:border-gauge-500 ${openId === item.id ? "border-signal-500 ring-2 ring-signal-300" : "border-gauge-200"}`}
                aria-pressed={openId === item.id}
                onClick={() => onOpen(item)}
                data-testid="reference-item"
                data-item-id={item.id}
              >
                <span className="relative block aspect-[4/3] bg-gauge-900">
                  {item.photo.urls && item.photo.original && (
                    <>
                      {/* eslint-disable-next-line @next/next/no-img-element -- served by our own access-checked route */}
                      <img src={item.photo.urls.thumbnail} alt="" className="absolute inset-0 h-full w-full object-contain" loading="lazy" />
                      <RegionOverlay regions={item.regions} original={item.photo.original} classKeys={classKeys} />
                    </>
                  )}
                </span>
                <span className="flex items-center gap-1 px-1.5 py-1 text-xs">
                  <GradeBadge grade={item.grade} size="sm" />
                  <span className="truncate">{item.kind === "normal" ? "Normal" : item.defectClasses.map(label).join(", ")}</span>
                </span>
              </button>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
