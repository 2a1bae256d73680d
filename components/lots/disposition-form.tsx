"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { FormMessage } from "@/components/ui/form-field";
import { apiFetch } from "@/lib/http/client";
import { DISPOSITION_LABELS, DISPOSITIONS_FOR_VERDICT, dispositionSchema } from "@/lib/lots/schemas";

type Values = z.input<typeof dispositionSchema>;

/** The lead's disposition of a lot whose verdict is reached, with a mandatory reason. */
export function DispositionForm({ lotId, verdict }: { lotId: string; verdict: "accept" | "reject" }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const options = DISPOSITIONS_FOR_VERDICT[verdict];
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(dispositionSchema), defaultValues: { disposition: options[0], reason: "" } });
  const decide = useMutation({
    mutationFn: (values: Values) => apiFetch(`/api/lots/${lotId}/disposition`, { body: values }),
    onSuccess: () => router.refresh(),
    onError: (err) => setError(err.message),
  });
  return (
    <form onSubmit={handleSubmit((v) => decide.mutate(v))} noValidate className="space-y-3" data-testid="disposition-form">
      {error && <FormMessage kind="error">{error}</FormMessage>}
      <fieldset>
        <legend className="field-label">Disposition</legend>
        <div className="flex flex-wrap gap-4">
          {options.map((d) => (
            <label key={d} className="flex items-center gap-2 text-sm">
              <input type="radio" value={d} {...register("disposition")} />
              {DISPOSITION_LABELS[d]}
            </label>
          ))}
        </div>
      </fieldset>
      <div>
        <label htmlFor="disposition-reason" className="field-label">
          Reason
        </label>
        <textarea id="disposition-reason" rows={2} className="field-input" aria-invalid={formState.errors.reason ? true : undefined} {...register("reason")} />
        {formState.errors.reason && <p className="field-error">{formState.errors.reason.message}</p>}
      </div>
      <button type="submit" className="btn-primary" disabled={decide.isPending}>
        Record disposition
      </button>
    </form>
  );
}
