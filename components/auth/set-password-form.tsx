"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { FormField, FormMessage } from "@/components/ui/form-field";
import { newPasswordSchema } from "@/lib/auth/schemas";
import { ApiError, apiFetch } from "@/lib/http/client";

const formSchema = z.object({ password: newPasswordSchema, confirm: z.string() }).refine((v) => v.password === v.confirm, { message: "The two passwords are not the same.", path: ["confirm"] });
type Values = z.input<typeof formSchema>;

export function SetPasswordForm({ token }: { token: string }) {
  const router = useRouter();
  const [serverError, setServerError] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(formSchema) });

  if (!token) {
    return <FormMessage kind="error">This page needs the link from your invitation or reset e-mail. Open the link from the e-mail again.</FormMessage>;
  }

  const onSubmit = handleSubmit(async ({ password }) => {
    setServerError(null);
    try {
      await apiFetch("/api/password/set", { body: { token, password } });
      router.replace("/sign-in?passwordSet=1");
    } catch (err) {
      setServerError(err instanceof ApiError ? err.message : "Something went wrong.");
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-labelledby="set-password-title">
      <h1 id="set-password-title" className="text-xl font-semibold">
        Choose your password
      </h1>
      {serverError && (
        <FormMessage kind="error">
          {serverError}{" "}
          <Link href="/forgot-password" className="underline">
            Ask for a new link
          </Link>
        </FormMessage>
      )}
      <FormField id="password" label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." registration={register("password")} error={formState.errors.password} />
      <FormField id="confirm" label="Repeat the password" type="password" autoComplete="new-password" registration={register("confirm")} error={formState.errors.confirm} />
      <button type="submit" className="btn-primary w-full" disabled={formState.isSubmitting}>
        Set password
      </button>
    </form>
  );
}
