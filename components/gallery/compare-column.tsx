"use client";

import Link from "next/link";
import { useMemo } from "react";
import type { GalleryItemDto } from "@/lib/gallery/dto";
import { ItemBadges } from "./item-badges";
import { ItemCanvas, type ItemPartType } from "./item-canvas";
import { ItemMeasurement } from "./item-measurement";
import { measurementLabels } from "@/components/grading/measurement-labels";

/** One side of a comparison: the item on its own read-only canvas, its caption, grade and numbers. */
export function CompareColumn({ item, partType }: { item: GalleryItemDto; partType: ItemPartType }) {
  const labels = useMemo(() => measurementLabels(partType), [partType]);
  return (
    <section className="min-w-0 space-y-2" aria-label={`${item.partType.name}, grade ${item.grade}`} data-testid="compare-column">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <Link href={`/gallery/${item.id}`} className="font-semibold underline">
          {item.partType.name} · {labels.views[item.viewKey] ?? item.viewKey}
        </Link>
        <ItemBadges grade={item.grade} kind={item.kind} status={item.status} showStatus />
      </div>
      <ItemCanvas item={item} regions={item.regions} partType={partType} readOnly className="h-[52vh] min-h-[300px]" />
      <p className="text-sm text-gauge-900">{item.caption || <span className="text-gauge-600 italic">No caption yet.</span>}</p>
      <details className="card p-3 text-sm" open>
        <summary className="cursor-pointer font-semibold">Measured</summary>
        <div className="mt-2">
          <ItemMeasurement itemId={item.id} revision={item.revision} grade={item.grade} labels={labels} />
        </div>
      </details>
    </section>
  );
}
