"use client";

import { useState } from "react";
import { useWatch, type Control, type UseFormRegister, type UseFormSetValue } from "react-hook-form";
import { textToZones, zonesToText, type PartTypeFormValues } from "@/lib/part-types/form-model";
import { ZoneDrawer } from "./zone-drawer";
import type { ZoneDefinition } from "@/lib/part-types/schemas";

const small = "field-input py-1";

/** Zones as typed, with only well-formed points kept (the drawer cannot place the others). */
function readableZones(text: string): ZoneDefinition[] {
  return textToZones(text).map((z) => ({
    id: z.id,
    label: z.label || z.id,
    polygon: z.polygon.every((p) => p.length === 2 && p.every((v) => typeof v === "number")) ? (z.polygon as [number, number][]) : [],
  }));
}

/**
 * One view of the part type editor: key, label, whether it is required, how to take it, and its
 * zones — drawn on a sample photo of the part type (ZoneDrawer) or typed as points.
 */
export function ViewFields({
  index,
  partTypeId,
  control,
  register,
  setValue,
  onRemove,
}: {
  index: number;
  partTypeId?: string;
  control: Control<PartTypeFormValues>;
  register: UseFormRegister<PartTypeFormValues>;
  setValue: UseFormSetValue<PartTypeFormValues>;
  onRemove: () => void;
}) {
  const [drawing, setDrawing] = useState(false);
  const [key, label, zonesText] = useWatch({ control, name: [`views.${index}.key`, `views.${index}.label`, `views.${index}.zones`] });
  const zones = readableZones(zonesText ?? "");
  const p = `views.${index}` as const;
  return (
    <li className="grid gap-2 rounded-md border border-gauge-100 p-3 sm:grid-cols-6" data-testid={`view-editor-${index}`}>
      <label className="block">
        <span className="mb-0.5 block text-xs font-medium text-gauge-700">Key</span>
        <input className={small} placeholder="e.g. front" {...register(`${p}.key`)} />
      </label>
      <label className="block sm:col-span-2">
        <span className="mb-0.5 block text-xs font-medium text-gauge-700">Label</span>
        <input className={small} {...register(`${p}.label`)} />
      </label>
      <label className="flex items-end gap-1 pb-1.5 text-sm">
        <input type="checkbox" {...register(`${p}.required`)} /> Required
      </label>
      <label className="block sm:col-span-2">
        <span className="mb-0.5 block text-xs font-medium text-gauge-700">How to take it</span>
        <input className={small} {...register(`${p}.instructions`)} />
      </label>
      <div className="space-y-1 sm:col-span-6">
        <div className="flex flex-wrap items-center gap-2">
          <span className="text-xs font-medium text-gauge-700">Zones</span>
          <span className="text-xs text-gauge-600" data-testid={`view-zones-${index}`}>
            {zones.length ? zones.map((z) => z.label).join(", ") : "none"}
          </span>
          <button
            type="button"
            className="btn-secondary py-0.5 text-xs"
            onClick={() => setDrawing(true)}
            disabled={!partTypeId || !key}
            title={partTypeId ? undefined : "Save the part type first: zones are drawn on photos of it."}
          >
            Draw zones on a photo
          </button>
          {!partTypeId && <span className="text-xs text-gauge-600">(save the part type first)</span>}
        </div>
        <details>
          <summary className="cursor-pointer text-xs text-gauge-700">Zone points as text</summary>
          <label className="mt-1 block">
            <span className="mb-0.5 block text-xs text-gauge-600">One per line, “key | Label | x,y x,y x,y …” in 0..1 of the box around the part&apos;s Surface.</span>
            <textarea className={`${small} font-mono`} rows={2} {...register(`${p}.zones`)} />
          </label>
        </details>
      </div>
      <div>
        <button type="button" className="btn-secondary py-1 text-xs whitespace-nowrap" onClick={onRemove}>
          Remove view
        </button>
      </div>
      {drawing && partTypeId && (
        <ZoneDrawer
          partTypeId={partTypeId}
          view={{ key, label: label || key }}
          zones={zones}
          onApply={(drawn) => setValue(`${p}.zones`, zonesToText(drawn), { shouldDirty: true })}
          onClose={() => setDrawing(false)}
        />
      )}
    </li>
  );
}
