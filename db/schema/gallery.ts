import { sql } from "drizzle-orm";
import { check, index, integer, jsonb, pgTable, text, timestamp, unique, uuid } from "drizzle-orm/pg-core";
import type { GalleryKind, GalleryStatus } from "@/lib/gallery/rules";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { Grade } from "@/lib/grading/rubric-schema";
import { users, workspaces } from "./core";
import { rubricVersions } from "./grading";
import { partTypes, units } from "./lots";
import { photos } from "./photos";
import { sameWorkspace } from "./workspace-keys";

// The lists live in lib/gallery/rules.ts (statuses and kinds, with what each allows); these only type the columns.
const STATUS_VALUES = ["draft", "published", "retired"] as const satisfies readonly GalleryStatus[];
const KIND_VALUES = ["normal", "abnormal"] as const satisfies readonly GalleryKind[];
const GRADE_VALUES = ["A", "B", "C", "Reject"] as const satisfies readonly Grade[];

/**
 * A reference example: one photo of one view of a part type, with its own copy of the regions
 * (editing them never touches the unit the photo came from), the grade it deserves and the rubric
 * version that grade was judged under, and the trainer's caption. The photo is either a graded
 * unit's (promoted; `sourceUnitId` says which) or one uploaded straight into the gallery (a photo
 * row without a unit). While an item names a photo, the deletion gate keeps its original
 * (lib/photos/deletion.ts); the foreign key keeps the row.
 */
export const galleryItems = pgTable(
  "gallery_items",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    partTypeId: uuid().notNull(),
    /** A view key of the part type (the photo's view). */
    viewKey: text().notNull(),
    status: text({ enum: STATUS_VALUES }).notNull().default("draft"),
    kind: text({ enum: KIND_VALUES }).notNull(),
    photoId: uuid().notNull(),
    /** The graded unit the photo was promoted from; null for a photo uploaded into the gallery. */
    sourceUnitId: uuid(),
    /** The item's own regions, in the photo's upright original pixels (the canvas's payload). */
    regions: jsonb().$type<RegionSetPayload>().notNull(),
    /** The defect classes its regions show, kept in step by every save (for the filters). */
    defectClasses: text()
      .array()
      .notNull()
      .default(sql`'{}'::text[]`),
    grade: text({ enum: GRADE_VALUES }).notNull(),
    /** The published rubric version the grade was judged under (null: none was published then). */
    rubricVersionId: uuid(),
    caption: text().notNull().default(""),
    /** Counts saves: an edit names the revision it started from, so nobody overwrites unseen changes (409). */
    revision: integer().notNull().default(0),
    createdBy: uuid().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedBy: uuid(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    publishedBy: uuid(),
    publishedAt: timestamp({ withTimezone: true }),
    retiredAt: timestamp({ withTimezone: true }),
  },
  (t) => [
    // The browsing list: newest first within a workspace, keyset on (created_at, id); filters are checked on the way.
    index("gallery_items_list_idx").on(t.workspaceId, t.createdAt.desc(), t.id.desc()),
    // The Bench's reference panel: published items of one part type and view.
    index("gallery_items_reference_idx")
      .on(t.workspaceId, t.partTypeId, t.viewKey)
      .where(sql`${t.status} = 'published'`),
    index("gallery_items_defect_classes_idx").using("gin", t.defectClasses),
    index("gallery_items_photo_idx").on(t.workspaceId, t.photoId),
    check("gallery_items_revision_nonnegative", sql`${t.revision} >= 0`),
    check("gallery_items_caption_length", sql`length(${t.caption}) <= 600`),
    // A draft was never published; a published item has been; a retired one may have been (a discarded draft).
    check("gallery_items_published_fields", sql`(${t.status} <> 'draft' OR ${t.publishedAt} IS NULL) AND (${t.status} <> 'published' OR ${t.publishedAt} IS NOT NULL)`),
    check("gallery_items_retired_fields", sql`(${t.status} = 'retired') = (${t.retiredAt} IS NOT NULL)`),
    unique("gallery_items_workspace_id_key").on(t.workspaceId, t.id),
    sameWorkspace("gallery_items_part_type_fk", t.workspaceId, t.partTypeId, partTypes),
    sameWorkspace("gallery_items_photo_fk", t.workspaceId, t.photoId, photos),
    sameWorkspace("gallery_items_source_unit_fk", t.workspaceId, t.sourceUnitId, units),
    sameWorkspace("gallery_items_rubric_version_fk", t.workspaceId, t.rubricVersionId, rubricVersions),
    sameWorkspace("gallery_items_created_by_fk", t.workspaceId, t.createdBy, users),
    sameWorkspace("gallery_items_updated_by_fk", t.workspaceId, t.updatedBy, users),
    sameWorkspace("gallery_items_published_by_fk", t.workspaceId, t.publishedBy, users),
  ],
);

export type GalleryItemRow = typeof galleryItems.$inferSelect;
export type NewGalleryItemRow = typeof galleryItems.$inferInsert;
