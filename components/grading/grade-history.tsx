"use client";

import { useQuery } from "@tanstack/react-query";
import { FormMessage } from "@/components/ui/form-field";
import { useDateTime } from "@/components/ui/time-zone";
import { apiFetch } from "@/lib/http/client";
import { GradeBadge } from "./grade-badge";
import { GradeLines } from "./grade-lines";
import { type GradeView } from "./types";
import { unitKeys } from "@/lib/query-keys/units";

const KIND_LABEL: Record<GradeView["kind"], string> = { inspection: "Inspection", recheck: "Recheck", adjudication: "Adjudication", override: "Lead's correction" };

/** The unit's append-only grade history, newest first; the top row is the current grade. */
export function GradeHistory({ unitId, framed = true }: { unitId: string; framed?: boolean }) {
  const dateTime = useDateTime();
  const history = useQuery({ queryKey: unitKeys.grades(unitId), queryFn: () => apiFetch<{ grades: GradeView[]; current: GradeView | null }>(`/api/units/${unitId}/grades`) });
  return (
    <section className={framed ? "card space-y-3 p-4 sm:p-5" : "space-y-2"} aria-labelledby="grade-history-title" data-testid="grade-history">
      <h2 id="grade-history-title" className={framed ? "text-lg font-semibold" : "text-sm font-semibold"}>
        Grade history
      </h2>
      {history.isPending && <p className="text-sm text-gauge-700">Loading…</p>}
      {history.isError && <FormMessage kind="error">{history.error.message}</FormMessage>}
      {history.isSuccess && history.data.grades.length === 0 && <p className="text-sm text-gauge-700">No grade recorded yet.</p>}
      {history.isSuccess && history.data.grades.length > 0 && (
        <ol className="space-y-3">
          {[...history.data.grades].reverse().map((g, i) => (
            <li key={g.id} className={`rounded-md border p-3 ${i === 0 ? "border-gauge-500" : "border-gauge-200"}`} data-testid={i === 0 ? "current-grade" : undefined}>
              <div className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm">
                <GradeBadge grade={g.finalGrade} size="lg" />
                <span className="font-medium">{i === 0 ? "Current grade" : KIND_LABEL[g.kind]}</span>
                {i === 0 && <span className="text-gauge-700">({KIND_LABEL[g.kind].toLowerCase()})</span>}
                <span className="text-gauge-700">under rubric version {g.rubricVersion}</span>
                <span className="text-xs text-gauge-600">
                  {dateTime(g.createdAt)} by {g.gradedByName}
                </span>
              </div>
              {g.finalGrade !== g.proposedGrade ? (
                <p className="mt-1 text-sm">
                  Proposed {g.proposedGrade}, overridden to {g.finalGrade}: <q className="italic">{g.overrideReason}</q>
                </p>
              ) : (
                <p className="mt-1 text-sm text-gauge-700">Proposed grade accepted.{g.overrideReason ? ` Reason: ${g.overrideReason}` : ""}</p>
              )}
              <details className="mt-2">
                <summary className="cursor-pointer text-sm text-gauge-700">Why {g.proposedGrade} was proposed</summary>
                <div className="mt-2">
                  <GradeLines lines={g.explanation.lines} notes={g.explanation.notes} />
                </div>
              </details>
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}
