"use client";

import { useQuery } from "@tanstack/react-query";
import { GradeBadge } from "@/components/grading/grade-badge";
import { GradeLines } from "@/components/grading/grade-lines";
import { MeasurementTable, type MeasurementLabels } from "@/components/grading/measurement-table";
import type { GalleryMeasurement } from "@/lib/gallery/measure";
import type { Grade } from "@/lib/grading/rubric-schema";
import { apiFetch } from "@/lib/http/client";
import { galleryKeys } from "@/lib/query-keys/gallery";

/**
 * The item's measured numbers (its own regions, measured as the Bench measures a photo) and what
 * the part type's current published rubric says of them, beside the grade the trainer gave it.
 * Measured on request for the item's revision: a saved edit is measured again.
 */
export function ItemMeasurement({ itemId, revision, grade, labels }: { itemId: string; revision: number; grade: Grade; labels: MeasurementLabels }) {
  const query = useQuery({
    queryKey: galleryKeys.measurement(itemId, revision),
    queryFn: () => apiFetch<{ measurement: GalleryMeasurement | null }>(`/api/gallery/${itemId}/measurement`),
    staleTime: 60_000,
  });
  if (query.isPending)
    return (
      <p className="text-sm text-gauge-700" role="status">
        Measuring the regions…
      </p>
    );
  if (query.isError) return <p className="text-sm text-fault-700">The numbers could not be measured: {query.error.message}</p>;
  const result = query.data.measurement;
  if (!result) return <p className="text-sm text-gauge-700">The photo is still being processed; its numbers follow once it is ready.</p>;
  const proposal = result.rubric?.proposal;
  return (
    <div className="space-y-3" data-testid="item-measurement">
      <MeasurementTable photos={[{ kind: "photo", measurement: result.measurement, notes: result.notes }]} labels={labels} />
      <div className="rounded-md border border-gauge-200 p-2 text-sm" data-testid="rubric-says">
        {result.rubric && proposal ? (
          <>
            <p className="flex flex-wrap items-center gap-1.5 font-medium">
              The published rubric (v{result.rubric.version}) says <GradeBadge grade={proposal.grade} size="sm" testId="rubric-grade" />
              {proposal.grade === grade ? (
                <span className="font-normal text-ok-600">— the grade this item gives.</span>
              ) : (
                <span className="font-normal text-signal-700">— this item gives {grade}; the caption should say why.</span>
              )}
            </p>
            <div className="mt-1">
              <GradeLines lines={proposal.lines} notes={proposal.notes} />
            </div>
          </>
        ) : (
          <p className="text-gauge-700">This part type has no published rubric yet, so nothing says what these numbers are worth.</p>
        )}
      </div>
    </div>
  );
}
