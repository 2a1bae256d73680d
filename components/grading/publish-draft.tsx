"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { apiFetch } from "@/lib/http/client";
import { rubricKeys } from "@/lib/query-keys/rubrics";

/** The lead's publish action, with one confirmation step: publishing cannot be undone. */
export function PublishDraft({ partTypeId, version, revision, blockedReason }: { partTypeId: string; version: number; revision: number; blockedReason: string | null }) {
  const queryClient = useQueryClient();
  const [confirming, setConfirming] = useState(false);
  const publish = useMutation({
    mutationFn: () => apiFetch<{ version: number }>(`/api/part-types/${partTypeId}/rubrics/draft/publish`, { method: "POST", body: { version, revision } }),
    onSuccess: () => {
      setConfirming(false);
      void queryClient.invalidateQueries({ queryKey: rubricKeys.versions(partTypeId) });
    },
  });
  if (!confirming) {
    return (
      <span className="flex flex-col items-end">
        <button type="button" className="btn-secondary" disabled={blockedReason !== null} onClick={() => setConfirming(true)} aria-describedby={blockedReason ? "publish-blocked" : undefined}>
          Publish version {version}…
        </button>
        {blockedReason && (
          <span id="publish-blocked" className="mt-1 text-xs text-gauge-700">
            {blockedReason}
          </span>
        )}
      </span>
    );
  }
  return (
    <div role="group" aria-label="Confirm publishing" className="w-full space-y-2 rounded-md border border-signal-500 bg-signal-50 p-3 text-sm sm:w-auto sm:max-w-md">
      <p>Publishing freezes version {version} for good. Units measured from now on are graded by it; grades already recorded keep the version they were graded under.</p>
      {publish.isError && <FormMessage kind="error">{publish.error.message}</FormMessage>}
      <div className="flex gap-2">
        <button type="button" className="btn-primary" onClick={() => publish.mutate()} disabled={publish.isPending}>
          {publish.isPending ? "Publishing…" : `Publish version ${version}`}
        </button>
        <button type="button" className="btn-secondary" onClick={() => setConfirming(false)}>
          Cancel
        </button>
      </div>
    </div>
  );
}
