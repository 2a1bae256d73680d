"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useMemo, useState } from "react";
import { measurementLabels } from "@/components/grading/measurement-labels";
import { FormMessage } from "@/components/ui/form-field";
import type { GalleryItemDto } from "@/lib/gallery/dto";
import { apiFetch } from "@/lib/http/client";
import { ItemBadges } from "./item-badges";
import { ItemCanvas, type ItemPartType } from "./item-canvas";
import { ItemEditor } from "./item-editor";
import { ItemMeasurement } from "./item-measurement";
import { galleryKeys } from "@/lib/query-keys/gallery";

/**
 * One gallery item: the photo on the read-only, zoomable canvas, the caption and the grade it
 * deserves, its measured numbers and what the current published rubric says. Editors also get
 * Edit (the same canvas, editable), Publish and Retire.
 */
export function GalleryItemScreen({ initial, partType, canEdit }: { initial: GalleryItemDto; partType: ItemPartType; canEdit: boolean }) {
  const queryClient = useQueryClient();
  const { data } = useQuery({ queryKey: galleryKeys.item(initial.id), queryFn: () => apiFetch<{ item: GalleryItemDto }>(`/api/gallery/${initial.id}`), initialData: { item: initial } });
  const item = data.item;
  const [editing, setEditing] = useState(false);
  const labels = useMemo(() => measurementLabels(partType), [partType]);
  const viewLabel = labels.views[item.viewKey] ?? item.viewKey;
  const transition = useMutation({
    mutationFn: (action: "publish" | "retire") => apiFetch<{ item: GalleryItemDto }>(`/api/gallery/${item.id}/${action}`, { body: { revision: item.revision } }),
    onSuccess: ({ item: changed }) => {
      queryClient.setQueryData(galleryKeys.item(item.id), { item: changed });
      void queryClient.invalidateQueries({ queryKey: galleryKeys.references() });
    },
  });
  const classes = item.defectClasses.map((c) => labels.defects[c] ?? c).join(", ");

  return (
    <div className="max-w-7xl space-y-4" data-testid="gallery-item" data-status={item.status}>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div className="space-y-1">
          <Link href="/gallery" className="text-sm text-gauge-700 underline">
            ← Gallery
          </Link>
          <h1 className="page-title">
            {item.partType.name} · {viewLabel}
          </h1>
          <ItemBadges grade={item.grade} kind={item.kind} status={item.status} showStatus />
        </div>
        <div className="flex flex-wrap gap-2">
          <Link href={`/gallery/compare?a=${item.id}`} className="btn-secondary" data-testid="compare-link">
            Compare with another…
          </Link>
          {canEdit && !editing && item.status !== "retired" && (
            <button type="button" className="btn-secondary" onClick={() => setEditing(true)} data-testid="edit-item">
              Edit
            </button>
          )}
          {canEdit && !editing && item.status === "draft" && (
            <button type="button" className="btn-primary" disabled={transition.isPending} onClick={() => transition.mutate("publish")} data-testid="publish-item">
              Publish
            </button>
          )}
          {canEdit && !editing && item.status !== "retired" && (
            <button
              type="button"
              className="btn-danger"
              disabled={transition.isPending}
              onClick={() => window.confirm("Retire this item? Inspectors will no longer see it; it is kept, read-only.") && transition.mutate("retire")}
              data-testid="retire-item"
            >
              Retire
            </button>
          )}
        </div>
      </div>
      {transition.error && <FormMessage kind="error">{transition.error.message}</FormMessage>}
      {item.status === "draft" && <p className="text-sm text-signal-700">Draft: only trainers and leads see it until it is published.</p>}
      {item.status === "retired" && <p className="text-sm text-gauge-700">Retired: kept as it was; inspectors no longer see it.</p>}

      {editing ? (
        <ItemEditor key={item.revision} item={item} partType={partType} onDone={() => setEditing(false)} />
      ) : (
        <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_24rem]">
          <ItemCanvas key={item.revision} item={item} regions={item.regions} partType={partType} readOnly />
          <aside className="space-y-3" aria-label="About this example">
            <section className="card space-y-2 p-4">
              <h2 className="text-sm font-semibold">Why</h2>
              <p className="text-gauge-900" data-testid="item-caption">
                {item.caption || <span className="text-gauge-600 italic">No caption yet.</span>}
              </p>
              <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
                <dt className="text-gauge-700">Deserves</dt>
                <dd data-testid="item-grade">
                  {item.grade}
                  {item.rubricVersion !== null ? `, judged under rubric v${item.rubricVersion}` : ", judged with no rubric published"}
                </dd>
                <dt className="text-gauge-700">Shows</dt>
                <dd>{item.kind === "normal" ? "A normal part: nothing to mark" : classes || "Defects (none marked yet)"}</dd>
                <dt className="text-gauge-700">From</dt>
                <dd>{item.source.kind === "unit" ? `Unit ${item.source.label}` : "A photo uploaded into the gallery"}</dd>
                <dt className="text-gauge-700">Added by</dt>
                <dd>{item.createdByName}</dd>
              </dl>
            </section>
            <section className="card space-y-2 p-4">
              <h2 className="text-sm font-semibold">Measured</h2>
              <ItemMeasurement itemId={item.id} revision={item.revision} grade={item.grade} labels={labels} />
            </section>
          </aside>
        </div>
      )}
    </div>
  );
}
