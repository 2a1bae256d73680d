"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { type z } from "zod";
import { FormField, FormMessage } from "@/components/ui/form-field";
import { ROLE_LABELS, ROLES } from "@/lib/auth/roles";
import { inviteSchema } from "@/lib/auth/schemas";
import { ApiError, apiFetch } from "@/lib/http/client";
import { peopleKeys } from "@/lib/query-keys/people";

type Values = z.input<typeof inviteSchema>;

export function InviteForm() {
  const queryClient = useQueryClient();
  const [result, setResult] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  const { register, handleSubmit, formState, reset, setError } = useForm<Values>({
    resolver: zodResolver(inviteSchema),
    defaultValues: { email: "", name: "", roles: ["inspector"] },
  });
  const invite = useMutation({
    mutationFn: (values: Values) => apiFetch<{ message: string; emailSent: boolean }>("/api/people", { body: values }),
    onSuccess: (data) => {
      setResult({ kind: data.emailSent ? "success" : "error", text: data.message });
      reset();
      void queryClient.invalidateQueries({ queryKey: peopleKeys.all });
    },
    onError: (err) => {
      if (err instanceof ApiError) {
        for (const [field, message] of Object.entries(err.fieldErrors)) {
          if (field === "email" || field === "name" || field === "roles") setError(field, { message });
        }
      }
      setResult({ kind: "error", text: err.message });
    },
  });

  return (
    <form onSubmit={handleSubmit((v) => invite.mutate(v))} noValidate className="card space-y-4 p-5" aria-labelledby="invite-title" data-testid="invite-form">
      <h2 id="invite-title" className="text-lg font-semibold">
        Invite a colleague
      </h2>
      {result && <FormMessage kind={result.kind}>{result.text}</FormMessage>}
      <div className="grid gap-4 sm:grid-cols-2">
        <FormField id="invite-name" label="Name" registration={register("name")} error={formState.errors.name} />
        <FormField id="invite-email" label="E-mail" type="email" registration={register("email")} error={formState.errors.email} />
      </div>
      <fieldset>
        <legend className="field-label">Roles</legend>
        <div className="flex flex-wrap gap-4">
          {ROLES.map((role) => (
            <label key={role} className="flex items-center gap-2 text-sm">
              <input type="checkbox" value={role} {...register("roles")} /> {ROLE_LABELS[role]}
            </label>
          ))}
        </div>
        {formState.errors.roles && (
          <p className="field-error" aria-live="polite">
            {formState.errors.roles.message ?? "Choose at least one role."}
          </p>
        )}
      </fieldset>
      <button type="submit" className="btn-primary" disabled={invite.isPending}>
        {invite.isPending ? "Sending…" : "Send invitation"}
      </button>
    </form>
  );
}
