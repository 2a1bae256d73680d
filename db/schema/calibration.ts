import { sql } from "drizzle-orm";
import { boolean, check, date, doublePrecision, index, integer, jsonb, pgTable, primaryKey, text, timestamp, unique, uuid } from "drizzle-orm/pg-core";
import type { CalibrationAnswers, CalibrationAttemptStatus, StoredAttemptScore } from "@/lib/calibration/types";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { Grade } from "@/lib/grading/rubric-schema";
import { users, workspaces } from "./core";
import { galleryItems } from "./gallery";
import { partTypes } from "./lots";
import { photos } from "./photos";
import { sameWorkspace } from "./workspace-keys";

const GRADE_VALUES = ["A", "B", "C", "Reject"] as const satisfies readonly Grade[];
const ATTEMPT_STATUS_VALUES = ["in_progress", "submitted"] as const satisfies readonly CalibrationAttemptStatus[];

/**
 * A calibration set: 5–50 published gallery items a trainer put together, with the pass
 * thresholds (fractions 0–1, lib/calibration/schemas.ts). The key of each item is copied into
 * calibration_set_items when the set is made, so editing or retiring a gallery item later never
 * changes a set people are already taking or have been scored on.
 */
export const calibrationSets = pgTable(
  "calibration_sets",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    name: text().notNull(),
    minGradeAgreement: doublePrecision().notNull(),
    minMeanIou: doublePrecision().notNull(),
    itemCount: integer().notNull(),
    createdBy: uuid().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("calibration_sets_list_idx").on(t.workspaceId, t.createdAt.desc()),
    check("calibration_sets_thresholds", sql`${t.minGradeAgreement} BETWEEN 0 AND 1 AND ${t.minMeanIou} BETWEEN 0 AND 1`),
    check("calibration_sets_item_count", sql`${t.itemCount} BETWEEN 5 AND 50`),
    check("calibration_sets_name_length", sql`length(${t.name}) BETWEEN 1 AND 120`),
    unique("calibration_sets_workspace_id_key").on(t.workspaceId, t.id),
    sameWorkspace("calibration_sets_created_by_fk", t.workspaceId, t.createdBy, users),
  ],
);

/** One item of a set, in its place (1…n), with the key as it was when the set was made. */
export const calibrationSetItems = pgTable(
  "calibration_set_items",
  {
    workspaceId: uuid().notNull(),
    setId: uuid().notNull(),
    position: integer().notNull(),
    galleryItemId: uuid().notNull(),
    photoId: uuid().notNull(),
    partTypeId: uuid().notNull(),
    viewKey: text().notNull(),
    /** The key: the item's regions (with its Surface) and grade, and the caption shown after submitting. */
    keyRegions: jsonb().$type<RegionSetPayload>().notNull(),
    keyGrade: text({ enum: GRADE_VALUES }).notNull(),
    keyCaption: text().notNull(),
  },
  (t) => [
    primaryKey({ name: "calibration_set_items_pkey", columns: [t.setId, t.position] }),
    unique("calibration_set_items_item_key").on(t.setId, t.galleryItemId),
    index("calibration_set_items_photo_idx").on(t.workspaceId, t.photoId),
    // Whether an item is in a set someone is taking (the Gallery keeps it from them until they submit).
    index("calibration_set_items_gallery_item_idx").on(t.workspaceId, t.galleryItemId),
    check("calibration_set_items_position", sql`${t.position} BETWEEN 1 AND 50`),
    sameWorkspace("calibration_set_items_set_fk", t.workspaceId, t.setId, calibrationSets),
    sameWorkspace("calibration_set_items_gallery_item_fk", t.workspaceId, t.galleryItemId, galleryItems),
    sameWorkspace("calibration_set_items_photo_fk", t.workspaceId, t.photoId, photos),
    sameWorkspace("calibration_set_items_part_type_fk", t.workspaceId, t.partTypeId, partTypes),
  ],
);

/** A set given to one person with a due date; one attempt per assignment. */
export const calibrationAssignments = pgTable(
  "calibration_assignments",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    setId: uuid().notNull(),
    userId: uuid().notNull(),
    dueOn: date().notNull(),
    assignedBy: uuid().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique("calibration_assignments_set_user_key").on(t.setId, t.userId),
    index("calibration_assignments_user_idx").on(t.workspaceId, t.userId),
    unique("calibration_assignments_workspace_id_key").on(t.workspaceId, t.id),
    sameWorkspace("calibration_assignments_set_fk", t.workspaceId, t.setId, calibrationSets),
    sameWorkspace("calibration_assignments_user_fk", t.workspaceId, t.userId, users),
    sameWorkspace("calibration_assignments_assigned_by_fk", t.workspaceId, t.assignedBy, users),
  ],
);

/**
 * Someone taking an assigned set: the answers so far (by item position; saved one item at a time,
 * so an attempt can be left and resumed), then, once submitted, the stored score. Until
 * `submitted_at` nothing of the key is read out for the taker.
 */
export const calibrationAttempts = pgTable(
  "calibration_attempts",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    assignmentId: uuid().notNull(),
    setId: uuid().notNull(),
    userId: uuid().notNull(),
    status: text({ enum: ATTEMPT_STATUS_VALUES }).notNull().default("in_progress"),
    answers: jsonb()
      .$type<CalibrationAnswers>()
      .notNull()
      .default(sql`'{}'::jsonb`),
    startedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    submittedAt: timestamp({ withTimezone: true }),
    passed: boolean(),
    score: jsonb().$type<StoredAttemptScore>(),
  },
  (t) => [
    unique("calibration_attempts_assignment_key").on(t.assignmentId),
    index("calibration_attempts_set_idx").on(t.workspaceId, t.setId),
    unique("calibration_attempts_workspace_id_key").on(t.workspaceId, t.id),
    // Submitted exactly when it has a time, a verdict and a score.
    check(
      "calibration_attempts_submitted_fields",
      sql`(${t.status} = 'submitted') = (${t.submittedAt} IS NOT NULL) AND (${t.submittedAt} IS NULL) = (${t.score} IS NULL) AND (${t.score} IS NULL) = (${t.passed} IS NULL)`,
    ),
    sameWorkspace("calibration_attempts_assignment_fk", t.workspaceId, t.assignmentId, calibrationAssignments),
    sameWorkspace("calibration_attempts_set_fk", t.workspaceId, t.setId, calibrationSets),
    sameWorkspace("calibration_attempts_user_fk", t.workspaceId, t.userId, users),
  ],
);

export type CalibrationSetRow = typeof calibrationSets.$inferSelect;
export type CalibrationSetItemRow = typeof calibrationSetItems.$inferSelect;
export type CalibrationAttemptRow = typeof calibrationAttempts.$inferSelect;
