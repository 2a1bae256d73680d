import "server-only";
import { and, asc, eq, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { users, workspaces, type User } from "@/db/schema";
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
};
export type PublicUser = Omit<User, "passwordHash" | "tokenVersion" | "updatedAt" | "roles"> & { roles: Role[]; hasPassword: boolean };

export async function getUserByEmail({ email }: { email: string }): Promise<User | undefined> {
  const [row] = await db().select().from(users).where(eq(users.email, email.toLowerCase())).limit(1);
  return row;
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

function prepareSessionUserQuery(database: ReturnType<typeof db>) {
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
    })
    .from(users)
    .innerJoin(workspaces, eq(workspaces.id, users.workspaceId))
    .where(eq(users.id, sql.placeholder("userId")))
    .limit(1)
    .prepare("session_user");
}

/** What a request needs to know about its session's user, in one query. */
export async function getSessionUser({ userId }: { userId: string }) {
  const database = db();
  let query = sessionUserQueries.get(database);
  if (!query) sessionUserQueries.set(database, (query = prepareSessionUserQuery(database)));
  const [row] = await query.execute({ userId });
  return row;
}

export function listPeople({ workspaceId }: { workspaceId: string }) {
  return db()
    .select(publicUserColumns)
    .from(users)
    .where(eq(users.workspaceId, workspaceId))
    .orderBy(asc(users.name)) as unknown as Promise<PublicUser[]>;
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
