"use client";

import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { apiFetch } from "@/lib/http/client";
import { GradeBadge } from "./grade-badge";
import { GradeLines } from "./grade-lines";
import type { GradePreviewView } from "./types";
import { unitKeys } from "@/lib/query-keys/units";

/**
 * "What would version N say": the measurement behind the current grade, graded again by another
 * rubric version. Nothing is stored; the recorded grade stays as it is.
 */
export function GradeWhatIf({ unitId, versions, framed = true }: { unitId: string; versions: { version: number; status: "draft" | "published" }[]; framed?: boolean }) {
  const published = versions.filter((v) => v.status === "published");
  const [version, setVersion] = useState<number | null>(published[0]?.version ?? versions[0]?.version ?? null);
  // The same query (and cache) as the grade panel's: ask for a preview only once there is a measurement to grade again.
  const latest = useQuery({ queryKey: unitKeys.measurement(unitId, null), queryFn: () => apiFetch<{ measurement: unknown }>(`/api/units/${unitId}/measure`) });
  const measured = Boolean(latest.data?.measurement);
  const preview = useQuery({
    queryKey: unitKeys.gradePreview(unitId, version),
    queryFn: () => apiFetch<GradePreviewView>(`/api/units/${unitId}/grade-preview?rubricVersion=${version}`),
    enabled: version !== null && measured,
    retry: false,
  });
  const basis = preview.data?.basis;
  return (
    <section className={framed ? "card space-y-3 p-4 sm:p-5" : "space-y-2"} aria-labelledby="what-if-title" data-testid="grade-what-if">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h2 id="what-if-title" className={framed ? "text-lg font-semibold" : "text-sm font-semibold"}>
          What another rubric version would say
        </h2>
        <div>
          <label htmlFor="what-if-version" className="field-label">
            Rubric version
          </label>
          <select id="what-if-version" className="field-input" value={version ?? ""} onChange={(e) => setVersion(Number(e.target.value))}>
            {versions.map((v) => (
              <option key={v.version} value={v.version}>
                Version {v.version}
                {v.status === "draft" ? " (draft)" : ""}
              </option>
            ))}
          </select>
        </div>
      </div>
      {versions.length === 0 && <p className="text-sm text-gauge-700">This part type has no rubric versions.</p>}
      {latest.isSuccess && !measured && versions.length > 0 && (
        <p className="text-sm text-gauge-700" data-testid="what-if-waiting">
          Not measured yet. Once the unit is measured, any rubric version can grade the same numbers here.
        </p>
      )}
      {preview.isPending && measured && version !== null && <p className="text-sm text-gauge-700">Grading again…</p>}
      {preview.isError &&
        (preview.error.message.includes("not been measured") ? <p className="text-sm text-gauge-700">{preview.error.message}</p> : <FormMessage kind="error">{preview.error.message}</FormMessage>)}
      {preview.isSuccess && basis && (
        <div className="space-y-3">
          <p className="text-sm">
            {basis.grade ? (
              <>
                Recorded grade <GradeBadge grade={basis.grade.finalGrade} size="sm" /> under version {basis.grade.rubricVersion} stays as it is.
              </>
            ) : (
              <>No grade recorded yet; this uses the latest measurement (proposed under version {basis.measuredUnderVersion}).</>
            )}
          </p>
          <div className="flex flex-wrap items-center gap-3">
            <span className="text-sm font-medium">
              Version {preview.data.rubricVersion.version}
              {preview.data.rubricVersion.status === "draft" ? " (draft)" : ""} would say:
            </span>
            <GradeBadge grade={preview.data.result.grade} size="lg" testId="what-if-grade" />
          </div>
          <GradeLines lines={preview.data.result.lines} notes={preview.data.result.notes} testId="what-if-lines" />
          {basis.stale && <p className="text-xs text-signal-700">The regions or checklist changed since this measurement; measure again for an up-to-date proposal.</p>}
        </div>
      )}
    </section>
  );
}
