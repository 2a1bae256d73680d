import { sql } from "drizzle-orm";
import { boolean, check, date, index, integer, jsonb, pgTable, real, text, timestamp, unique, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { suppliers, users, workspaces } from "./core";
import type { ChecklistItem, DefectClassDefinition, ViewDefinition } from "@/lib/part-types/schemas";
import type { DefectSeverity } from "@/lib/part-types/severity";
import type { ChecklistValue } from "@/lib/units/schemas";
import { sameWorkspace } from "./workspace-keys";

/**
 * Shapes of the JSON columns. Where a request writes the column, its type is read from the zod
 * schema that validates the request (lib/part-types/schemas.ts, lib/units/schemas.ts), so the row
 * and the API speak one type. The plan, the decision counts and the draw are computed by the
 * server (lib/lots), never sent, so they are declared here.
 */
/** What a lot's sampling decided, stored with the lot so later table changes never rewrite it. */
export type StoredSamplingPlan = {
  standard: "ISO 2859-1 single sampling";
  lotSize: number;
  level: string;
  severity: "normal" | "tightened" | "reduced";
  /** Units to inspect (the largest sample among the classes; the lot size for 100 %). */
  sampleSize: number;
  hundredPercent: boolean;
  byDefectSeverity: Record<DefectSeverity, { aql: number | null; codeLetter: string; planLetter: string; sampleSize: number; accept: number; reject: number }>;
  switchingReason: string;
  /** The switching counters when the lot was created ("Normal: 1 of the last 3 lots not accepted …"). */
  switchingProgress?: string;
};

/** Per defect severity: what was found when the lead decided the lot (feeds the switching rules). */
export type LotDecisionCounts = Record<DefectSeverity, { found: number; inspected: number; sampleSize: number }>;

/** How the lot's sampled units were made: drawn from a serial list (reproducible) or numbered placeholders. */
export type SampleDraw =
  { source: "serials"; poolSize: number; poolSha256: string; seed: string; algorithm: string; drawnAt: string; drawnBy: string } | { source: "placeholders"; drawnAt: string; drawnBy: string };

export const partTypes = pgTable(
  "part_types",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    slug: text().notNull(),
    name: text().notNull(),
    /** e.g. "camera", "battery", "display": drives cautions and which tools make sense. */
    category: text().notNull(),
    modelFamily: text().notNull().default(""),
    views: jsonb().$type<ViewDefinition[]>().notNull(),
    defectClasses: jsonb().$type<DefectClassDefinition[]>().notNull(),
    checklist: jsonb().$type<ChecklistItem[]>().notNull(),
    /** Nominal outline in mm, the calibration fallback when a photo has no Ruler. */
    nominalSizeMm: jsonb().$type<{ width: number; height: number } | null>(),
    /** Display parts: the panel's pixel grid, for ISO 13406-2 scaling. */
    panelResolution: jsonb().$type<{ width: number; height: number } | null>(),
    /** High-value parts: every unit is inspected. */
    inspectAll: boolean().notNull().default(false),
    /** The cosmetic grade lots of this part type are bought at unless the supplier says otherwise. */
    promisedGrade: text({ enum: ["A", "B", "C"] })
      .notNull()
      .default("A"),
    active: boolean().notNull().default(true),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("part_types_workspace_slug_key").on(t.workspaceId, t.slug),
    uniqueIndex("part_types_workspace_name_key").on(t.workspaceId, sql`lower(${t.name})`),
    unique("part_types_workspace_id_key").on(t.workspaceId, t.id),
  ],
);

export const lots = pgTable(
  "lots",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    supplierId: uuid().notNull(),
    partTypeId: uuid().notNull(),
    purchaseRef: text().notNull(),
    modelFamily: text().notNull().default(""),
    quantity: integer().notNull(),
    receivedOn: date({ mode: "string" }).notNull(),
    dueOn: date({ mode: "string" }).notNull(),
    inspectionLevel: text().notNull(),
    /** AQL per defect severity; null for critical means "any critical defect rejects". */
    aqlCritical: real(),
    aqlMajor: real().notNull(),
    aqlMinor: real().notNull(),
    inspectionSeverity: text({ enum: ["normal", "tightened", "reduced"] }).notNull(),
    /**
     * The cosmetic grade the purchase promised: a unit graded worse is a cosmetic nonconformity.
     * Receiving a lot always sets it (lib/lots/lots.ts); the default only serves direct inserts.
     */
    promisedGrade: text({ enum: ["A", "B", "C"] })
      .notNull()
      .default("A"),
    plan: jsonb().$type<StoredSamplingPlan>().notNull(),
    /** Seed of the random draw of sampled serials, so the draw can be reproduced. */
    sampleSeed: text(),
    /** Where the units came from (set once, when they are created). */
    sampleDraw: jsonb().$type<SampleDraw>(),
    status: text({ enum: ["open", "decided"] })
      .notNull()
      .default("open"),
    verdict: text({ enum: ["accept", "reject"] }),
    disposition: text({ enum: ["to_stock", "downgrade", "sort", "return_to_vendor"] }),
    dispositionReason: text(),
    decisionCounts: jsonb().$type<LotDecisionCounts>(),
    decidedBy: uuid(),
    decidedAt: timestamp({ withTimezone: true }),
    createdBy: uuid().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("lots_workspace_idx").on(t.workspaceId, t.createdAt),
    index("lots_history_idx").on(t.workspaceId, t.supplierId, t.partTypeId, t.createdAt),
    check("lots_quantity_positive", sql`${t.quantity} > 0`),
    unique("lots_workspace_id_key").on(t.workspaceId, t.id),
    sameWorkspace("lots_supplier_fk", t.workspaceId, t.supplierId, suppliers),
    sameWorkspace("lots_part_type_fk", t.workspaceId, t.partTypeId, partTypes),
    sameWorkspace("lots_decided_by_fk", t.workspaceId, t.decidedBy, users),
    sameWorkspace("lots_created_by_fk", t.workspaceId, t.createdBy, users),
  ],
);

export const UNIT_STATUSES = ["queued", "on_bench", "graded", "in_recheck", "final", "not_graded"] as const;
export type UnitStatus = (typeof UNIT_STATUSES)[number];

export const units = pgTable(
  "units",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    lotId: uuid().notNull(),
    /** 1-based order within the lot's sample. */
    sampleIndex: integer().notNull(),
    /** Null for a numbered placeholder until the inspector scans or types the serial. */
    serial: text(),
    /** True when the unit began as a numbered placeholder (its serial stays editable on the bench). */
    placeholder: boolean().notNull().default(false),
    status: text({ enum: UNIT_STATUSES }).notNull().default("queued"),
    // Copied from the lot so the queue can be ordered and filtered from one index (keyset pages).
    partTypeId: uuid().notNull(),
    supplierId: uuid().notNull(),
    lotDueOn: date({ mode: "string" }).notNull(),
    lotReceivedOn: date({ mode: "string" }).notNull(),
    lotCreatedAt: timestamp({ withTimezone: true }).notNull(),
    /** Who has the unit on the bench, until when (an expired lease counts as free). */
    leaseHolderId: uuid(),
    leaseExpiresAt: timestamp({ withTimezone: true }),
    claimedAt: timestamp({ withTimezone: true }),
    gradedAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("units_lot_sample_key").on(t.lotId, t.sampleIndex),
    uniqueIndex("units_lot_serial_key")
      .on(t.lotId, t.serial)
      .where(sql`${t.serial} IS NOT NULL`),
    index("units_queue_idx").on(t.workspaceId, t.status, t.lotDueOn, t.lotReceivedOn, t.lotCreatedAt, t.lotId, t.sampleIndex, t.id),
    index("units_lot_idx").on(t.lotId, t.sampleIndex),
    // The queue list walks waiting and on-bench units in Take next order (keyset pages).
    index("units_open_queue_idx")
      .on(t.workspaceId, t.lotDueOn, t.lotReceivedOn, t.lotCreatedAt, t.lotId, t.sampleIndex, t.id)
      .where(sql`${t.status} IN ('queued', 'on_bench')`),
    // Take next with a filter ("next battery", one lot, one supplier) walks only matching rows, in order.
    index("units_queued_by_lot_idx")
      .on(t.workspaceId, t.lotId, t.lotDueOn, t.lotReceivedOn, t.lotCreatedAt, t.sampleIndex, t.id)
      .where(sql`${t.status} = 'queued'`),
    // Part type and supplier: the queue list's filtered pages walk these too, so they hold the
    // units on a bench as well (take next skips those few). The keyset row comparison is an index
    // condition here, as on units_open_queue_idx. For a lot the list keeps units_open_queue_idx:
    // it carries lot_id, and in units_queued_by_lot_idx lot_id would break the keyset's column order.
    index("units_open_by_part_type_idx")
      .on(t.workspaceId, t.partTypeId, t.lotDueOn, t.lotReceivedOn, t.lotCreatedAt, t.lotId, t.sampleIndex, t.id)
      .where(sql`${t.status} IN ('queued', 'on_bench')`),
    index("units_open_by_supplier_idx")
      .on(t.workspaceId, t.supplierId, t.lotDueOn, t.lotReceivedOn, t.lotCreatedAt, t.lotId, t.sampleIndex, t.id)
      .where(sql`${t.status} IN ('queued', 'on_bench')`),
    // Take next finds expired leases without walking every running one.
    index("units_lease_expiry_idx")
      .on(t.workspaceId, t.leaseExpiresAt)
      .where(sql`${t.status} = 'on_bench'`),
    // The queue's "graded today" and 30-day median read recent grades only, not the whole history.
    index("units_graded_idx")
      .on(t.workspaceId, t.gradedAt)
      .where(sql`${t.gradedAt} IS NOT NULL`),
    unique("units_workspace_id_key").on(t.workspaceId, t.id),
    sameWorkspace("units_lot_fk", t.workspaceId, t.lotId, lots),
    sameWorkspace("units_part_type_fk", t.workspaceId, t.partTypeId, partTypes),
    sameWorkspace("units_supplier_fk", t.workspaceId, t.supplierId, suppliers),
    sameWorkspace("units_lease_holder_fk", t.workspaceId, t.leaseHolderId, users),
  ],
);

/**
 * The lead's say on the switching rules for one supplier + part type: whether reduced inspection
 * may be used, whether production counts as steady, and corrective actions that resume a
 * discontinued inspection (after the listed lots).
 */
export const inspectionSchemes = pgTable(
  "inspection_schemes",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    supplierId: uuid().notNull(),
    partTypeId: uuid().notNull(),
    reducedAllowed: boolean().notNull().default(false),
    steadyProduction: boolean().notNull().default(true),
    resumedAfterLotIds: jsonb().$type<string[]>().notNull().default([]),
    updatedBy: uuid().notNull(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("inspection_schemes_key").on(t.workspaceId, t.supplierId, t.partTypeId),
    sameWorkspace("inspection_schemes_supplier_fk", t.workspaceId, t.supplierId, suppliers),
    sameWorkspace("inspection_schemes_part_type_fk", t.workspaceId, t.partTypeId, partTypes),
    sameWorkspace("inspection_schemes_updated_by_fk", t.workspaceId, t.updatedBy, users),
  ],
);

/** The latest result of each checklist item on a unit (history is in the activity log). */
export const checklistResults = pgTable(
  "checklist_results",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    unitId: uuid().notNull(),
    itemId: text().notNull(),
    /** { pass: boolean } | { reading: number } | { choice: string } */
    value: jsonb().$type<ChecklistValue>().notNull(),
    passed: boolean().notNull(),
    /** Why it failed, in words ("3.12 V is below the minimum 3.40 V"). */
    failureReason: text(),
    severityOnFail: text().$type<DefectSeverity>().notNull(),
    note: text().notNull().default(""),
    recordedBy: uuid().notNull(),
    recordedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("checklist_results_unit_item_key").on(t.unitId, t.itemId),
    sameWorkspace("checklist_results_unit_fk", t.workspaceId, t.unitId, units),
    sameWorkspace("checklist_results_recorded_by_fk", t.workspaceId, t.recordedBy, users),
  ],
);

export type PartType = typeof partTypes.$inferSelect;
export type NewPartType = typeof partTypes.$inferInsert;
export type Lot = typeof lots.$inferSelect;
export type NewLot = typeof lots.$inferInsert;
export type Unit = typeof units.$inferSelect;
export type NewUnit = typeof units.$inferInsert;
export type ChecklistResult = typeof checklistResults.$inferSelect;
export type InspectionScheme = typeof inspectionSchemes.$inferSelect;
