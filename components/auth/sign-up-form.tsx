"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { type z } from "zod";
import { StarterChoices, type StarterChoice } from "@/components/part-types/starter-choices";
import { FormField, FormMessage } from "@/components/ui/form-field";
import { signUpSchema } from "@/lib/auth/schemas";
import { ApiError, apiFetch } from "@/lib/http/client";

type Values = z.input<typeof signUpSchema>;

export function SignUpForm({ starters }: { starters: readonly StarterChoice[] }) {
  const [serverError, setServerError] = useState<string | null>(null);
  const [sent, setSent] = useState<string | null>(null);
  const { register, handleSubmit, formState, setError } = useForm<Values>({
    resolver: zodResolver(signUpSchema),
    defaultValues: { starterPartTypes: starters.map((s) => s.slug) as Values["starterPartTypes"] },
  });

  const onSubmit = handleSubmit(async (values) => {
    setServerError(null);
    try {
      const { message } = await apiFetch<{ message: string }>("/api/signup", { body: values });
      setSent(message);
    } catch (err) {
      if (err instanceof ApiError) {
        for (const [field, message] of Object.entries(err.fieldErrors)) {
          if (field in values) setError(field as keyof Values, { message });
        }
        setServerError(err.message);
        return;
      }
      throw err;
    }
  });

  if (sent) {
    return (
      <div className="space-y-4" data-testid="sign-up-sent">
        <h1 className="text-xl font-semibold">Confirm your e-mail address</h1>
        <FormMessage kind="success">{sent}</FormMessage>
        <p className="text-sm">
          Already have an account?{" "}
          <Link href="/sign-in" className="text-gauge-600 underline">
            Sign in
          </Link>
        </p>
      </div>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-labelledby="sign-up-title">
      <div>
        <h1 id="sign-up-title" className="text-xl font-semibold">
          Set up your QC desk
        </h1>
        <p className="text-sm text-gauge-700">
          This creates a workspace for your company. You become its QC lead and can invite your team. We first e-mail you a link to confirm the address and choose your password.
        </p>
      </div>
      {serverError && <FormMessage kind="error">{serverError}</FormMessage>}
      <FormField id="companyName" label="Company" registration={register("companyName")} error={formState.errors.companyName} autoComplete="organization" />
      <FormField id="name" label="Your name" registration={register("name")} error={formState.errors.name} autoComplete="name" />
      <FormField id="email" label="Work e-mail" type="email" registration={register("email")} error={formState.errors.email} autoComplete="email" />
      <fieldset className="space-y-2" aria-describedby="starter-hint">
        <legend className="field-label">Start with example part types</legend>
        <p id="starter-hint" className="text-xs text-gauge-600">
          Each comes with its views and zones, defect classes and functional checklist, and an example rubric as a draft. They are examples to adapt: change anything on the Part types and Rubrics
          screens, and publish a rubric once its thresholds suit your contracts. Untick what you do not handle.
        </p>
        <StarterChoices choices={starters} registration={register("starterPartTypes")} idPrefix="starter" />
      </fieldset>
      <button type="submit" className="btn-primary w-full" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Sending…" : "Create workspace"}
      </button>
      <p className="text-sm">
        Already have an account?{" "}
        <Link href="/sign-in" className="text-gauge-600 underline">
          Sign in
        </Link>
      </p>
    </form>
  );
}
