import { sql } from "drizzle-orm";
import {
  bigserial,
  boolean,
  check,
  index,
  integer,
  jsonb,
  pgTable,
  text,
  timestamp,
  unique,
  uniqueIndex,
  uuid,
} from "drizzle-orm/pg-core";
import type { RecheckSettings } from "@/lib/recheck/settings";
import { sameWorkspace } from "./workspace-keys";

/** A company using Partproof. Every row of company data points at one. */
export const workspaces = pgTable("workspaces", {
  id: uuid().primaryKey().defaultRandom(),
  name: text().notNull(),
  slug: text().notNull().unique(),
  /** IANA time zone every time in the app is shown in (one rule for the whole workspace). */
  timeZone: text().notNull().default("UTC"),
  /** Recheck rate, adjudication threshold, drift flag (lib/recheck/settings.ts); null = the defaults. */
  recheckSettings: jsonb().$type<RecheckSettings>(),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

export const users = pgTable(
  "users",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    /** Stored lower-case; unique across workspaces because sign-in is by e-mail alone. */
    email: text().notNull(),
    name: text().notNull(),
    /** Null until an invited user sets a password. */
    passwordHash: text(),
    roles: text().array().notNull(),
    active: boolean().notNull().default(true),
    /** Bumped on deactivation and password change; sessions carrying an older value stop working. */
    tokenVersion: integer().notNull().default(0),
    lastSignInAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("users_email_key").on(t.email),
    // The target of the composite (workspace_id, id) foreign keys: a row can only name a user of its own workspace.
    unique("users_workspace_id_key").on(t.workspaceId, t.id),
    index("users_workspace_idx").on(t.workspaceId),
    check("users_email_lower", sql`${t.email} = lower(${t.email})`),
    check(
      "users_roles_valid",
      sql`cardinality(${t.roles}) > 0 AND ${t.roles} <@ ARRAY['inspector','trainer','auditor','lead']::text[]`,
    ),
  ],
);

/** One-time links for invitations and password resets; only a hash of the token is kept. */
export const authTokens = pgTable(
  "auth_tokens",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    userId: uuid().notNull(),
    purpose: text({ enum: ["invite", "reset"] }).notNull(),
    tokenHash: text().notNull().unique(),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    usedAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("auth_tokens_user_idx").on(t.userId),
    sameWorkspace("auth_tokens_user_fk", t.workspaceId, t.userId, users),
  ],
);

/** Failed sign-ins, read by the rate limit (per account and per client address). */
export const signInFailures = pgTable(
  "sign_in_failures",
  {
    id: bigserial({ mode: "number" }).primaryKey(),
    email: text().notNull(),
    ip: text().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("sign_in_failures_email_idx").on(t.email, t.createdAt), index("sign_in_failures_ip_idx").on(t.ip, t.createdAt)],
);

/** Append-only record of who did what; a trigger (migration 0001) refuses UPDATE and DELETE. */
export const activityLog = pgTable(
  "activity_log",
  {
    id: bigserial({ mode: "number" }).primaryKey(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    actorId: uuid(),
    action: text().notNull(),
    subjectType: text().notNull(),
    subjectId: text(),
    detail: jsonb().$type<Record<string, unknown>>().notNull().default({}),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("activity_log_workspace_idx").on(t.workspaceId, t.createdAt),
    sameWorkspace("activity_log_actor_fk", t.workspaceId, t.actorId, users),
  ],
);

export const suppliers = pgTable(
  "suppliers",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    name: text().notNull(),
    contactName: text(),
    contactEmail: text().notNull(),
    notes: text().notNull().default(""),
    /** The cosmetic grade this supplier's lots are bought at by default (null: the part type's). */
    promisedGrade: text({ enum: ["A", "B", "C"] }),
    active: boolean().notNull().default(true),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("suppliers_workspace_name_key").on(t.workspaceId, sql`lower(${t.name})`), unique("suppliers_workspace_id_key").on(t.workspaceId, t.id)],
);

/** Every e-mail the app sends (invitations, resets, supplier evidence), per workspace. */
export const outgoingEmails = pgTable(
  "outgoing_emails",
  {
    id: uuid().primaryKey().defaultRandom(),
    workspaceId: uuid()
      .notNull()
      .references(() => workspaces.id),
    kind: text({ enum: ["invitation", "password_reset", "supplier_evidence"] }).notNull(),
    toAddress: text().notNull(),
    subject: text().notNull(),
    messageId: text(),
    status: text({ enum: ["sent", "failed"] }).notNull(),
    error: text(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("outgoing_emails_workspace_idx").on(t.workspaceId, t.createdAt)],
);

export type Workspace = typeof workspaces.$inferSelect;
export type NewWorkspace = typeof workspaces.$inferInsert;
export type User = typeof users.$inferSelect;
export type NewUser = typeof users.$inferInsert;
export type AuthToken = typeof authTokens.$inferSelect;
export type ActivityEntry = typeof activityLog.$inferSelect;
export type Supplier = typeof suppliers.$inferSelect;
export type NewSupplier = typeof suppliers.$inferInsert;
export type OutgoingEmail = typeof outgoingEmails.$inferSelect;
