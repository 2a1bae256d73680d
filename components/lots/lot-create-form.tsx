"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQuery } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useEffect, useMemo, useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import type { z } from "zod";
import { FormField, FormMessage } from "@/components/ui/form-field";
import { ApiError, apiFetch } from "@/lib/http/client";
import { aqlLabel, buildLotPlan, DEFAULT_AQLS, DEFAULT_LEVEL } from "@/lib/lots/plan";
import { lotCreateSchema, PROMISED_GRADES, type PromisedGrade } from "@/lib/lots/schemas";
import { INSPECTION_LEVELS, PREFERRED_AQLS } from "@/lib/sampling/iso2859";
import { CountingNote, PlanTable } from "./plan-table";
import { SwitchingBox, type SwitchingView } from "./switching-box";
import { lotKeys } from "@/lib/query-keys/lots";

type Values = z.input<typeof lotCreateSchema>;
type Output = z.output<typeof lotCreateSchema>;
type PartTypeOption = { id: string; name: string; modelFamily: string; inspectAll: boolean; promisedGrade: PromisedGrade };
type SupplierOption = { id: string; name: string; promisedGrade: PromisedGrade | null };
const FIELDS = ["supplierId", "partTypeId", "purchaseRef", "modelFamily", "quantity", "receivedOn", "dueOn", "inspectionLevel", "aqlCritical", "aqlMajor", "aqlMinor", "promisedGrade"] as const;

const isoDay = (offsetDays = 0) => {
  const d = new Date(Date.now() + offsetDays * 86_400_000);
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}-${String(d.getDate()).padStart(2, "0")}`;
};
const toNumber = (v: unknown) => (v === "" || v === null || v === undefined ? Number.NaN : Number(v));

/** Receive a lot: the plan preview follows the inputs and the switching state of supplier + part type. */
export function LotCreateForm({ suppliers, partTypes, canEditSwitching }: { suppliers: SupplierOption[]; partTypes: PartTypeOption[]; canEditSwitching: boolean }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const form = useForm<Values, unknown, Output>({
    resolver: zodResolver(lotCreateSchema),
    defaultValues: {
      supplierId: "",
      partTypeId: "",
      purchaseRef: "",
      modelFamily: "",
      receivedOn: isoDay(),
      dueOn: isoDay(7),
      inspectionLevel: DEFAULT_LEVEL,
      aqlCritical: DEFAULT_AQLS.critical,
      aqlMajor: DEFAULT_AQLS.major,
      aqlMinor: DEFAULT_AQLS.minor,
      promisedGrade: "A",
    },
  });
  const { register, handleSubmit, formState, control } = form;
  const [supplierId, partTypeId, quantity, level, aqlCritical, aqlMajor, aqlMinor] = useWatch({
    control,
    name: ["supplierId", "partTypeId", "quantity", "inspectionLevel", "aqlCritical", "aqlMajor", "aqlMinor"],
  });
  const partType = partTypes.find((p) => p.id === partTypeId);
  const supplier = suppliers.find((s) => s.id === supplierId);
  const defaultGrade = supplier?.promisedGrade ?? partType?.promisedGrade ?? "A";
  const gradeSource = supplier?.promisedGrade ? `${supplier.name}'s default` : partType ? `${partType.name}'s default` : "choose the supplier and part type for their default";
  // Follow the supplier's or part type's default until the lead picks a grade on purpose.
  const gradeTouched = formState.dirtyFields.promisedGrade;
  useEffect(() => {
    if (!gradeTouched) form.setValue("promisedGrade", defaultGrade);
  }, [defaultGrade, gradeTouched, form]);

  const switching = useQuery({
    queryKey: lotKeys.switching(supplierId, partTypeId),
    queryFn: () => apiFetch<SwitchingView>(`/api/inspection-schemes?supplierId=${supplierId}&partTypeId=${partTypeId}`),
    enabled: Boolean(supplierId && partTypeId),
  });
  const preview = useMemo(() => {
    if (!partType || !Number.isInteger(quantity) || (quantity as number) < 1 || !switching.data) return null;
    try {
      return buildLotPlan({
        lotSize: quantity as number,
        level: level as (typeof INSPECTION_LEVELS)[number],
        aqls: { critical: aqlCritical ?? null, major: aqlMajor as number, minor: aqlMinor as number },
        severity: switching.data.state.severity,
        inspectAll: partType.inspectAll,
        switchingReason: switching.data.state.reason,
      });
    } catch {
      return null;
    }
  }, [partType, quantity, level, aqlCritical, aqlMajor, aqlMinor, switching.data]);

  const create = useMutation({
    mutationFn: (values: Output) => apiFetch<{ lot: { id: string } }>("/api/lots", { body: values }),
    onSuccess: ({ lot }) => router.push(`/lots/${lot.id}`),
    onError: (err) => {
      if (err instanceof ApiError) {
        for (const [field, message] of Object.entries(err.fieldErrors)) {
          if ((FIELDS as readonly string[]).includes(field)) form.setError(field as (typeof FIELDS)[number], { message });
        }
      }
      setError(err.message);
    },
  });
  const e = formState.errors;
  const aqlOptions = PREFERRED_AQLS.map((a) => (
    <option key={a} value={a}>
      {aqlLabel(a)}
    </option>
  ));

  return (
    <form onSubmit={handleSubmit((v) => create.mutate(v))} noValidate className="space-y-5" data-testid="lot-create-form">
      {error && <FormMessage kind="error">{error}</FormMessage>}
      <div className="card grid gap-4 p-5 sm:grid-cols-2 lg:grid-cols-3">
        <div>
          <label htmlFor="lot-supplier" className="field-label">
            Supplier
          </label>
          <select id="lot-supplier" className="field-input" aria-invalid={e.supplierId ? true : undefined} {...register("supplierId")}>
            <option value="">Choose…</option>
            {suppliers.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </select>
          {e.supplierId && <p className="field-error">{e.supplierId.message}</p>}
        </div>
        <div>
          <label htmlFor="lot-part-type" className="field-label">
            Part type
          </label>
          <select id="lot-part-type" className="field-input" aria-invalid={e.partTypeId ? true : undefined} {...register("partTypeId")}>
            <option value="">Choose…</option>
            {partTypes.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
                {p.inspectAll ? " (100 %)" : ""}
              </option>
            ))}
          </select>
          {e.partTypeId && <p className="field-error">{e.partTypeId.message}</p>}
        </div>
        <div>
          <label htmlFor="lot-promised-grade" className="field-label">
            Grade the purchase promised
          </label>
          <select id="lot-promised-grade" className="field-input" aria-describedby="lot-promised-grade-hint" {...register("promisedGrade", { setValueAs: (v) => v })}>
            {PROMISED_GRADES.map((g) => (
              <option key={g} value={g}>
                {g}
              </option>
            ))}
          </select>
          <p id="lot-promised-grade-hint" className="mt-1 text-xs text-gauge-600" data-testid="promised-grade-source">
            {gradeTouched ? "Chosen for this lot." : `From ${gradeSource}.`} A unit graded worse counts against the lot.
          </p>
        </div>
        <FormField id="lot-ref" label="Purchase reference" registration={register("purchaseRef")} error={e.purchaseRef} />
        <FormField id="lot-model" label="Model family" registration={register("modelFamily")} error={e.modelFamily} hint={partType?.modelFamily ? `Defaults to ${partType.modelFamily}.` : undefined} />
        <FormField id="lot-quantity" label="Quantity received" type="number" registration={register("quantity", { setValueAs: toNumber })} error={e.quantity} />
        <div className="grid grid-cols-2 gap-3">
          <FormField id="lot-received" label="Received" type="date" registration={register("receivedOn")} error={e.receivedOn} />
          <FormField id="lot-due" label="Due" type="date" registration={register("dueOn")} error={e.dueOn} hint="Earlier due dates come first in the queue." />
        </div>
        <div>
          <label htmlFor="lot-level" className="field-label">
            Inspection level
          </label>
          <select id="lot-level" className="field-input" {...register("inspectionLevel")}>
            {INSPECTION_LEVELS.map((l) => (
              <option key={l} value={l}>
                {l === "II" ? "II (general, usual)" : l}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="lot-aql-critical" className="field-label">
            AQL critical
          </label>
          <select id="lot-aql-critical" className="field-input" {...register("aqlCritical", { setValueAs: (v) => (v === "" || v === null ? null : Number(v)) })}>
            <option value="">{aqlLabel(null)}</option>
            {aqlOptions}
          </select>
        </div>
        <div className="grid grid-cols-2 gap-3">
          <div>
            <label htmlFor="lot-aql-major" className="field-label">
              AQL major
            </label>
            <select id="lot-aql-major" className="field-input" {...register("aqlMajor", { setValueAs: toNumber })}>
              {aqlOptions}
            </select>
            {e.aqlMajor && <p className="field-error">{e.aqlMajor.message}</p>}
          </div>
          <div>
            <label htmlFor="lot-aql-minor" className="field-label">
              AQL minor
            </label>
            <select id="lot-aql-minor" className="field-input" {...register("aqlMinor", { setValueAs: toNumber })}>
              {aqlOptions}
            </select>
            {e.aqlMinor && <p className="field-error">{e.aqlMinor.message}</p>}
          </div>
        </div>
      </div>
      <p className="text-xs text-gauge-600">Defaults are common practice: critical 0 (any critical defect rejects), major 1.0, minor 2.5 — adjust to your contract.</p>

      {supplierId && partTypeId && switching.isError && <FormMessage kind="error">{switching.error.message}</FormMessage>}
      {switching.data && <SwitchingBox supplierId={supplierId} partTypeId={partTypeId} view={switching.data} canEdit={canEditSwitching} title="Switching state for this lot" />}
      {preview && (
        <section className="card space-y-3 p-5" aria-labelledby="plan-preview-title" data-testid="plan-preview">
          <h2 id="plan-preview-title" className="text-lg font-semibold">
            Sampling plan: inspect {preview.sampleSize} of {preview.lotSize} units{preview.hundredPercent ? " (100 %)" : ""}
          </h2>
          <PlanTable plan={preview} />
          <CountingNote plan={preview} />
        </section>
      )}
      <button type="submit" className="btn-primary" disabled={create.isPending}>
        Receive lot
      </button>
    </form>
  );
}
