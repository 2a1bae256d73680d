import { sql } from "drizzle-orm";
import { check, index, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import type { certificateContent } from "@/lib/reports/certificate-content";
import { users, workspaces } from "./core";
import { grades } from "./grading";
import { units } from "./lots";
import { sameWorkspace } from "./workspace-keys";

/** What a certificate states, exactly as hashed (lib/reports/certificate-content.ts). */
export type StoredCertificateContent = ReturnType<typeof certificateContent>;

/**
 * Condition certificates of graded units (issue 17). A row keeps the facts the certificate states
 * and their hash as issued, so the verification page shows what the buyer holds even after the
 * unit is graded again; only revocation changes a row.
 */
export const certificates = pgTable(
  "certificates",
  {
    id: uuid().primaryKey(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    unitId: uuid().notNull(),
    /** The grade row the certificate states (the unit's current grade when issued). */
    gradeId: uuid()
      .notNull()
      .references(() => grades.id),
    /** Typed on the public verification page: unique across workspaces. */
    shortCode: text().notNull(),
    content: jsonb().$type<StoredCertificateContent>().notNull(),
    contentHash: text().notNull(),
    /** Until when the QR link verifies (the signed token's expiry). */
    linkExpiresAt: timestamp({ withTimezone: true }).notNull(),
    issuedBy: uuid().notNull(),
    issuedAt: timestamp({ withTimezone: true }).notNull(),
    revokedAt: timestamp({ withTimezone: true }),
    revokedBy: uuid(),
    revokeReason: text(),
  },
  (t) => [
    uniqueIndex("certificates_short_code_key").on(t.shortCode),
    index("certificates_unit_idx").on(t.workspaceId, t.unitId, t.issuedAt),
    check("certificates_revocation_complete", sql`(${t.revokedAt} IS NULL) = (${t.revokedBy} IS NULL) AND (${t.revokedAt} IS NULL) = (${t.revokeReason} IS NULL)`),
    sameWorkspace("certificates_unit_fk", t.workspaceId, t.unitId, units),
    sameWorkspace("certificates_issued_by_fk", t.workspaceId, t.issuedBy, users),
    sameWorkspace("certificates_revoked_by_fk", t.workspaceId, t.revokedBy, users),
  ],
);

export type Certificate = typeof certificates.$inferSelect;
export type NewCertificate = typeof certificates.$inferInsert;
