"use client";

import { useWatch, type Control, type UseFormRegister } from "react-hook-form";
import type { PartTypeFormValues } from "@/lib/part-types/form-model";
import { DEFECT_SEVERITIES, DEFECT_SEVERITY_LABELS } from "@/lib/part-types/severity";

const small = "field-input py-1";

/**
 * A labelled field of a checklist item (every field has a visible label), tied to its control by
 * id, so a select's options never become part of the label.
 */
function Field({ id, label, className = "", children }: { id: string; label: string; className?: string; children: React.ReactNode }) {
  return (
    <div className={className}>
      <label htmlFor={id} className="mb-0.5 block text-xs font-medium text-gauge-700">
        {label}
      </label>
      {children}
    </div>
  );
}

/** One checklist item of the part type editor: what the Bench checks, how it fails, its limits. */
export function ChecklistItemFields({
  index,
  control,
  register,
  onRemove,
}: {
  index: number;
  control: Control<PartTypeFormValues>;
  register: UseFormRegister<PartTypeFormValues>;
  onRemove: () => void;
}) {
  const kind = useWatch({ control, name: `checklist.${index}.kind` });
  const p = `checklist.${index}` as const;
  return (
    <li className="grid gap-2 rounded-md border border-gauge-100 p-3 sm:grid-cols-6" data-testid={`item-editor-${index}`}>
      <Field id={`${p}-key`} label="Key">
        <input id={`${p}-key`} className={small} placeholder="e.g. ocv" {...register(`${p}.id`)} />
      </Field>
      <Field id={`${p}-label`} label="What the Bench checks" className="sm:col-span-3">
        <input id={`${p}-label`} className={small} {...register(`${p}.label`)} />
      </Field>
      <Field id={`${p}-kind`} label="Kind">
        <select id={`${p}-kind`} className={small} {...register(`${p}.kind`)}>
          <option value="pass_fail">Pass / fail</option>
          <option value="numeric">Reading</option>
          <option value="choice">Choice</option>
        </select>
      </Field>
      <Field id={`${p}-fails-as`} label="Fails as">
        <select id={`${p}-fails-as`} className={small} {...register(`${p}.severityOnFail`)}>
          {DEFECT_SEVERITIES.map((s) => (
            <option key={s} value={s}>
              {DEFECT_SEVERITY_LABELS[s]}
            </option>
          ))}
        </select>
      </Field>
      {kind === "numeric" && (
        <>
          <Field id={`${p}-unit`} label="Unit">
            <input id={`${p}-unit`} className={small} placeholder="V, %, cycles" {...register(`${p}.unit`)} />
          </Field>
          <Field id={`${p}-minimum`} label="Minimum">
            <input id={`${p}-minimum`} className={small} placeholder="none" inputMode="decimal" {...register(`${p}.min`)} />
          </Field>
          <Field id={`${p}-maximum`} label="Maximum">
            <input id={`${p}-maximum`} className={small} placeholder="none" inputMode="decimal" {...register(`${p}.max`)} />
          </Field>
          <Field id={`${p}-decimals`} label="Decimals">
            <input id={`${p}-decimals`} className={small} inputMode="numeric" {...register(`${p}.decimals`)} />
          </Field>
          <Field id={`${p}-set-aside-below`} label="Set aside below" className="sm:col-span-2">
            <input
              id={`${p}-set-aside-below`}
              className={small}
              placeholder="none (e.g. 2.50 for a cell)"
              inputMode="decimal"
              aria-describedby={`${p}-suspect-hint`}
              {...register(`${p}.suspectBelow`)}
            />
            <span id={`${p}-suspect-hint`} className="mt-0.5 block text-xs text-gauge-600">
              A reading below this asks to set the part aside as suspect.
            </span>
          </Field>
        </>
      )}
      {kind === "choice" && (
        <Field id={`${p}-choices`} label="Choices: one per line, “value | Label | pass” or “fail”" className="sm:col-span-6">
          <textarea id={`${p}-choices`} className={`${small} font-mono`} rows={3} placeholder={"none | None | pass\nloud | Loud | fail"} {...register(`${p}.options`)} />
        </Field>
      )}
      <Field id={`${p}-caution`} label="Caution shown with the item (optional)" className="sm:col-span-5">
        <input id={`${p}-caution`} className={small} {...register(`${p}.caution`)} />
      </Field>
      <div className="flex items-end">
        <button type="button" className="btn-secondary py-1 text-xs whitespace-nowrap" onClick={onRemove}>
          Remove item
        </button>
      </div>
    </li>
  );
}
