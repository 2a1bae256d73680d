"use client";

import { memo, useDeferredValue } from "react";
import type { Region, RegionId } from "@/lib/annotate/types";
import { ClassSwatch } from "./class-swatch";
import { RULER_STYLE, SURFACE_STYLE, UNKNOWN_DEFECT_STYLE } from "@/lib/annotate/defect-styles";
import { regionKindLabel, regionSizeSummary } from "./region-summary";
import type { ClassEntry } from "./types";

type RegionListProps = {
  regions: readonly Region[];
  selectedId: RegionId | null;
  classes: ReadonlyMap<string, ClassEntry>;
  hiddenDefects: readonly string[];
  readOnly: boolean;
  onSelect(id: RegionId): void;
  onDelete(id: RegionId): void;
};

type RegionRowProps = {
  region: Region;
  number: number;
  entry: ClassEntry | undefined;
  selected: boolean;
  hidden: boolean;
  readOnly: boolean;
  onSelect(id: RegionId): void;
  onDelete(id: RegionId): void;
};

function describe(region: Region, entry: ClassEntry | undefined) {
  if (region.role === "surface") return { name: "Surface", style: SURFACE_STYLE };
  if (region.role === "ruler") return { name: "Ruler", style: RULER_STYLE };
  return { name: entry?.label ?? `${region.defect} (not a class of this part type)`, style: entry?.style ?? UNKNOWN_DEFECT_STYLE };
}

/** One row; memoised per region object, so a drag re-renders only the dragged region's row. */
const RegionRow = memo(function RegionRow({ region, number, entry, selected, hidden, readOnly, onSelect, onDelete }: RegionRowProps) {
  const { name, style } = describe(region, entry);
  const kind = regionKindLabel(region);
  return (
    <li
      className={`flex items-stretch gap-1 rounded-md border [contain-intrinsic-size:auto_3.25rem] [content-visibility:auto] ${selected ? "border-signal-500 bg-signal-50" : "border-gauge-200 bg-white"}`}
      data-testid="region-item"
      data-region-id={region.id}
    >
      <button
        type="button"
        className="flex min-h-10 min-w-0 flex-1 items-center gap-2 rounded-md px-2 py-1 text-left text-sm hover:bg-gauge-50"
        aria-pressed={selected}
        onClick={() => onSelect(region.id)}
      >
        <span className="w-7 shrink-0 text-right text-xs tabular-nums text-gauge-600">{number}</span>
        <ClassSwatch style={style} />
        <span className="min-w-0">
          <span className="block truncate font-medium">
            {name}
            {region.role === "defect" && <span className="font-normal text-gauge-700"> · {kind}</span>}
            {hidden && <span className="font-normal text-gauge-600"> (hidden)</span>}
          </span>
          <span className="block truncate text-xs tabular-nums text-gauge-700">{regionSizeSummary(region)}</span>
        </span>
      </button>
      {!readOnly && (
        <button
          type="button"
          className="min-h-10 shrink-0 rounded-md px-2.5 text-sm text-fault-700 hover:bg-fault-50"
          aria-label={`Delete region ${number} (${name}, ${kind})`}
          onClick={() => onDelete(region.id)}
          data-testid="region-delete"
        >
          Delete
        </button>
      )}
    </li>
  );
});

/**
 * Every region of the photo, in drawing order: class, tool and size. Picking one selects it on
 * the canvas (and brings it into view); each has its own delete button. Plain buttons in a list,
 * so Tab and Enter reach everything. The list follows the canvas at a lower priority
 * (useDeferredValue), so dragging a region never waits for a thousand rows.
 */
export const RegionList = memo(function RegionList(props: RegionListProps) {
  const regions = useDeferredValue(props.regions);
  const { selectedId, classes, hiddenDefects, readOnly, onSelect, onDelete } = props;
  if (regions.length === 0) {
    return <p className="text-sm text-gauge-700">No regions yet. Pick a tool and mark the photo.</p>;
  }
  return (
    <ol className="space-y-1" aria-label="Regions" data-testid="region-list">
      {regions.map((region, i) => (
        <RegionRow
          key={region.id}
          region={region}
          number={i + 1}
          entry={region.role === "defect" ? classes.get(region.defect) : undefined}
          selected={region.id === selectedId}
          hidden={region.role === "defect" && hiddenDefects.includes(region.defect)}
          readOnly={readOnly}
          onSelect={onSelect}
          onDelete={onDelete}
        />
      ))}
    </ol>
  );
});
