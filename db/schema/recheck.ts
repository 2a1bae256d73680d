import { sql } from "drizzle-orm";
import { boolean, check, date, doublePrecision, foreignKey, index, integer, jsonb, pgTable, primaryKey, text, timestamp, unique, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { Grade } from "@/lib/grading/rubric-schema";
import type { StoredUnitResult } from "@/lib/grading/stored-measurement";
import type { AdjudicationReason } from "@/lib/recheck/adjudication";
import type { RecheckComparison } from "@/lib/recheck/compare";
import type { DrawCandidate, GraderDraw } from "@/lib/recheck/draw";
import { users, workspaces } from "./core";
import { grades, rubricVersions } from "./grading";
import { partTypes, units } from "./lots";
import { photos } from "./photos";
import { sameWorkspace } from "./workspace-keys";

/**
 * Why a grader's rate was raised: their drift over `weeks` (reasons "below_threshold" /
 * "below_team") and/or their last submitted calibration attempt failing (reason
 * "calibration_failed", with that attempt). Records made before calibration counted lack
 * `lastCalibration`.
 */
export type RaisedRateReason = {
  drifting: boolean;
  reasons: string[];
  agreement: number | null;
  n: number;
  weeks: string[];
  lastCalibration?: { attemptId: string; setId: string; submittedAt: string; passed: boolean };
};

/** What a recorded draw ran on: everything drawRechecks needs to give the same answer again. */
export type RecheckDrawInputRecord = {
  period: string;
  candidates: DrawCandidate[];
  alreadyDrawn: string[];
  rate: number;
  graderRates: Record<string, number>;
  minimumPerGrader: number;
  final: boolean;
  auditorIds: string[];
  /** Why a grader's rate in `graderRates` is raised (lib/recheck/raised-rate.ts); older records lack it. */
  raisedFor?: Record<string, RaisedRateReason>;
};
export type RecheckDrawOutcome = { drawn: string[]; graders: GraderDraw[]; noOtherAuditor: string[] };

/**
 * One run of the recheck draw (lib/recheck/draw.ts), recorded like a lot's sample draw: the seed,
 * the algorithm and its whole input, so anyone can run it again and get the same grades. Only
 * runs that drew something are kept (a run that adds nothing changes nothing to check).
 */
export const recheckDraws = pgTable(
  "recheck_draws",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    /** What started it: an inspection grade being recorded (its id), or a scheduled run. */
    trigger: text({ enum: ["grade_recorded", "scheduled"] }).notNull(),
    triggerGradeId: uuid(),
    seed: text().notNull(),
    algorithm: text().notNull(),
    input: jsonb().$type<RecheckDrawInputRecord>().notNull(),
    outcome: jsonb().$type<RecheckDrawOutcome>().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("recheck_draws_workspace_idx").on(t.workspaceId, t.createdAt), unique("recheck_draws_workspace_id_key").on(t.workspaceId, t.id)],
);

export const RECHECK_REASONS = ["rate", "raised_rate", "by_hand"] as const;
export type RecheckReason = (typeof RECHECK_REASONS)[number];
/**
 * waiting: in the recheck queue (an auditor may hold its lease); adjudication: submitted, the two
 * sides disagree; agreed: submitted and nothing to settle; settled: adjudicated.
 */
export const RECHECK_STATUSES = ["waiting", "adjudication", "agreed", "settled"] as const;
export type RecheckStatus = (typeof RECHECK_STATUSES)[number];
export const ADJUDICATION_CHOICES = ["first", "recheck", "own"] as const;
export type AdjudicationChoice = (typeof ADJUDICATION_CHOICES)[number];

/**
 * A grade drawn (or sent by hand) for a blind second look. One per grade, ever (unique key):
 * the draw never picks a grade twice, and neither can a hand. The lease columns have the units'
 * names and meaning, and are written by the same lease statements (db/queries/leases.ts).
 * The recheck's own grade lives here, not in `grades`: it must not become the unit's current
 * grade; only an adjudication does (a grades row of kind "adjudication").
 */
export const rechecks = pgTable(
  "rechecks",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    unitId: uuid().notNull(),
    /** The grade rechecked (an inspection grade, or the unit's current grade when sent by hand). */
    gradeId: uuid().notNull(),
    /** Copied from the grade (grades are append-only, so the copies never go stale): the queue and the scorecards read one table. */
    firstGraderId: uuid().notNull(),
    firstGrade: text({ enum: ["A", "B", "C", "Reject"] })
      .$type<Grade>()
      .notNull(),
    firstGradedAt: timestamp({ withTimezone: true }).notNull(),
    partTypeId: uuid().notNull(),
    rubricVersionId: uuid().notNull(),
    reason: text({ enum: RECHECK_REASONS }).notNull(),
    drawId: uuid(),
    sentBy: uuid(),
    sentNote: text(),
    status: text({ enum: RECHECK_STATUSES }).notNull().default("waiting"),
    leaseHolderId: uuid(),
    leaseExpiresAt: timestamp({ withTimezone: true }),
    claimedAt: timestamp({ withTimezone: true }),
    // The auditor's submission.
    auditorId: uuid(),
    measurement: jsonb().$type<StoredUnitResult>(),
    proposedGrade: text({ enum: ["A", "B", "C", "Reject"] }).$type<Grade>(),
    recheckGrade: text({ enum: ["A", "B", "C", "Reject"] }).$type<Grade>(),
    overrideReason: text(),
    /** The auditor had opened the unit's inspection data before submitting: scorecards leave it out. */
    notBlind: boolean().notNull().default(false),
    comparison: jsonb().$type<RecheckComparison>(),
    adjudicationReasons: jsonb().$type<AdjudicationReason[]>(),
    submittedAt: timestamp({ withTimezone: true }),
    // The adjudication.
    adjudicatedBy: uuid(),
    adjudicationChoice: text({ enum: ADJUDICATION_CHOICES }),
    adjudicationReason: text(),
    adjudicationGradeId: uuid(),
    /** The adjudication grade's final grade, copied for the scorecards' multi-rater figures. */
    adjudicatedGrade: text({ enum: ["A", "B", "C", "Reject"] }).$type<Grade>(),
    adjudicatedAt: timestamp({ withTimezone: true }),
    /** A decided lot this outcome would have changed (the lead is told, nothing rewritten). */
    decidedLotAffected: boolean().notNull().default(false),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("rechecks_grade_key").on(t.gradeId),
    // Take next for rechecks walks the waiting ones oldest first.
    index("rechecks_waiting_idx")
      .on(t.workspaceId, t.createdAt, t.id)
      .where(sql`${t.status} = 'waiting'`),
    index("rechecks_unit_idx").on(t.workspaceId, t.unitId),
    index("rechecks_grader_idx").on(t.workspaceId, t.firstGraderId, t.createdAt),
    // The scorecards read a period's submitted rechecks by when the rechecked grade was recorded.
    index("rechecks_scorecard_idx")
      .on(t.workspaceId, t.firstGradedAt)
      .where(sql`${t.submittedAt} IS NOT NULL`),
    unique("rechecks_workspace_id_key").on(t.workspaceId, t.id),
    sameWorkspace("rechecks_unit_fk", t.workspaceId, t.unitId, units),
    sameWorkspace("rechecks_grade_fk", t.workspaceId, t.gradeId, grades),
    sameWorkspace("rechecks_first_grader_fk", t.workspaceId, t.firstGraderId, users),
    sameWorkspace("rechecks_part_type_fk", t.workspaceId, t.partTypeId, partTypes),
    sameWorkspace("rechecks_rubric_version_fk", t.workspaceId, t.rubricVersionId, rubricVersions),
    sameWorkspace("rechecks_draw_fk", t.workspaceId, t.drawId, recheckDraws),
    sameWorkspace("rechecks_sent_by_fk", t.workspaceId, t.sentBy, users),
    sameWorkspace("rechecks_lease_holder_fk", t.workspaceId, t.leaseHolderId, users),
    sameWorkspace("rechecks_auditor_fk", t.workspaceId, t.auditorId, users),
    sameWorkspace("rechecks_adjudicated_by_fk", t.workspaceId, t.adjudicatedBy, users),
    sameWorkspace("rechecks_adjudication_grade_fk", t.workspaceId, t.adjudicationGradeId, grades),
    check("rechecks_drawn_or_sent", sql`(${t.reason} = 'by_hand') = (${t.sentBy} IS NOT NULL) AND (${t.reason} = 'by_hand' OR ${t.drawId} IS NOT NULL)`),
    check(
      "rechecks_submission_fields",
      sql`(${t.status} = 'waiting') = (${t.submittedAt} IS NULL) AND (${t.submittedAt} IS NULL OR (${t.auditorId} IS NOT NULL AND ${t.recheckGrade} IS NOT NULL AND ${t.proposedGrade} IS NOT NULL AND ${t.comparison} IS NOT NULL))`,
    ),
    check("rechecks_override_reason", sql`${t.recheckGrade} IS NULL OR ${t.recheckGrade} = ${t.proposedGrade} OR length(btrim(coalesce(${t.overrideReason}, ''))) > 0`),
    check(
      "rechecks_adjudication_fields",
      sql`(${t.status} = 'settled') = (${t.adjudicatedAt} IS NOT NULL) AND (${t.adjudicatedAt} IS NULL OR (${t.adjudicatedBy} IS NOT NULL AND ${t.adjudicationGradeId} IS NOT NULL AND length(btrim(coalesce(${t.adjudicationReason}, ''))) > 0))`,
    ),
    check("rechecks_adjudicated_grade", sql`(${t.adjudicationGradeId} IS NULL) = (${t.adjudicatedGrade} IS NULL)`),
  ],
);

/**
 * Per submitted recheck and defect class, the unit-level figures of its stored comparison
 * (lib/recheck/compare.ts `classes`: IoU, Dice, the union's pixels) as plain columns, so the
 * scorecards' mean IoU per class sums columns instead of expanding every recheck's comparison
 * JSON (bench/scorecards-api.ts). Written by a trigger (migration recheck_class_scores) in the
 * transaction that stores the comparison, from that comparison, so the rows always equal
 * `jsonb_each(comparison->'classes')` of the recheck (tests/integration/recheck-scorecards.test.ts);
 * the grader, the time of the first grade and the blind mark are the recheck's, copied (a grade
 * never changes, and the blind mark is set with the comparison).
 */
export const recheckClassScores = pgTable(
  "recheck_class_scores",
  {
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    recheckId: uuid().notNull(),
    defect: text().notNull(),
    firstGraderId: uuid().notNull(),
    firstGradedAt: timestamp({ withTimezone: true }).notNull(),
    notBlind: boolean().notNull(),
    unionPx: doublePrecision().notNull(),
    iou: doublePrecision().notNull(),
    dice: doublePrecision().notNull(),
  },
  (t) => [
    primaryKey({ name: "recheck_class_scores_pkey", columns: [t.recheckId, t.defect] }),
    // The scorecards read a period's rows by when the rechecked grade was recorded (index-only: every column they read is here).
    index("recheck_class_scores_scorecard_idx").on(t.workspaceId, t.firstGradedAt, t.firstGraderId, t.defect, t.iou, t.unionPx, t.notBlind),
    foreignKey({ name: "recheck_class_scores_recheck_fk", columns: [t.workspaceId, t.recheckId], foreignColumns: [rechecks.workspaceId, rechecks.id] }).onDelete("cascade"),
    check("recheck_class_scores_iou", sql`${t.iou} >= 0 AND ${t.iou} <= 1 AND ${t.dice} >= 0 AND ${t.dice} <= 1 AND ${t.unionPx} >= 0`),
  ],
);

/**
 * The auditor's own regions on one photo of a rechecked unit: a separate set (the canvas payload,
 * as the Gallery keeps its copies), never mixed with the first grader's `regions`.
 */
export const recheckRegionSets = pgTable(
  "recheck_region_sets",
  {
    recheckId: uuid().notNull(),
    photoId: uuid().notNull(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    payload: jsonb().$type<RegionSetPayload>().notNull(),
    version: integer().notNull().default(1),
    updatedBy: uuid().notNull(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    primaryKey({ name: "recheck_region_sets_pkey", columns: [t.recheckId, t.photoId] }),
    foreignKey({ name: "recheck_region_sets_recheck_fk", columns: [t.workspaceId, t.recheckId], foreignColumns: [rechecks.workspaceId, rechecks.id] }),
    sameWorkspace("recheck_region_sets_photo_fk", t.workspaceId, t.photoId, photos),
    sameWorkspace("recheck_region_sets_updated_by_fk", t.workspaceId, t.updatedBy, users),
  ],
);

/**
 * Who opened a unit's inspection data (its Bench, regions, measurement or grades) and when. A
 * person who also holds the inspector or lead role may have seen the first grade that way: the
 * recheck queue never offers them such a unit, and a recheck they submit after opening it is
 * marked not blind.
 */
export const unitOpenings = pgTable(
  "unit_openings",
  {
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    unitId: uuid().notNull(),
    userId: uuid().notNull(),
    firstOpenedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    lastOpenedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    primaryKey({ name: "unit_openings_pkey", columns: [t.unitId, t.userId] }),
    sameWorkspace("unit_openings_unit_fk", t.workspaceId, t.unitId, units),
    sameWorkspace("unit_openings_user_fk", t.workspaceId, t.userId, users),
  ],
);

/**
 * Inspection grades per grader and local day (the workspace's time zone): what the scorecards'
 * "graded" column reads instead of counting every grade of the period. Kept by triggers
 * (migration scorecard_reads): each inspection grade inserted adds one in the same transaction, and a change
 * of the workspace's time zone recounts that workspace's days, so the table always equals
 * `SELECT graded_by, local day, count(*) FROM grades WHERE kind = 'inspection' GROUP BY 1, 2`
 * (tests/integration/recheck-scorecards.test.ts checks it against that count).
 */
export const graderDayCounts = pgTable(
  "grader_day_counts",
  {
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    graderId: uuid().notNull(),
    day: date({ mode: "string" }).notNull(),
    graded: integer().notNull(),
  },
  (t) => [
    primaryKey({ name: "grader_day_counts_pkey", columns: [t.workspaceId, t.day, t.graderId] }),
    sameWorkspace("grader_day_counts_grader_fk", t.workspaceId, t.graderId, users),
    check("grader_day_counts_graded", sql`${t.graded} > 0`),
  ],
);

export type RecheckRow = typeof rechecks.$inferSelect;
export type NewRecheckRow = typeof rechecks.$inferInsert;
