"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { type z } from "zod";
import { FormField, FormMessage } from "@/components/ui/form-field";
import { ApiError, apiFetch } from "@/lib/http/client";
import { PROMISED_GRADES } from "@/lib/lots/schemas";
import { supplierSchema } from "@/lib/suppliers/schemas";
import { supplierKeys } from "@/lib/query-keys/suppliers";

type Values = z.input<typeof supplierSchema>;
type Output = z.output<typeof supplierSchema>;
const FIELDS = ["name", "contactName", "contactEmail", "notes", "promisedGrade"] as const;

/** Create (no supplierId) or edit a supplier. */
export function SupplierForm({ supplierId, initial }: { supplierId?: string; initial?: Values }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [result, setResult] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  const { register, handleSubmit, formState, reset, setError } = useForm<Values, unknown, Output>({
    resolver: zodResolver(supplierSchema),
    defaultValues: initial ?? { name: "", contactName: "", contactEmail: "", notes: "", promisedGrade: null },
  });
  const save = useMutation({
    mutationFn: (values: Output) =>
      apiFetch<{ supplier: { id: string; name: string } }>(supplierId ? `/api/suppliers/${supplierId}` : "/api/suppliers", { method: supplierId ? "PATCH" : "POST", body: values }),
    onSuccess: ({ supplier }) => {
      setResult({ kind: "success", text: supplierId ? "Saved." : `${supplier.name} added.` });
      if (!supplierId) reset();
      void queryClient.invalidateQueries({ queryKey: supplierKeys.all });
      router.refresh();
    },
    onError: (err) => {
      if (err instanceof ApiError) {
        for (const [field, message] of Object.entries(err.fieldErrors)) {
          if ((FIELDS as readonly string[]).includes(field)) setError(field as (typeof FIELDS)[number], { message });
        }
      }
      setResult({ kind: "error", text: err.message });
    },
  });

  return (
    <form onSubmit={handleSubmit((v) => save.mutate(v))} noValidate className="card space-y-4 p-5" data-testid="supplier-form">
      <h2 className="text-lg font-semibold">{supplierId ? "Edit supplier" : "Add a supplier"}</h2>
      {result && <FormMessage kind={result.kind}>{result.text}</FormMessage>}
      <div className="grid gap-4 sm:grid-cols-3">
        <FormField id="supplier-name" label="Name" registration={register("name")} error={formState.errors.name} />
        <FormField id="supplier-contact" label="Contact person" registration={register("contactName")} error={formState.errors.contactName} />
        <FormField id="supplier-email" label="Contact e-mail" type="email" registration={register("contactEmail")} error={formState.errors.contactEmail} hint="Evidence packs are sent here." />
      </div>
      <div className="sm:w-1/3">
        <label htmlFor="supplier-promised-grade" className="field-label">
          Grade lots are bought at
        </label>
        <select
          id="supplier-promised-grade"
          className="field-input"
          aria-describedby="supplier-promised-grade-hint"
          {...register("promisedGrade", { setValueAs: (v) => (v === "" || v === null ? null : v) })}
        >
          <option value="">The part type&apos;s default</option>
          {PROMISED_GRADES.map((g) => (
            <option key={g} value={g}>
              {g}
            </option>
          ))}
        </select>
        <p id="supplier-promised-grade-hint" className="mt-1 text-xs text-gauge-600">
          E.g. A for new stock, B for refurbished pulls. New lots start from it.
        </p>
      </div>
      <div>
        <label htmlFor="supplier-notes" className="field-label">
          Notes
        </label>
        <textarea id="supplier-notes" rows={2} className="field-input" {...register("notes")} />
        {formState.errors.notes && <p className="field-error">{formState.errors.notes.message}</p>}
      </div>
      <button type="submit" className="btn-primary" disabled={save.isPending}>
        {supplierId ? "Save changes" : "Add supplier"}
      </button>
    </form>
  );
}
