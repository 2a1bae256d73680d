import { sql } from "drizzle-orm";
import { check, index, integer, jsonb, pgTable, text, timestamp, unique, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import type { ClaimStatus } from "@/lib/evidence/claim-status";
import { outgoingEmails, suppliers, users, workspaces } from "./core";
import { lots } from "./lots";
import { sameWorkspace } from "./workspace-keys";

export const EVIDENCE_DELIVERIES = ["attached", "link"] as const;
// The values as lib/evidence/claim-status.ts lists them (type-checked to stay the same set).
const CLAIM_STATUS_VALUES = ["open", "credited", "replaced", "refused", "closed"] as const satisfies readonly ClaimStatus[];

/** One attachment as sent (or offered behind the evidence link): name, type and size. */
export type EvidenceAttachment = { filename: string; contentType: string; bytes: number };

/**
 * Evidence packs sent to a supplier about a decided lot (issue 17): the e-mail as the lead
 * approved it, what it carried, and how (attached, or an expiring evidence link when the
 * attachments pass the size limit). The e-mail's delivery state is its outgoing_emails row.
 */
export const evidencePacks = pgTable(
  "evidence_packs",
  {
    id: uuid().primaryKey(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    lotId: uuid().notNull(),
    supplierId: uuid().notNull(),
    emailId: uuid()
      .notNull()
      .references(() => outgoingEmails.id),
    toAddress: text().notNull(),
    subject: text().notNull(),
    body: text().notNull(),
    attachments: jsonb().$type<EvidenceAttachment[]>().notNull(),
    delivery: text({ enum: EVIDENCE_DELIVERIES }).notNull(),
    /** The evidence link's expiry (delivery "link"); null when the files were attached. */
    linkExpiresAt: timestamp({ withTimezone: true }),
    revokedAt: timestamp({ withTimezone: true }),
    revokedBy: uuid(),
    createdBy: uuid().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique("evidence_packs_workspace_id_key").on(t.workspaceId, t.id),
    index("evidence_packs_lot_idx").on(t.workspaceId, t.lotId, t.createdAt),
    check("evidence_packs_link_expiry", sql`(${t.delivery} = 'link') = (${t.linkExpiresAt} IS NOT NULL)`),
    check("evidence_packs_revocation_complete", sql`(${t.revokedAt} IS NULL) = (${t.revokedBy} IS NULL)`),
    sameWorkspace("evidence_packs_lot_fk", t.workspaceId, t.lotId, lots),
    sameWorkspace("evidence_packs_supplier_fk", t.workspaceId, t.supplierId, suppliers),
    sameWorkspace("evidence_packs_created_by_fk", t.workspaceId, t.createdBy, users),
    sameWorkspace("evidence_packs_revoked_by_fk", t.workspaceId, t.revokedBy, users),
  ],
);

/** The claim each evidence pack opens with the supplier; the lead moves its status with a note. */
export const claims = pgTable(
  "claims",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    evidencePackId: uuid().notNull(),
    supplierId: uuid().notNull(),
    lotId: uuid().notNull(),
    /** The claim / RMA reference the supplier quotes: typed by the lead or numbered by the app. */
    reference: text().notNull(),
    status: text({ enum: CLAIM_STATUS_VALUES }).notNull().default("open"),
    note: text().notNull().default(""),
    /** Bumped by every status change (a stale form's update is refused). */
    version: integer().notNull().default(1),
    updatedBy: uuid().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("claims_evidence_pack_key").on(t.evidencePackId),
    uniqueIndex("claims_workspace_reference_key").on(t.workspaceId, sql`lower(${t.reference})`),
    index("claims_supplier_idx").on(t.workspaceId, t.supplierId, t.createdAt),
    sameWorkspace("claims_evidence_pack_fk", t.workspaceId, t.evidencePackId, evidencePacks),
    sameWorkspace("claims_supplier_fk", t.workspaceId, t.supplierId, suppliers),
    sameWorkspace("claims_lot_fk", t.workspaceId, t.lotId, lots),
    sameWorkspace("claims_updated_by_fk", t.workspaceId, t.updatedBy, users),
  ],
);

export type EvidencePack = typeof evidencePacks.$inferSelect;
export type NewEvidencePack = typeof evidencePacks.$inferInsert;
export type Claim = typeof claims.$inferSelect;
