import { sql } from "drizzle-orm";
import { boolean, check, index, integer, jsonb, pgTable, real, text, timestamp, unique, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import type { Shape } from "@/lib/geometry/shape";
import type { ClassDecision, Evaluation } from "@/lib/imaging/learned-eval";
import type { RegionModel } from "@/lib/imaging/learned";
import type { SuggestionDecision } from "@/lib/suggestions/schemas";
import { users, workspaces } from "./core";
import { photos } from "./photos";
import { sameWorkspace } from "./workspace-keys";

/** What the model saw of one class: accepted regions and the photos they were on (training side only). */
export type ClassCounts = Record<string, { regions: number; photos: number }>;
/** Where the training examples came from, for the trainers' panel. */
export type TrainingSources = {
  unitPhotos: number;
  galleryPhotos: number;
  dismissalPhotos: number;
  testPhotos: number;
  acceptedRegions: number;
  /** Only the demo seed's model (db/seed/suggestion-model.ts): synthetic photos it rendered, none of the workspace's. */
  syntheticPhotos?: number;
};

/**
 * One trained region model of a workspace (lib/imaging/learned.ts), kept whether or not it was
 * switched in, so trainers see the history. `version` counts the workspace's trainings. At most
 * one model per workspace is in use (partial unique index); the training job switches it only
 * when the new one is not worse on the same held-out photos (lib/imaging/learned-eval.ts).
 */
export const suggestionModels = pgTable(
  "suggestion_models",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    version: integer().notNull(),
    /** The model as lib/imaging/learned.ts returns it (plain JSON, ~300 KiB for three classes). */
    model: jsonb().$type<RegionModel>().notNull(),
    classCounts: jsonb().$type<ClassCounts>().notNull(),
    sources: jsonb().$type<TrainingSources>().notNull(),
    /** Per-class recall and precision on the held-out photos at IoU >= 0.3. */
    evaluation: jsonb().$type<Evaluation>().notNull(),
    /** Which classes it may suggest, with the reason (SUGGESTION_RULE). */
    suggestable: jsonb().$type<ClassDecision[]>().notNull(),
    inUse: boolean().notNull().default(false),
    /** Why it was or was not switched in (compareModels' sentence). */
    decision: text().notNull(),
    trainingMs: integer().notNull(),
    /** The trainer who asked for it; null when it was started because enough new regions had been accepted. */
    requestedBy: uuid(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique("suggestion_models_workspace_id_key").on(t.workspaceId, t.id),
    unique("suggestion_models_workspace_version_key").on(t.workspaceId, t.version),
    uniqueIndex("suggestion_models_one_in_use_idx")
      .on(t.workspaceId)
      .where(sql`${t.inUse}`),
    check("suggestion_models_version_positive", sql`${t.version} >= 1`),
    sameWorkspace("suggestion_models_requested_by_fk", t.workspaceId, t.requestedBy, users),
  ],
);

// The list lives in lib/suggestions/schemas.ts; this only types the column.
const DECISION_VALUES = ["accepted", "dismissed"] as const satisfies readonly SuggestionDecision[];

/**
 * What an inspector did with one learned suggestion on a photo. Accepted ones also became ordinary
 * regions through the region save; dismissed ones are "no defect" examples for the next training.
 */
export const suggestionDecisions = pgTable(
  "suggestion_decisions",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    photoId: uuid().notNull(),
    modelId: uuid().notNull(),
    defectClass: text().notNull(),
    /** The suggested shape in the photo's upright original pixels. */
    shape: jsonb().$type<Shape>().notNull(),
    score: real().notNull(),
    decision: text({ enum: DECISION_VALUES }).notNull(),
    decidedBy: uuid().notNull(),
    decidedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("suggestion_decisions_photo_idx").on(t.workspaceId, t.photoId),
    index("suggestion_decisions_dismissed_idx")
      .on(t.workspaceId, t.decidedAt)
      .where(sql`${t.decision} = 'dismissed'`),
    check("suggestion_decisions_score_range", sql`${t.score} >= 0 AND ${t.score} <= 1`),
    // A photo that is deleted (never marked, so the deletion gate let it go) takes its decisions with it: nothing is left to learn from.
    sameWorkspace("suggestion_decisions_photo_fk", t.workspaceId, t.photoId, photos).onDelete("cascade"),
    sameWorkspace("suggestion_decisions_model_fk", t.workspaceId, t.modelId, suggestionModels),
    sameWorkspace("suggestion_decisions_decided_by_fk", t.workspaceId, t.decidedBy, users),
  ],
);

export type SuggestionModelRow = typeof suggestionModels.$inferSelect;
export type SuggestionDecisionRow = typeof suggestionDecisions.$inferSelect;
