"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { type z } from "zod";
import { FormField, FormMessage } from "@/components/ui/form-field";
import { signInSchema } from "@/lib/auth/schemas";

type Values = z.input<typeof signInSchema>;

/** Only same-site paths are followed after sign-in (no open redirect). */
function safeCallback(url: string | undefined): string {
  return url && url.startsWith("/") && !url.startsWith("//") ? url : "/";
}

export function SignInForm({ callbackUrl, notice }: { callbackUrl?: string; notice?: string }) {
  const router = useRouter();
  const [serverError, setServerError] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(signInSchema) });

  const onSubmit = handleSubmit(async (values) => {
    setServerError(null);
    const result = await signIn("credentials", { email: values.email, password: values.password, redirect: false });
    if (!result || result.error) {
      setServerError(result?.error && result.error !== "CredentialsSignin" ? result.error : "Sign-in failed. Try again.");
      return;
    }
    router.replace(safeCallback(callbackUrl));
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-labelledby="sign-in-title">
      <h1 id="sign-in-title" className="text-xl font-semibold">
        Sign in
      </h1>
      {notice && <FormMessage kind="success">{notice}</FormMessage>}
      {serverError && <FormMessage kind="error">{serverError}</FormMessage>}
      <FormField id="email" label="E-mail" type="email" autoComplete="username" registration={register("email")} error={formState.errors.email} />
      <FormField id="password" label="Password" type="password" autoComplete="current-password" registration={register("password")} error={formState.errors.password} />
      <button type="submit" className="btn-primary w-full" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Signing in…" : "Sign in"}
      </button>
      <div className="flex justify-between text-sm">
        <Link href="/forgot-password" className="text-gauge-600 underline">
          Forgot password?
        </Link>
        <Link href="/sign-up" className="text-gauge-600 underline">
          New company? Sign up
        </Link>
      </div>
    </form>
  );
}
