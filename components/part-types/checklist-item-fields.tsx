"use client";

import { useWatch, type Control, type UseFormRegister } from "react-hook-form";
import type { PartTypeFormValues } from "@/lib/part-types/form-model";
import { DEFECT_SEVERITIES, SEVERITY_LABELS } from "@/lib/part-types/schemas";

const small = "field-input py-1";

/** A labelled field of a checklist item (every field has a visible label). */
function Field({ label, className = "", children }: { label: string; className?: string; children: React.ReactNode }) {
  return (
    <label className={`block ${className}`}>
      <span className="mb-0.5 block text-xs font-medium text-gauge-700">{label}</span>
      {children}
    </label>
  );
}

/** One checklist item of the part type editor: what the Bench checks, how it fails, its limits. */
export function ChecklistItemFields({ index, control, register, onRemove }: { index: number; control: Control<PartTypeFormValues>; register: UseFormRegister<PartTypeFormValues>; onRemove: () => void }) {
  const kind = useWatch({ control, name: `checklist.${index}.kind` });
  const p = `checklist.${index}` as const;
  return (
    <li className="grid gap-2 rounded-md border border-gauge-100 p-3 sm:grid-cols-6" data-testid={`item-editor-${index}`}>
      <Field label="Key"><input className={small} placeholder="e.g. ocv" {...register(`${p}.id`)} /></Field>
      <Field label="What the Bench checks" className="sm:col-span-3"><input className={small} {...register(`${p}.label`)} /></Field>
      <Field label="Kind">
        <select className={small} {...register(`${p}.kind`)}>
          <option value="pass_fail">Pass / fail</option>
          <option value="numeric">Reading</option>
          <option value="choice">Choice</option>
        </select>
      </Field>
      <Field label="Fails as">
        <select className={small} {...register(`${p}.severityOnFail`)}>
          {DEFECT_SEVERITIES.map((s) => <option key={s} value={s}>{SEVERITY_LABELS[s]}</option>)}
        </select>
      </Field>
      {kind === "numeric" && (
        <>
          <Field label="Unit"><input className={small} placeholder="V, %, cycles" {...register(`${p}.unit`)} /></Field>
          <Field label="Minimum"><input className={small} placeholder="none" inputMode="decimal" {...register(`${p}.min`)} /></Field>
          <Field label="Maximum"><input className={small} placeholder="none" inputMode="decimal" {...register(`${p}.max`)} /></Field>
          <Field label="Decimals"><input className={small} inputMode="numeric" {...register(`${p}.decimals`)} /></Field>
          <Field label="Set aside below" className="sm:col-span-2">
            <input className={small} placeholder="none (e.g. 2.50 for a cell)" inputMode="decimal" aria-describedby={`${p}-suspect-hint`} {...register(`${p}.suspectBelow`)} />
            <span id={`${p}-suspect-hint`} className="mt-0.5 block text-xs text-gauge-600">A reading below this asks to set the part aside as suspect.</span>
          </Field>
        </>
      )}
      {kind === "choice" && (
        <Field label="Choices: one per line, “value | Label | pass” or “fail”" className="sm:col-span-6">
          <textarea className={`${small} font-mono`} rows={3} placeholder={"none | None | pass\nloud | Loud | fail"} {...register(`${p}.options`)} />
        </Field>
      )}
      <Field label="Caution shown with the item (optional)" className="sm:col-span-5"><input className={small} {...register(`${p}.caution`)} /></Field>
      <div className="flex items-end"><button type="button" className="btn-secondary py-1 text-xs" onClick={onRemove}>Remove item</button></div>
    </li>
  );
}
