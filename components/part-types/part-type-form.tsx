"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useFieldArray, useForm } from "react-hook-form";
import { FormMessage } from "@/components/ui/form-field";
import { ApiError, apiFetch } from "@/lib/http/client";
import { PROMISED_GRADES } from "@/lib/lots/schemas";
import { EMPTY_ITEM, EMPTY_PART_TYPE, formToInput, type PartTypeFormValues } from "@/lib/part-types/form-model";
import { CATEGORY_LABELS, PART_CATEGORIES, partTypeSchema } from "@/lib/part-types/schemas";
import { DEFECT_SEVERITIES, DEFECT_SEVERITY_LABELS } from "@/lib/part-types/severity";
import { partTypeKeys } from "@/lib/query-keys/part-types";
import { ChecklistItemFields } from "./checklist-item-fields";
import { ViewFields } from "./view-fields";

const small = "field-input py-1";
const severityOptions = DEFECT_SEVERITIES.map((s) => (
  <option key={s} value={s}>
    {DEFECT_SEVERITY_LABELS[s]}
  </option>
));

/** Create (no partTypeId) or edit a part type: views and zones, defect classes, checklist. */
export function PartTypeForm({ partTypeId, initial = EMPTY_PART_TYPE }: { partTypeId?: string; initial?: PartTypeFormValues }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [problems, setProblems] = useState<string[]>([]);
  const [message, setMessage] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  const { register, control, handleSubmit, setValue } = useForm<PartTypeFormValues>({ defaultValues: initial });
  const classes = useFieldArray({ control, name: "defectClasses" });
  const items = useFieldArray({ control, name: "checklist" });
  const views = useFieldArray({ control, name: "views" });
  const save = useMutation({
    mutationFn: (body: unknown) =>
      apiFetch<{ partType: { id: string; name: string } }>(partTypeId ? `/api/part-types/${partTypeId}` : "/api/part-types", { method: partTypeId ? "PATCH" : "POST", body }),
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
          {problems.map((p) => (
            <li key={p}>{p}</li>
          ))}
        </ul>
      )}
      <div className="grid gap-4 sm:grid-cols-3">
        <label className="block">
          <span className="field-label">Name</span>
          <input className="field-input" {...register("name")} />
        </label>
        <label className="block">
          <span className="field-label">Category</span>
          <select className="field-input" {...register("category")}>
            {PART_CATEGORIES.map((c) => (
              <option key={c} value={c}>
                {CATEGORY_LABELS[c]}
              </option>
            ))}
          </select>
        </label>
        <label className="block">
          <span className="field-label">Model family</span>
          <input className="field-input" {...register("modelFamily")} />
        </label>
        <fieldset className="grid grid-cols-2 gap-2">
          <legend className="field-label">Nominal outline (mm, calibration fallback)</legend>
          <label className="block">
            <span className="mb-0.5 block text-xs text-gauge-700">Width (mm)</span>
            <input className="field-input" inputMode="decimal" {...register("nominalWidth")} />
          </label>
          <label className="block">
            <span className="mb-0.5 block text-xs text-gauge-700">Height (mm)</span>
            <input className="field-input" inputMode="decimal" {...register("nominalHeight")} />
          </label>
        </fieldset>
        <fieldset className="grid grid-cols-2 gap-2">
          <legend className="field-label">Panel resolution (display parts)</legend>
          <label className="block">
            <span className="mb-0.5 block text-xs text-gauge-700">Width (pixels)</span>
            <input className="field-input" inputMode="numeric" {...register("panelWidth")} />
          </label>
          <label className="block">
            <span className="mb-0.5 block text-xs text-gauge-700">Height (pixels)</span>
            <input className="field-input" inputMode="numeric" {...register("panelHeight")} />
          </label>
        </fieldset>
        <label className="block">
          <span className="field-label">Grade lots are bought at</span>
          <select className="field-input" aria-describedby="promised-grade-hint" {...register("promisedGrade")}>
            {PROMISED_GRADES.map((g) => (
              <option key={g} value={g}>
                {g}
              </option>
            ))}
          </select>
          <span id="promised-grade-hint" className="mt-1 block text-xs text-gauge-600">
            Default for new lots, unless the supplier has its own: a unit graded worse counts against the lot.
          </span>
        </label>
        <div className="space-y-2 pt-6 text-sm">
          <label className="flex items-center gap-2">
            <input type="checkbox" {...register("inspectAll")} /> Inspect every unit (100 %)
          </label>
          <label className="flex items-center gap-2">
            <input type="checkbox" {...register("active")} /> Active (new lots may use it)
          </label>
        </div>
      </div>

      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold uppercase tracking-wide text-gauge-600">Views to photograph and their zones</legend>
        <p className="text-xs text-gauge-600">Zones are areas of a view graded on their own (a lens window, a connector). Draw them on a photo of the part type, or type their points.</p>
        <ul className="space-y-2">
          {views.fields.map((field, i) => (
            <ViewFields key={field.id} index={i} partTypeId={partTypeId} control={control} register={register} setValue={setValue} onRemove={() => views.remove(i)} />
          ))}
        </ul>
        <button type="button" className="btn-secondary py-1 text-xs" onClick={() => views.append({ key: "", label: "", required: true, instructions: "", zones: "" })}>
          Add view
        </button>
      </fieldset>

      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold uppercase tracking-wide text-gauge-600">Defect classes</legend>
        <ul className="grid gap-2 sm:grid-cols-2">
          {classes.fields.map((field, i) => (
            <li key={field.id} className="flex items-end gap-2">
              <label className="block w-28 shrink-0">
                <span className="mb-0.5 block text-xs text-gauge-700">Key</span>
                <input className={small} {...register(`defectClasses.${i}.key`)} />
              </label>
              <label className="block min-w-0 flex-1">
                <span className="mb-0.5 block text-xs text-gauge-700">Label</span>
                <input className={small} {...register(`defectClasses.${i}.label`)} />
              </label>
              <div className="w-28 shrink-0">
                <label htmlFor={`class-${i}-severity`} className="mb-0.5 block text-xs text-gauge-700">
                  Severity
                </label>
                <select id={`class-${i}-severity`} className={small} {...register(`defectClasses.${i}.severity`)}>
                  {severityOptions}
                </select>
              </div>
              <button type="button" className="btn-secondary py-1 text-xs" onClick={() => classes.remove(i)} aria-label={`Remove defect class ${i + 1}`}>
                ×
              </button>
            </li>
          ))}
        </ul>
        <button type="button" className="btn-secondary py-1 text-xs" onClick={() => classes.append({ key: "", label: "", severity: "minor" })}>
          Add defect class
        </button>
      </fieldset>

      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold uppercase tracking-wide text-gauge-600">Functional checklist</legend>
        <ol className="space-y-2">
          {items.fields.map((field, i) => (
            <ChecklistItemFields key={field.id} index={i} control={control} register={register} onRemove={() => items.remove(i)} />
          ))}
        </ol>
        <button type="button" className="btn-secondary py-1 text-xs" onClick={() => items.append({ ...EMPTY_ITEM })}>
          Add checklist item
        </button>
      </fieldset>
      <button type="submit" className="btn-primary" disabled={save.isPending}>
        {partTypeId ? "Save part type" : "Create part type"}
      </button>
    </form>
  );
}
