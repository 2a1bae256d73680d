import "server-only";
import { and, asc, eq, lt, sql, type Placeholder } from "drizzle-orm";
import { db, preparedStatementsAllowed, type DbOrTx } from "@/db/client";
import { outgoingEmails, revokedSessions, users, workspaces, type NewUser, type User } from "@/db/schema";
import type { Role } from "@/lib/auth/roles";

/** The columns safe to send to a browser (never the password hash). */
export const publicUserColumns = {
  id: users.id,
  workspaceId: users.workspaceId,
  email: users.email,
  name: users.name,
  roles: users.roles,
  active: users.active,
  hasPassword: sql<boolean>`${users.passwordHash} IS NOT NULL`.as("has_password"),
  lastSignInAt: users.lastSignInAt,
  createdAt: users.createdAt,
  /** The newest invitation e-mail's delivery, for people who have not set a password yet. */
  invitationEmail: sql<"sent" | "queued" | "failed" | null>`(CASE WHEN ${users.passwordHash} IS NULL THEN (
    SELECT ${outgoingEmails.status} FROM ${outgoingEmails}
    WHERE ${outgoingEmails.workspaceId} = ${users.workspaceId} AND ${outgoingEmails.kind} = 'invitation' AND ${outgoingEmails.toAddress} = ${users.email}
    ORDER BY ${outgoingEmails.createdAt} DESC LIMIT 1) END)`.as("invitation_email"),
};
export type PublicUser = Omit<User, "passwordHash" | "tokenVersion" | "updatedAt" | "roles"> & { roles: Role[]; hasPassword: boolean; invitationEmail: "sent" | "queued" | "failed" | null };

/**
 * The account an e-mail address signs in to: the one with a password (there is at most one,
 * users_email_key), else the oldest invitation that names the address.
 */
export async function getUserByEmail({ email }: { email: string }): Promise<User | undefined> {
  const [row] = await db()
    .select()
    .from(users)
    .where(eq(users.email, email.toLowerCase()))
    .orderBy(sql`${users.passwordHash} IS NULL`, asc(users.createdAt))
    .limit(1);
  return row;
}

/** Whether the address already belongs to a member of the workspace (invited or not). */
export async function emailInWorkspace({ workspaceId, email }: { workspaceId: string; email: string }): Promise<boolean> {
  const [row] = await db()
    .select({ id: users.id })
    .from(users)
    .where(and(eq(users.workspaceId, workspaceId), eq(users.email, email.toLowerCase())))
    .limit(1);
  return Boolean(row);
}

/** Scoped by workspace: a user id from another workspace is "not found". */
export async function getUserInWorkspace({ workspaceId, userId }: { workspaceId: string; userId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(users)
    .where(and(eq(users.workspaceId, workspaceId), eq(users.id, userId)))
    .limit(1);
  return row;
}

/**
 * The session user's query, prepared once per database handle: every signed-in request runs it
 * (see lib/auth/require-user.ts), so it skips parsing and planning after a connection's first run.
 */
const sessionUserQueries = new WeakMap<object, ReturnType<typeof prepareSessionUserQuery>>();

function sessionUserSelect(database: ReturnType<typeof db>, sessionId: Placeholder<"sessionId"> | string) {
  return database
    .select({
      id: users.id,
      workspaceId: users.workspaceId,
      workspaceName: workspaces.name,
      timeZone: workspaces.timeZone,
      email: users.email,
      name: users.name,
      roles: users.roles,
      active: users.active,
      tokenVersion: users.tokenVersion,
      sessionRevoked: sql<boolean>`EXISTS (SELECT 1 FROM ${revokedSessions} WHERE ${revokedSessions.sessionId} = ${sessionId})`,
    })
    .from(users)
    .innerJoin(workspaces, eq(workspaces.id, users.workspaceId));
}

function prepareSessionUserQuery(database: ReturnType<typeof db>) {
  return sessionUserSelect(database, sql.placeholder("sessionId"))
    .where(eq(users.id, sql.placeholder("userId")))
    .limit(1)
    .prepare("session_user");
}

/** What a request needs to know about its session's user (and whether it was signed out), in one query. */
export async function getSessionUser({ userId, sessionId }: { userId: string; sessionId: string | null }) {
  const database = db();
  // Sessions issued before session ids existed have none; a nil UUID matches no revoked row.
  const sid = sessionId ?? NO_SESSION_ID;
  if (!preparedStatementsAllowed()) return (await sessionUserSelect(database, sid).where(eq(users.id, userId)).limit(1))[0];
  let query = sessionUserQueries.get(database);
  if (!query) sessionUserQueries.set(database, (query = prepareSessionUserQuery(database)));
  const [row] = await query.execute({ userId, sessionId: sid });
  return row;
}

const NO_SESSION_ID = "00000000-0000-0000-0000-000000000000";

export function listPeople({ workspaceId }: { workspaceId: string }) {
  return db().select(publicUserColumns).from(users).where(eq(users.workspaceId, workspaceId)).orderBy(asc(users.name)) as unknown as Promise<PublicUser[]>;
}

export async function getPerson({ workspaceId, userId }: { workspaceId: string; userId: string }): Promise<PublicUser | undefined> {
  const [row] = await db()
    .select(publicUserColumns)
    .from(users)
    .where(and(eq(users.workspaceId, workspaceId), eq(users.id, userId)))
    .limit(1);
  return row as PublicUser | undefined;
}

export async function countActiveLeads({ workspaceId }: { workspaceId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ n: sql<number>`count(*)::int` })
    .from(users)
    .where(and(eq(users.workspaceId, workspaceId), eq(users.active, true), sql`'lead' = ANY(${users.roles})`, sql`${users.passwordHash} IS NOT NULL`));
  return row?.n ?? 0;
}

export async function recordSignIn({ userId }: { userId: string }) {
  await db().update(users).set({ lastSignInAt: new Date() }).where(eq(users.id, userId));
}

/** Sign-out: the session id stops working at once, everywhere its cookie may have been copied to. */
export async function revokeSession({ sessionId, userId, expiresAt }: { sessionId: string; userId: string; expiresAt: Date }) {
  await db().insert(revokedSessions).values({ sessionId, userId, expiresAt }).onConflictDoNothing();
}

export async function insertUser(tx: DbOrTx, values: NewUser) {
  const [row] = await tx.insert(users).values(values).returning({ id: users.id, email: users.email });
  return row;
}

/** Sets the password and ends the account's other sessions (their token version no longer matches). */
export async function setUserPassword(tx: DbOrTx, { userId, passwordHash }: { userId: string; passwordHash: string }) {
  await tx
    .update(users)
    .set({ passwordHash, tokenVersion: sql`${users.tokenVersion} + 1`, updatedAt: new Date() })
    .where(eq(users.id, userId));
}

/** The member's row, locked for the rest of the transaction (undefined when not in the workspace). */
export async function lockUserInWorkspace(tx: DbOrTx, { workspaceId, userId }: { workspaceId: string; userId: string }) {
  const [row] = await tx
    .select()
    .from(users)
    .where(and(eq(users.workspaceId, workspaceId), eq(users.id, userId)))
    .for("update")
    .limit(1);
  return row;
}

/** Locks every lead row of the workspace, so two leads demoting each other cannot both succeed. */
export async function lockWorkspaceLeads(tx: DbOrTx, { workspaceId }: { workspaceId: string }) {
  await tx.execute(sql`SELECT id FROM users WHERE workspace_id = ${workspaceId} AND 'lead' = ANY(roles) FOR UPDATE`);
}

/** Edits a member; `endSessions` bumps the token version so their open sessions end on the next request. */
export async function updateUserFields(
  tx: DbOrTx,
  { workspaceId, userId, fields, endSessions }: { workspaceId: string; userId: string; fields: Partial<Pick<NewUser, "name" | "roles" | "active">>; endSessions: boolean },
) {
  await tx
    .update(users)
    .set({ ...fields, ...(endSessions && { tokenVersion: sql`${users.tokenVersion} + 1` }), updatedAt: new Date() })
    .where(and(eq(users.workspaceId, workspaceId), eq(users.id, userId)));
}

/** Revocations whose cookie has expired anyway; returns how many went. */
export async function deleteRevokedSessionsExpiredBefore(before: Date): Promise<number> {
  const rows = await db().delete(revokedSessions).where(lt(revokedSessions.expiresAt, before)).returning({ id: revokedSessions.sessionId });
  return rows.length;
}
