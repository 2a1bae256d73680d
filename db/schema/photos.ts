import { sql } from "drizzle-orm";
import { type AnyPgColumn, check, index, integer, pgTable, text, timestamp, unique, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { users, workspaces } from "./core";
import { units } from "./lots";
import { sameWorkspace } from "./workspace-keys";

/**
 * queued → processing → ready, or → failed. There is no row before finalise: the browser uploads
 * to a staging key under a signed ticket, and the row appears only once the server has moved the
 * bytes to a key the browser never had a URL for (lib/photos/finalise.ts).
 */
export const PHOTO_STATUSES = ["queued", "processing", "ready", "failed"] as const;
export type PhotoStatus = (typeof PHOTO_STATUSES)[number];

/**
 * Why a photo failed: a rejection code of lib/imaging/normalize.ts (the file itself is refused;
 * its original is already deleted) or "processing_failed" (the original is kept and may be retried).
 */
export const PHOTO_FAILURE_CODES = ["unsupported_format", "too_large", "too_many_pixels", "corrupt", "empty", "processing_failed"] as const;
export type PhotoFailureCode = (typeof PHOTO_FAILURE_CODES)[number];

export const photos = pgTable(
  "photos",
  {
    /** Chosen by the server when it issues the upload ticket, so a retried finalise is idempotent. */
    id: uuid().primaryKey(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    /**
     * The unit it documents; null for a photo uploaded straight into the Gallery (its gallery item
     * names it, lib/gallery/uploads.ts). Unit features join through this column, so they never see
     * gallery uploads.
     */
    unitId: uuid(),
    /** A view key of the unit's (or the gallery item's) part type ("front", "screen-white", …). */
    viewKey: text().notNull(),
    status: text({ enum: PHOTO_STATUSES }).notNull().default("queued"),
    failureCode: text({ enum: PHOTO_FAILURE_CODES }),
    /** A sentence for the person who uploaded it ("This file is an SVG drawing …"). */
    failureReason: text(),
    /** Server-built object keys (lib/photos/object-keys.ts). Null original: a refused file, already deleted. */
    originalKey: text(),
    previewKey: text(),
    thumbnailKey: text(),
    /** MIME type from the file's own first bytes, never the browser's claim. */
    contentType: text().notNull(),
    /** The name on the inspector's device, for display only (never part of a key). */
    fileName: text().notNull(),
    bytes: integer().notNull(),
    /** SHA-256 (hex) of the original exactly as stored. */
    sha256: text().notNull(),
    format: text(),
    /** Upright size (after Exif orientation); regions use these coordinates. */
    width: integer(),
    height: integer(),
    /** Exif Orientation of the original (1–8), null when it carries none. */
    orientation: integer(),
    previewWidth: integer(),
    previewHeight: integer(),
    thumbnailWidth: integer(),
    thumbnailHeight: integer(),
    /** Exif DateTimeOriginal; captureTimeOffset null means the camera gave no time zone. */
    captureTime: timestamp({ withTimezone: true }),
    captureTimeOffset: text(),
    /** The same bytes were already uploaded for another unit of the workspace: a possible reused photo. */
    possibleReuseOfPhotoId: uuid().references((): AnyPgColumn => photos.id, { onDelete: "set null" }),
    /** Processing attempts so far, and the last transient error (shown while a retry is pending). */
    attempts: integer().notNull().default(0),
    lastError: text(),
    uploadedBy: uuid().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    processedAt: timestamp({ withTimezone: true }),
    /**
     * A wrong photo taken out of the unit's evidence while regions or a measurement referenced it
     * (lib/photos/removal.ts): the row and its objects stay, with who took it out, when and why;
     * the unit's photo lists and measurements leave it out. Null: part of the unit.
     */
    removedAt: timestamp({ withTimezone: true }),
    removedBy: uuid(),
    removalReason: text(),
  },
  (t) => [
    // The same bytes on the same unit are the same photo.
    uniqueIndex("photos_unit_sha256_key").on(t.unitId, t.sha256),
    index("photos_unit_idx").on(t.unitId, t.createdAt),
    index("photos_workspace_sha256_idx").on(t.workspaceId, t.sha256),
    index("photos_status_idx").on(t.status, t.updatedAt),
    check(
      "photos_ready_has_derivatives",
      sql`${t.status} <> 'ready' OR (${t.originalKey} IS NOT NULL AND ${t.previewKey} IS NOT NULL AND ${t.thumbnailKey} IS NOT NULL AND ${t.width} IS NOT NULL AND ${t.height} IS NOT NULL AND ${t.format} IS NOT NULL)`,
    ),
    // A row only ever lacks its original when that original was refused and removed.
    check("photos_original_present", sql`${t.originalKey} IS NOT NULL OR (${t.status} = 'failed' AND ${t.failureCode} <> 'processing_failed')`),
    check("photos_failed_has_reason", sql`(${t.status} = 'failed') = (${t.failureCode} IS NOT NULL AND ${t.failureReason} IS NOT NULL)`),
    check("photos_bytes_positive", sql`${t.bytes} > 0`),
    check("photos_removal_complete", sql`(${t.removedAt} IS NULL) = (${t.removedBy} IS NULL) AND (${t.removedAt} IS NULL) = (${t.removalReason} IS NULL)`),
    unique("photos_workspace_id_key").on(t.workspaceId, t.id),
    sameWorkspace("photos_unit_fk", t.workspaceId, t.unitId, units),
    sameWorkspace("photos_uploaded_by_fk", t.workspaceId, t.uploadedBy, users),
    sameWorkspace("photos_removed_by_fk", t.workspaceId, t.removedBy, users),
  ],
);

export type Photo = typeof photos.$inferSelect;
export type NewPhoto = typeof photos.$inferInsert;
