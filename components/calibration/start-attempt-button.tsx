"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { apiFetch } from "@/lib/http/client";

/** Starts (or resumes: the same attempt comes back with its answers) an assigned set and opens it. */
export function StartAttemptButton({ assignmentId, label }: { assignmentId: string; label: string }) {
  const router = useRouter();
  const open = useMutation({
    mutationFn: () => apiFetch<{ attemptId: string }>(`/api/calibration/assignments/${assignmentId}/attempt`, { method: "POST" }),
    onSuccess: ({ attemptId }) => router.push(`/calibration/attempts/${attemptId}`),
  });
  return (
    <span className="inline-flex flex-col items-end gap-1">
      <button type="button" className="btn-primary" onClick={() => open.mutate()} disabled={open.isPending || open.isSuccess} data-testid="start-attempt">
        {open.isPending || open.isSuccess ? "Opening…" : label}
      </button>
      {open.error && (
        <span role="alert" className="text-xs text-fault-700">
          {open.error.message}
        </span>
      )}
    </span>
  );
}
