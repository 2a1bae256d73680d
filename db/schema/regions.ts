import { sql } from "drizzle-orm";
import { check, foreignKey, index, integer, jsonb, pgTable, text, timestamp, unique, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import type { RulerMark } from "@/lib/geometry/ruler";
import type { Shape } from "@/lib/geometry/shape";
import { users, workspaces } from "./core";
import { photos } from "./photos";
import { sameWorkspace } from "./workspace-keys";

/**
 * The marked regions of one photo, saved as a whole by the Bench. `version` goes up by one on
 * every save, and each region row keeps the version that wrote it; a measurement stores the
 * versions it read, so a result computed from older regions is recognised as stale.
 */
export const regionSets = pgTable(
  "region_sets",
  {
    photoId: uuid().primaryKey(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    version: integer().notNull().default(0),
    updatedBy: uuid(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("region_sets_workspace_idx").on(t.workspaceId),
    check("region_sets_version_nonnegative", sql`${t.version} >= 0`),
    unique("region_sets_workspace_photo_key").on(t.workspaceId, t.photoId),
    sameWorkspace("region_sets_photo_fk", t.workspaceId, t.photoId, photos),
    sameWorkspace("region_sets_updated_by_fk", t.workspaceId, t.updatedBy, users),
  ],
);

export const REGION_ROLES = ["defect", "surface", "ruler"] as const;
export type RegionRole = (typeof REGION_ROLES)[number];

export const regions = pgTable(
  "regions",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    photoId: uuid().notNull(),
    /** The editor's own id of the region (lib/annotate), unique within the photo. */
    clientId: text().notNull(),
    role: text({ enum: REGION_ROLES }).notNull(),
    /** Defect regions only: a defect class key of the part type. */
    defectClass: text(),
    /** Pixel coordinates of the upright original (lib/geometry/shape.ts); null for a ruler. */
    shape: jsonb().$type<Shape>(),
    /** Ruler regions only. */
    ruler: jsonb().$type<RulerMark>(),
    authorId: uuid().notNull(),
    /** The region set version that last changed this region (unchanged regions keep theirs on a save). */
    versionWritten: integer().notNull(),
    /**
     * Drawing order within the photo's set (later on top), as the editor had it: rows of one save
     * share their created_at, so order needs its own column.
     */
    position: integer().notNull().default(0),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("regions_photo_client_key").on(t.photoId, t.clientId),
    index("regions_workspace_photo_idx").on(t.workspaceId, t.photoId, t.position),
    foreignKey({ name: "regions_region_set_fk", columns: [t.workspaceId, t.photoId], foreignColumns: [regionSets.workspaceId, regionSets.photoId] }),
    sameWorkspace("regions_author_fk", t.workspaceId, t.authorId, users),
    check(
      "regions_role_fields",
      sql`(${t.role} = 'defect' AND ${t.defectClass} IS NOT NULL AND ${t.shape} IS NOT NULL AND ${t.ruler} IS NULL)
       OR (${t.role} = 'surface' AND ${t.defectClass} IS NULL AND ${t.shape} IS NOT NULL AND ${t.ruler} IS NULL)
       OR (${t.role} = 'ruler' AND ${t.defectClass} IS NULL AND ${t.shape} IS NULL AND ${t.ruler} IS NOT NULL)`,
    ),
  ],
);

export type RegionSet = typeof regionSets.$inferSelect;
export type NewRegionSet = typeof regionSets.$inferInsert;
export type RegionRow = typeof regions.$inferSelect;
export type NewRegionRow = typeof regions.$inferInsert;
