"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useFieldArray, useForm, useWatch, type Control, type UseFormRegister } from "react-hook-form";
import { FormMessage } from "@/components/ui/form-field";
import { ApiError, apiFetch } from "@/lib/http/client";
import { EMPTY_ITEM, EMPTY_PART_TYPE, formToInput, type PartTypeFormValues } from "@/lib/part-types/form-model";
import { PROMISED_GRADES } from "@/lib/lots/schemas";
import { CATEGORY_LABELS, DEFECT_SEVERITIES, PART_CATEGORIES, partTypeSchema, SEVERITY_LABELS } from "@/lib/part-types/schemas";
import { partTypeKeys } from "@/lib/query-keys/part-types";

const small = "field-input py-1";
const severityOptions = DEFECT_SEVERITIES.map((s) => (
  <option key={s} value={s}>{SEVERITY_LABELS[s]}</option>
));

function ItemFields({ index, control, register, onRemove }: { index: number; control: Control<PartTypeFormValues>; register: UseFormRegister<PartTypeFormValues>; onRemove: () => void }) {
  const kind = useWatch({ control, name: `checklist.${index}.kind` });
  const p = `checklist.${index}` as const;
  return (
    <li className="grid gap-2 rounded-md border border-gauge-100 p-3 sm:grid-cols-6" data-testid={`item-editor-${index}`}>
      <input className={small} aria-label={`Item ${index + 1} id`} placeholder="id (e.g. ocv)" {...register(`${p}.id`)} />
      <input className={`${small} sm:col-span-3`} aria-label={`Item ${index + 1} label`} placeholder="What the bench checks" {...register(`${p}.label`)} />
      <select className={small} aria-label={`Item ${index + 1} kind`} {...register(`${p}.kind`)}>
        <option value="pass_fail">Pass / fail</option>
        <option value="numeric">Reading</option>
        <option value="choice">Choice</option>
      </select>
      <select className={small} aria-label={`Item ${index + 1} severity when it fails`} {...register(`${p}.severityOnFail`)}>{severityOptions}</select>
      {kind === "numeric" && (
        <>
          <input className={small} aria-label={`Item ${index + 1} unit`} placeholder="unit (V, %)" {...register(`${p}.unit`)} />
          <input className={small} aria-label={`Item ${index + 1} minimum`} placeholder="min" inputMode="decimal" {...register(`${p}.min`)} />
          <input className={small} aria-label={`Item ${index + 1} maximum`} placeholder="max" inputMode="decimal" {...register(`${p}.max`)} />
          <input className={small} aria-label={`Item ${index + 1} decimals`} placeholder="decimals" inputMode="numeric" {...register(`${p}.decimals`)} />
        </>
      )}
      {kind === "choice" && (
        <textarea className={`${small} font-mono sm:col-span-4`} rows={3} aria-label={`Item ${index + 1} choices`} placeholder={"none | None | pass\nloud | Loud | fail"} {...register(`${p}.options`)} />
      )}
      <input className={`${small} sm:col-span-5`} aria-label={`Item ${index + 1} caution`} placeholder="Caution shown with the item (optional)" {...register(`${p}.caution`)} />
      <button type="button" className="btn-secondary py-1 text-xs" onClick={onRemove}>Remove</button>
    </li>
  );
}

/** Create (no partTypeId) or edit a part type: views and zones, defect classes, checklist. */
export function PartTypeForm({ partTypeId, initial = EMPTY_PART_TYPE }: { partTypeId?: string; initial?: PartTypeFormValues }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [problems, setProblems] = useState<string[]>([]);
  const [message, setMessage] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  const { register, control, handleSubmit } = useForm<PartTypeFormValues>({ defaultValues: initial });
  const classes = useFieldArray({ control, name: "defectClasses" });
  const items = useFieldArray({ control, name: "checklist" });
  const views = useFieldArray({ control, name: "views" });
  const save = useMutation({
    mutationFn: (body: unknown) => apiFetch<{ partType: { id: string; name: string } }>(partTypeId ? `/api/part-types/${partTypeId}` : "/api/part-types", { method: partTypeId ? "PATCH" : "POST", body }),
    onSuccess: ({ partType }) => {
      setMessage({ kind: "success", text: `${partType.name} saved.` });
      void queryClient.invalidateQueries({ queryKey: partTypeKeys.all });
      if (partTypeId) router.refresh();
      else router.push(`/part-types/${partType.id}`);
    },
    onError: (err) => {
      setProblems(err instanceof ApiError ? Object.entries(err.fieldErrors).map(([k, v]) => `${k}: ${v}`) : []);
      setMessage({ kind: "error", text: err.message });
    },
  });
  const submit = handleSubmit((values) => {
    const parsed = partTypeSchema.safeParse(formToInput(values));
    if (!parsed.success) {
      setProblems(parsed.error.issues.slice(0, 12).map((i) => `${i.path.join(".") || "part type"}: ${i.message}`));
      setMessage({ kind: "error", text: "Some fields need attention; nothing was saved." });
      return;
    }
    setProblems([]);
    save.mutate(parsed.data);
  });

  return (
    <form onSubmit={submit} noValidate className="card space-y-5 p-5" data-testid="part-type-form">
      <h2 className="text-lg font-semibold">{partTypeId ? "Edit part type" : "New part type"}</h2>
      {message && <FormMessage kind={message.kind}>{message.text}</FormMessage>}
      {problems.length > 0 && (
        <ul className="list-disc rounded-md bg-fault-50 py-2 pl-8 pr-3 text-sm text-fault-700" role="alert">
          {problems.map((p) => <li key={p}>{p}</li>)}
        </ul>
      )}
      <div className="grid gap-4 sm:grid-cols-3">
        <label className="block"><span className="field-label">Name</span><input className="field-input" {...register("name")} /></label>
        <label className="block">
          <span className="field-label">Category</span>
          <select className="field-input" {...register("category")}>
            {PART_CATEGORIES.map((c) => <option key={c} value={c}>{CATEGORY_LABELS[c]}</option>)}
          </select>
        </label>
        <label className="block"><span className="field-label">Model family</span><input className="field-input" {...register("modelFamily")} /></label>
        <fieldset className="grid grid-cols-2 gap-2">
          <legend className="field-label">Nominal outline (mm, calibration fallback)</legend>
          <input className="field-input" aria-label="Nominal width in mm" placeholder="width" inputMode="decimal" {...register("nominalWidth")} />
          <input className="field-input" aria-label="Nominal height in mm" placeholder="height" inputMode="decimal" {...register("nominalHeight")} />
        </fieldset>
        <fieldset className="grid grid-cols-2 gap-2">
          <legend className="field-label">Panel resolution (display parts)</legend>
          <input className="field-input" aria-label="Panel width in pixels" placeholder="width px" inputMode="numeric" {...register("panelWidth")} />
          <input className="field-input" aria-label="Panel height in pixels" placeholder="height px" inputMode="numeric" {...register("panelHeight")} />
        </fieldset>
        <label className="block">
          <span className="field-label">Grade lots are bought at</span>
          <select className="field-input" aria-describedby="promised-grade-hint" {...register("promisedGrade")}>
            {PROMISED_GRADES.map((g) => <option key={g} value={g}>{g}</option>)}
          </select>
          <span id="promised-grade-hint" className="mt-1 block text-xs text-gauge-600">Default for new lots, unless the supplier has its own: a unit graded worse counts against the lot.</span>
        </label>
        <div className="space-y-2 pt-6 text-sm">
          <label className="flex items-center gap-2"><input type="checkbox" {...register("inspectAll")} /> Inspect every unit (100 %)</label>
          <label className="flex items-center gap-2"><input type="checkbox" {...register("active")} /> Active (new lots may use it)</label>
        </div>
      </div>

      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold uppercase tracking-wide text-gauge-600">Views to photograph and their zones</legend>
        <p className="text-xs text-gauge-600">Zones: one per line, “id | Label | x,y x,y x,y …” in 0..1 of the part&apos;s Surface bounding box.</p>
        <ul className="space-y-2">
          {views.fields.map((field, i) => (
            <li key={field.id} className="grid gap-2 rounded-md border border-gauge-100 p-3 sm:grid-cols-6">
              <input className={small} aria-label={`View ${i + 1} key`} placeholder="key" {...register(`views.${i}.key`)} />
              <input className={`${small} sm:col-span-2`} aria-label={`View ${i + 1} label`} placeholder="Label" {...register(`views.${i}.label`)} />
              <label className="flex items-center gap-1 text-sm"><input type="checkbox" {...register(`views.${i}.required`)} /> Required</label>
              <input className={`${small} sm:col-span-2`} aria-label={`View ${i + 1} instructions`} placeholder="How to take it" {...register(`views.${i}.instructions`)} />
              <textarea className={`${small} font-mono sm:col-span-5`} rows={2} aria-label={`View ${i + 1} zones`} {...register(`views.${i}.zones`)} />
              <button type="button" className="btn-secondary py-1 text-xs" onClick={() => views.remove(i)}>Remove</button>
            </li>
          ))}
        </ul>
        <button type="button" className="btn-secondary py-1 text-xs" onClick={() => views.append({ key: "", label: "", required: true, instructions: "", zones: "" })}>Add view</button>
      </fieldset>

      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold uppercase tracking-wide text-gauge-600">Defect classes</legend>
        <ul className="grid gap-2 sm:grid-cols-2">
          {classes.fields.map((field, i) => (
            <li key={field.id} className="flex gap-2">
              <input className={small} aria-label={`Defect class ${i + 1} key`} placeholder="key" {...register(`defectClasses.${i}.key`)} />
              <input className={small} aria-label={`Defect class ${i + 1} label`} placeholder="Label" {...register(`defectClasses.${i}.label`)} />
              <select className={small} aria-label={`Defect class ${i + 1} severity`} {...register(`defectClasses.${i}.severity`)}>{severityOptions}</select>
              <button type="button" className="btn-secondary py-1 text-xs" onClick={() => classes.remove(i)} aria-label={`Remove defect class ${i + 1}`}>×</button>
            </li>
          ))}
        </ul>
        <button type="button" className="btn-secondary py-1 text-xs" onClick={() => classes.append({ key: "", label: "", severity: "minor" })}>Add defect class</button>
      </fieldset>

      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold uppercase tracking-wide text-gauge-600">Functional checklist</legend>
        <ol className="space-y-2">
          {items.fields.map((field, i) => (
            <ItemFields key={field.id} index={i} control={control} register={register} onRemove={() => items.remove(i)} />
          ))}
        </ol>
        <button type="button" className="btn-secondary py-1 text-xs" onClick={() => items.append({ ...EMPTY_ITEM })}>Add checklist item</button>
      </fieldset>
      <button type="submit" className="btn-primary" disabled={save.isPending}>{partTypeId ? "Save part type" : "Create part type"}</button>
    </form>
  );
}
