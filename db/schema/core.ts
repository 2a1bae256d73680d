import { sql } from "drizzle-orm";
import { bigserial, boolean, check, index, integer, jsonb, pgTable, primaryKey, text, timestamp, unique, uniqueIndex, uuid } from "drizzle-orm/pg-core";
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
    /** Stored lower-case; see users_email_key for when an address may appear twice. */
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
    // Sign-in is by e-mail alone, so only one account per address may have a password. An
    // invitation (no password yet) may name an address in use elsewhere: inviting answers the
    // same for every address, and such an invitation simply cannot be accepted (lib/people).
    uniqueIndex("users_email_key")
      .on(t.email)
      .where(sql`${t.passwordHash} IS NOT NULL`),
    uniqueIndex("users_workspace_email_key").on(t.workspaceId, t.email),
    // The target of the composite (workspace_id, id) foreign keys: a row can only name a user of its own workspace.
    unique("users_workspace_id_key").on(t.workspaceId, t.id),
    index("users_workspace_idx").on(t.workspaceId),
    check("users_email_lower", sql`${t.email} = lower(${t.email})`),
    check("users_roles_valid", sql`cardinality(${t.roles}) > 0 AND ${t.roles} <@ ARRAY['inspector','trainer','auditor','lead']::text[]`),
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
    // Only the newest link of a purpose works: issuing one voids the others (lib/auth/tokens.ts).
    uniqueIndex("auth_tokens_live_key")
      .on(t.userId, t.purpose)
      .where(sql`${t.usedAt} IS NULL`),
    sameWorkspace("auth_tokens_user_fk", t.workspaceId, t.userId, users),
  ],
);

/**
 * A company sign-up waiting for its e-mail address to be confirmed. Nothing else exists until the
 * link is used: then the workspace and its lead are created with the password chosen there. Only
 * a hash of the token is kept.
 */
export const signUpRequests = pgTable("sign_up_requests", {
  id: uuid().primaryKey().defaultRandom(),
  email: text().notNull(),
  companyName: text().notNull(),
  name: text().notNull(),
  /** The starter part types chosen on the form, created with the workspace (lib/part-types/starters.ts). */
  starterPartTypes: text()
    .array()
    .notNull()
    .default(sql`'{}'::text[]`),
  tokenHash: text().notNull().unique(),
  expiresAt: timestamp({ withTimezone: true }).notNull(),
  usedAt: timestamp({ withTimezone: true }),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

/** Sessions ended by signing out, until their cookie would have expired anyway (then pruned). */
export const revokedSessions = pgTable("revoked_sessions", {
  sessionId: uuid().primaryKey(),
  userId: uuid()
    .notNull()
    .references(() => users.id),
  expiresAt: timestamp({ withTimezone: true }).notNull(),
});

/**
 * The counters of the limits in lib/rate-limit (sign-in attempts, public account requests, upload
 * intents): one row per bucket and key, whose window starts with the first request it counts;
 * counted up by a single atomic upsert. Pruned by the worker once the window is long over.
 */
export const rateLimitCounters = pgTable(
  "rate_limit_counters",
  {
    bucket: text().notNull(),
    key: text().notNull(),
    windowStart: timestamp({ withTimezone: true }).notNull(),
    count: integer().notNull(),
  },
  (t) => [primaryKey({ columns: [t.bucket, t.key] }), index("rate_limit_counters_window_idx").on(t.windowStart)],
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
  (t) => [index("activity_log_workspace_idx").on(t.workspaceId, t.createdAt), sameWorkspace("activity_log_actor_fk", t.workspaceId, t.actorId, users)],
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
    /** Null for messages to people who have no workspace yet (sign-up confirmations). */
    workspaceId: uuid().references(() => workspaces.id),
    kind: text({ enum: ["invitation", "password_reset", "supplier_evidence", "sign_up"] }).notNull(),
    toAddress: text().notNull(),
    subject: text().notNull(),
    messageId: text(),
    /** queued: the mail server did not take it yet; the worker retries (lib/mail/send.ts). */
    status: text({ enum: ["sent", "queued", "failed"] }).notNull(),
    error: text(),
    attempts: integer().notNull().default(1),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
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
export type SignUpRequest = typeof signUpRequests.$inferSelect;
