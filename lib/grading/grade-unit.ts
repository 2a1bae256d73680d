/**
 * Measuring and grading one unit from loaded data (no database here; lib/grading/unit-grading.ts
 * loads and stores). Every photo is measured with measurePhoto, the results become the unit's
 * metrics together with its failed checklist items, and the rubric proposes a grade.
 *
 * Measuring never depends on the rubric, so stored measurements can be graded again under any
 * other version (`regradeStored`) without measuring anything again.
 */
import { AppError } from "@/lib/errors";
import { assertBeforeDeadline, DeadlineExceeded } from "@/lib/imaging/deadline";
import type { Shape } from "@/lib/geometry/shape";
import type { RulerInput } from "@/lib/measure/calibration";
import type { PhotoMeasurement } from "@/lib/measure/types";
import { evaluateRubric, type GradeResult } from "./evaluate";
import { measurePhoto, panelFor, type PhotoMeasurementResult } from "./measure-photo";
import { gradingContextOf } from "./part-type-context";
import type { DefectSeverity } from "@/lib/part-types/severity";
import type { Rubric } from "./rubric-schema";
import type { StoredUnitResult } from "./stored-measurement";
import { buildUnitMetrics, type FunctionalFailureCounts } from "./unit-metrics";
import type { DefectClassDefinition, ViewDefinition } from "@/lib/part-types/schemas";

export type UnitPhotoInput = {
  photoId: string;
  viewKey: string;
  width: number;
  height: number;
  /** The region set version these regions were read at. */
  regionsVersion: number;
  defects: { id: string; defect: string; shape: Shape }[];
  surfaces: Shape[];
  rulers: RulerInput[];
};

export type GradingPartTypeInput = {
  views: ViewDefinition[];
  defectClasses: DefectClassDefinition[];
  nominalSizeMm: { width: number; height: number } | null;
  panelResolution: { width: number; height: number } | null;
};

export type UnitMeasureInput = {
  partType: GradingPartTypeInput;
  rubric: Rubric;
  photos: UnitPhotoInput[];
  functionalFailures: FunctionalFailureCounts;
  /** Epoch ms; measuring stops with a DeadlineExceeded (inside the loops) once it has passed. */
  deadline?: number;
  /** Instead of `deadline`: ms from the moment measuring starts (a compute thread may start later). */
  budgetMs?: number;
};

export type UnitMeasureOutcome = {
  photos: PhotoMeasurementResult[];
  regionsVersions: Record<string, number>;
  unit: Omit<StoredUnitResult, "checklistStamp">;
};

export { DeadlineExceeded };

/** Failed checklist items counted per severity (what functionalFailures rules read). */
export function functionalFailureCounts(results: readonly { passed: boolean; severityOnFail: DefectSeverity }[]): FunctionalFailureCounts {
  const counts: FunctionalFailureCounts = { critical: 0, major: 0, minor: 0 };
  for (const result of results) if (!result.passed) counts[result.severityOnFail] += 1;
  return counts;
}

export async function measureUnit(input: UnitMeasureInput): Promise<UnitMeasureOutcome> {
  if (input.photos.length === 0) {
    throw new AppError("conflict", "This unit has no photos yet. Photograph the required views and mark the regions before measuring.");
  }
  const context = gradingContextOf(input.partType);
  const views = new Map(input.partType.views.map((view) => [view.key, view]));
  const deadline = input.deadline ?? (input.budgetMs !== undefined ? Date.now() + input.budgetMs : undefined);
  const photos: PhotoMeasurementResult[] = [];
  for (const [index, photo] of input.photos.entries()) {
    assertBeforeDeadline(deadline);
    const view = views.get(photo.viewKey);
    const result = await measurePhoto(
      {
        photoId: photo.photoId,
        viewKey: photo.viewKey,
        width: photo.width,
        height: photo.height,
        defects: photo.defects,
        surfaces: photo.surfaces,
        rulers: photo.rulers,
        zones: view?.zones.map((zone) => ({ id: zone.id, polygon: zone.polygon })) ?? [],
        nominalSizeMm: input.partType.nominalSizeMm,
        panel: panelFor({ panelResolution: input.partType.panelResolution, viewKey: photo.viewKey, defects: photo.defects }),
      },
      { deadline },
    ).catch((err: unknown) => {
      // Stored regions that cannot be measured (e.g. saved before today's caps): say which photo.
      if (err instanceof AppError && err.code === "bad_request")
        throw new AppError("conflict", `Photo ${index + 1} (${view?.label ?? photo.viewKey}) cannot be measured: ${err.message} Change its regions, then measure again.`);
      throw err;
    });
    if (!view) result.notes.push(`View "${photo.viewKey}" is not one of this part type's views: no zones were measured on this photo.`);
    photos.push(result);
  }
  const proposal = gradeMeasurements({
    rubric: input.rubric,
    photos: photos.map((p) => p.measurement),
    functionalFailures: input.functionalFailures,
    defectSeverities: context.severities,
    labels: context.labels,
  });
  return {
    photos,
    regionsVersions: Object.fromEntries(input.photos.map((photo) => [photo.photoId, photo.regionsVersion])),
    unit: { kind: "unit", functionalFailures: input.functionalFailures, defectSeverities: context.severities, labels: context.labels, proposal },
  };
}

/** Grades photo measurements and failure counts with a rubric. */
export function gradeMeasurements(input: {
  rubric: Rubric;
  photos: PhotoMeasurement[];
  functionalFailures: FunctionalFailureCounts;
  defectSeverities: StoredUnitResult["defectSeverities"];
  labels: StoredUnitResult["labels"];
}): GradeResult {
  const metrics = buildUnitMetrics({ photos: input.photos, functionalFailures: input.functionalFailures });
  return evaluateRubric({ rubric: input.rubric, metrics, defectSeverities: input.defectSeverities, labels: input.labels });
}

/** "What would this rubric say": a stored measurement graded again, with its own severities and labels. */
export function regradeStored(input: { rubric: Rubric; photos: PhotoMeasurement[]; unit: StoredUnitResult }): GradeResult {
  return gradeMeasurements({
    rubric: input.rubric,
    photos: input.photos,
    functionalFailures: input.unit.functionalFailures,
    defectSeverities: input.unit.defectSeverities,
    labels: input.unit.labels,
  });
}
