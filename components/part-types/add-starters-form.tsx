"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { FormMessage } from "@/components/ui/form-field";
import { useHydrated } from "@/components/ui/use-hydrated";
import { ApiError, apiFetch } from "@/lib/http/client";
import { StarterChoices, type StarterChoice } from "./starter-choices";

/** An empty workspace's way to the example part types (each with a draft example rubric). */
export function AddStartersForm({ choices }: { choices: readonly StarterChoice[] }) {
  const router = useRouter();
  const hydrated = useHydrated();
  const [message, setMessage] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  const { register, handleSubmit } = useForm<{ slugs: string[] | string | false }>({ defaultValues: { slugs: choices.map((c) => c.slug) } });
  const add = useMutation({
    mutationFn: (slugs: string[]) => apiFetch<{ created: { name: string }[] }>("/api/part-types/starters", { body: { slugs } }),
    onSuccess: ({ created }) => {
      setMessage({ kind: "success", text: created.length ? `Added ${created.map((c) => c.name).join(", ")}.` : "You have these part types already." });
      router.refresh();
    },
    onError: (err) => setMessage({ kind: "error", text: err instanceof ApiError ? err.message : "The part types could not be added. Try again." }),
  });
  return (
    <form
      onSubmit={handleSubmit(({ slugs }) => {
        // One checked box comes back as a string, none as false.
        const list = Array.isArray(slugs) ? slugs : slugs ? [slugs] : [];
        if (list.length === 0) setMessage({ kind: "error", text: "Tick at least one part type to add." });
        else add.mutate(list);
      })}
      className="space-y-3"
      data-testid="add-starters"
    >
      {message && <FormMessage kind={message.kind}>{message.text}</FormMessage>}
      <StarterChoices choices={choices} registration={register("slugs")} idPrefix="add-starter" columns={2} />
      <button type="submit" className="btn-primary" disabled={!hydrated || add.isPending}>
        {add.isPending ? "Adding…" : "Add the ticked part types"}
      </button>
    </form>
  );
}
