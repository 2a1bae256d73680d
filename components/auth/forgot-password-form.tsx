"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { type z } from "zod";
import { FormField, FormMessage } from "@/components/ui/form-field";
import { forgotPasswordSchema } from "@/lib/auth/schemas";
import { ApiError, apiFetch } from "@/lib/http/client";

type Values = z.input<typeof forgotPasswordSchema>;

export function ForgotPasswordForm() {
  const [result, setResult] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(forgotPasswordSchema) });

  const onSubmit = handleSubmit(async (values) => {
    try {
      const { message } = await apiFetch<{ message: string }>("/api/password/forgot", { body: values });
      setResult({ kind: "success", text: message });
    } catch (err) {
      setResult({ kind: "error", text: err instanceof ApiError ? err.message : "Something went wrong." });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-labelledby="forgot-title">
      <h1 id="forgot-title" className="text-xl font-semibold">
        Reset your password
      </h1>
      <p className="text-sm text-gauge-700">Enter the e-mail address of your account. We will send a link to choose a new password.</p>
      {result && <FormMessage kind={result.kind}>{result.text}</FormMessage>}
      <FormField id="email" label="E-mail" type="email" autoComplete="email" registration={register("email")} error={formState.errors.email} />
      <button type="submit" className="btn-primary w-full" disabled={formState.isSubmitting}>
        Send reset link
      </button>
      <Link href="/sign-in" className="block text-sm text-gauge-600 underline">
        Back to sign in
      </Link>
    </form>
  );
}
