"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { useHydrated } from "@/components/ui/use-hydrated";
import { ApiError, apiFetch } from "@/lib/http/client";
import { describeTimeZone } from "@/lib/time/format";

/** The lead's workspace settings: the one time zone every time in the app is shown in. */
export function WorkspaceSettingsForm({ timeZone }: { timeZone: string }) {
  const router = useRouter();
  const hydrated = useHydrated();
  const [chosen, setChosen] = useState(timeZone);
  const [result, setResult] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  // The runtime's IANA list (it leaves out "UTC" itself, which comes first).
  const zones = useMemo(() => ["UTC", ...Intl.supportedValuesOf("timeZone").filter((z) => z !== "UTC")], []);
  const save = useMutation({
    mutationFn: () => apiFetch<{ workspace: { timeZone: string } }>("/api/workspace", { method: "PATCH", body: { timeZone: chosen } }),
    onSuccess: ({ workspace }) => {
      setResult({ kind: "success", text: `Times are now shown in ${describeTimeZone(workspace.timeZone)}.` });
      router.refresh();
    },
    onError: (err) => setResult({ kind: "error", text: err instanceof ApiError ? err.message : "The setting could not be saved. Try again." }),
  });
  return (
    <form
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate();
      }}
      className="card space-y-3 p-5"
      aria-labelledby="workspace-settings-title"
      data-testid="workspace-settings"
      id="workspace"
    >
      <h2 id="workspace-settings-title" className="text-lg font-semibold">
        Workspace
      </h2>
      {result && <FormMessage kind={result.kind}>{result.text}</FormMessage>}
      <div className="flex flex-wrap items-end gap-3">
        <div>
          <label htmlFor="workspace-time-zone" className="field-label">
            Time zone
          </label>
          <select id="workspace-time-zone" className="field-input" value={chosen} onChange={(e) => setChosen(e.target.value)} aria-describedby="workspace-time-zone-hint">
            {zones.map((z) => (
              <option key={z} value={z}>
                {z}
              </option>
            ))}
          </select>
        </div>
        <button type="submit" className="btn-primary" disabled={!hydrated || save.isPending || chosen === timeZone}>
          Save time zone
        </button>
      </div>
      <p id="workspace-time-zone-hint" className="text-xs text-gauge-600">
        Every time in Partproof is shown in this zone, for everyone in the workspace; the zone is named once, beside your name.
      </p>
    </form>
  );
}
