/** Shapes of the grading API's JSON as the browser receives them (dates as ISO text). */
import type { GradeLine, GradeResult } from "@/lib/grading/evaluate";
import type { DefectSeverity } from "@/lib/part-types/severity";
import type { Grade, Rubric } from "@/lib/grading/rubric-schema";
import type { GradingLabels } from "@/lib/grading/rule-text";
import type { StoredPhotoResult } from "@/lib/grading/stored-measurement";
import type { ViewDefinition } from "@/lib/part-types/schemas";

export type RubricVersionView = {
  id: string;
  version: number;
  status: "draft" | "published";
  rubric: Rubric;
  basedOnVersion: number | null;
  /** Edits of the draft so far; save and publish send it back (409 when someone saved since). */
  revision: number;
  createdAt: string;
  createdByName: string | null;
  updatedAt: string;
  updatedByName: string | null;
  publishedAt: string | null;
  publishedByName: string | null;
};

export type PartTypeSummary = {
  id: string;
  slug: string;
  name: string;
  views: ViewDefinition[];
  lists: { defects: string[]; zones: string[]; views: string[] };
  severities: Record<string, DefectSeverity>;
  labels: Required<GradingLabels>;
};

export type RubricVersionsResponse = { partType: PartTypeSummary; versions: RubricVersionView[] };

export type MeasurementView = {
  id: string;
  createdAt: string;
  createdByName: string | null;
  rubricVersion: number;
  regionsVersions: Record<string, number>;
  functionalFailures: { critical: number; major: number; minor: number };
  proposal: GradeResult;
  photos: StoredPhotoResult[];
  stale: boolean;
  reasons: string[];
};

export type GradeView = {
  id: string;
  kind: "inspection" | "recheck" | "adjudication" | "override";
  proposedGrade: Grade;
  finalGrade: Grade;
  overrideReason: string | null;
  rubricVersion: number;
  explanation: { lines: GradeLine[]; notes: string[] };
  gradedByName: string;
  createdAt: string;
};

export type GradePreviewView = {
  rubricVersion: { version: number; status: "draft" | "published"; publishedAt: string | null };
  basis: {
    measurementId: string;
    measuredAt: string;
    measuredUnderVersion: number;
    grade: { id: string; finalGrade: Grade; proposedGrade: Grade; rubricVersion: number; createdAt: string } | null;
    stale: boolean;
    reasons: string[];
  };
  result: GradeResult;
};
