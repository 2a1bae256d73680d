import { sql } from "drizzle-orm";
import { check, index, integer, jsonb, pgTable, text, timestamp, unique, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import type { GradeLine } from "@/lib/grading/evaluate";
import type { Grade, Rubric } from "@/lib/grading/rubric-schema";
import type { StoredMeasurementResult } from "@/lib/grading/stored-measurement";
import { users, workspaces } from "./core";
import { partTypes, units } from "./lots";
import { photos } from "./photos";
import { sameWorkspace } from "./workspace-keys";

export const RUBRIC_STATUSES = ["draft", "published"] as const;
export type RubricStatus = (typeof RUBRIC_STATUSES)[number];

/**
 * Versions of a part type's rubric. Trainers edit the one draft; a lead publishes it, and from
 * then on the row never changes: a trigger (migration "rubric_versions_immutable") refuses UPDATE
 * and DELETE of published rows, so past grades always point at the rules they were graded by.
 */
export const rubricVersions = pgTable(
  "rubric_versions",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    partTypeId: uuid().notNull(),
    version: integer().notNull(),
    status: text({ enum: RUBRIC_STATUSES }).notNull().default("draft"),
    rubric: jsonb().$type<Rubric>().notNull(),
    /** The version this one was copied from (null for a first version). */
    basedOnVersion: integer(),
    /**
     * Edits of a draft so far: every save adds one. Save and publish name the revision they saw,
     * so a lead never publishes (and a trainer never overwrites) rules they have not seen.
     */
    revision: integer().notNull().default(0),
    createdBy: uuid(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedBy: uuid(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    publishedBy: uuid(),
    publishedAt: timestamp({ withTimezone: true }),
  },
  (t) => [
    uniqueIndex("rubric_versions_part_type_version_key").on(t.partTypeId, t.version),
    // One draft per part type at a time: trainers share it, so nobody edits a stale copy.
    uniqueIndex("rubric_versions_one_draft_key")
      .on(t.partTypeId)
      .where(sql`${t.status} = 'draft'`),
    index("rubric_versions_workspace_idx").on(t.workspaceId, t.partTypeId),
    check("rubric_versions_version_positive", sql`${t.version} >= 1`),
    check("rubric_versions_published_fields", sql`(${t.status} = 'published') = (${t.publishedAt} IS NOT NULL)`),
    unique("rubric_versions_workspace_id_key").on(t.workspaceId, t.id),
    sameWorkspace("rubric_versions_part_type_fk", t.workspaceId, t.partTypeId, partTypes),
    sameWorkspace("rubric_versions_created_by_fk", t.workspaceId, t.createdBy, users),
    sameWorkspace("rubric_versions_updated_by_fk", t.workspaceId, t.updatedBy, users),
    sameWorkspace("rubric_versions_published_by_fk", t.workspaceId, t.publishedBy, users),
  ],
);

/**
 * What measuring a unit found: one row per photo (`photoId` set) and one unit-level row
 * (`photoId` null) holding the unit's metrics and the grade proposed under `rubricVersionId`.
 * `regionsVersions` maps photo id → region set version read, so a later change of any photo's
 * regions (or a photo added or removed) makes the result stale.
 */
export const measurements = pgTable(
  "measurements",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    unitId: uuid().notNull(),
    photoId: uuid(),
    /** The unit-level row this photo row belongs to (null on the unit-level row itself). */
    unitMeasurementId: uuid(),
    rubricVersionId: uuid().notNull(),
    regionsVersions: jsonb().$type<Record<string, number>>().notNull(),
    result: jsonb().$type<StoredMeasurementResult>().notNull(),
    createdBy: uuid(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("measurements_unit_idx").on(t.workspaceId, t.unitId, t.createdAt),
    index("measurements_parent_idx").on(t.unitMeasurementId),
    unique("measurements_workspace_id_key").on(t.workspaceId, t.id),
    sameWorkspace("measurements_unit_fk", t.workspaceId, t.unitId, units),
    sameWorkspace("measurements_photo_fk", t.workspaceId, t.photoId, photos),
    sameWorkspace("measurements_parent_fk", t.workspaceId, t.unitMeasurementId, { workspaceId: t.workspaceId, id: t.id }),
    sameWorkspace("measurements_rubric_version_fk", t.workspaceId, t.rubricVersionId, rubricVersions),
    sameWorkspace("measurements_created_by_fk", t.workspaceId, t.createdBy, users),
  ],
);

export const GRADE_KINDS = ["inspection", "recheck", "adjudication", "override"] as const;
export type GradeKind = (typeof GRADE_KINDS)[number];
const GRADE_VALUES = ["A", "B", "C", "Reject"] as const satisfies readonly Grade[];

/** Stored explanation of a grade: the fired rules' lines and the evaluation's notes. */
export type StoredExplanation = { lines: GradeLine[]; notes: string[] };

/**
 * Append-only grade history (a trigger refuses UPDATE and DELETE). The last row of a unit is its
 * current grade; earlier rows stay as the record of who graded what, by which rubric version.
 */
export const grades = pgTable(
  "grades",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    unitId: uuid().notNull(),
    kind: text({ enum: GRADE_KINDS }).notNull(),
    proposedGrade: text({ enum: GRADE_VALUES }).notNull(),
    finalGrade: text({ enum: GRADE_VALUES }).notNull(),
    overrideReason: text(),
    rubricVersionId: uuid().notNull(),
    /** The unit-level measurement first, then its photo rows. */
    measurementIds: uuid().array().notNull(),
    explanation: jsonb().$type<StoredExplanation>().notNull(),
    regionsVersions: jsonb().$type<Record<string, number>>().notNull(),
    gradedBy: uuid().notNull(),
    /** The client's key for one submission: a repeated request returns this row instead of adding another. */
    idempotencyKey: uuid(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("grades_unit_idx").on(t.workspaceId, t.unitId, t.createdAt),
    // Rechecks name a grade of their own workspace (db/schema/recheck.ts).
    unique("grades_workspace_id_key").on(t.workspaceId, t.id),
    // The recheck draw reads one grader's grades of the week as each grade is recorded.
    index("grades_grader_idx").on(t.workspaceId, t.gradedBy, t.createdAt),
    uniqueIndex("grades_unit_idempotency_key")
      .on(t.unitId, t.idempotencyKey)
      .where(sql`${t.idempotencyKey} IS NOT NULL`),
    sameWorkspace("grades_unit_fk", t.workspaceId, t.unitId, units),
    sameWorkspace("grades_rubric_version_fk", t.workspaceId, t.rubricVersionId, rubricVersions),
    sameWorkspace("grades_graded_by_fk", t.workspaceId, t.gradedBy, users),
    check("grades_override_reason", sql`${t.finalGrade} = ${t.proposedGrade} OR (${t.overrideReason} IS NOT NULL AND length(btrim(${t.overrideReason})) > 0)`),
    check("grades_override_kind_reason", sql`${t.kind} <> 'override' OR (${t.overrideReason} IS NOT NULL AND length(btrim(${t.overrideReason})) > 0)`),
  ],
);

export type RubricVersion = typeof rubricVersions.$inferSelect;
export type NewRubricVersion = typeof rubricVersions.$inferInsert;
export type Measurement = typeof measurements.$inferSelect;
export type NewMeasurement = typeof measurements.$inferInsert;
export type GradeRow = typeof grades.$inferSelect;
export type NewGradeRow = typeof grades.$inferInsert;
