"use client";

import { useQuery } from "@tanstack/react-query";
import { GradeBadge } from "@/components/grading/grade-badge";
import { GradeLines } from "@/components/grading/grade-lines";
import { MeasurementTable, type MeasurementLabels } from "@/components/grading/measurement-table";
import type { AnswerMeasurement } from "@/lib/calibration/measure-answer";
import { apiFetch } from "@/lib/http/client";
import { calibrationKeys } from "@/lib/query-keys/calibration";

/**
 * The taker's own numbers for one item, as the Bench shows them: the saved regions measured and
 * what the published rubric proposes. Measured again after each save (keyed on its time).
 */
export function AnswerMeasurementPanel({ attemptId, position, savedAt, labels }: { attemptId: string; position: number; savedAt: string; labels: MeasurementLabels }) {
  const query = useQuery({
    queryKey: calibrationKeys.measurement(attemptId, position, savedAt),
    queryFn: () => apiFetch<{ measurement: AnswerMeasurement }>(`/api/calibration/attempts/${attemptId}/measurement?position=${position}`),
    staleTime: 60_000,
  });
  if (query.isPending)
    return (
      <p className="text-sm text-gauge-700" role="status">
        Measuring your regions…
      </p>
    );
  if (query.isError) return <p className="text-sm text-fault-700">Your regions could not be measured: {query.error.message}</p>;
  const { measurement, notes, rubric } = query.data.measurement;
  return (
    <div className="space-y-2" data-testid="answer-measurement">
      <MeasurementTable photos={[{ kind: "photo", measurement, notes }]} labels={labels} />
      <div className="rounded-md border border-gauge-200 p-2 text-sm" data-testid="answer-proposal">
        {rubric ? (
          <>
            <p className="flex flex-wrap items-center gap-1.5 font-medium">
              The published rubric (v{rubric.version}) proposes <GradeBadge grade={rubric.proposal.grade} size="sm" />
            </p>
            <div className="mt-1">
              <GradeLines lines={rubric.proposal.lines} notes={rubric.proposal.notes} />
            </div>
          </>
        ) : (
          <p className="text-gauge-700">This part type has no published rubric, so nothing proposes a grade; judge it yourself.</p>
        )}
      </div>
    </div>
  );
}
