import "server-only";
/**
 * Who a request's session cookie belongs to, from the cookies alone: no next/headers and no React
 * request cache, so the same check serves App Router handlers and pages (lib/auth/require-user.ts,
 * through next/headers' cookie jar) and the plain Node routes of the production server
 * (lib/http/node-routes.ts, from the raw Cookie header).
 */
import { getSessionUser } from "@/db/queries/users";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { servedOverHttps, sessionCookieName } from "./cookies";
import { can, describeHolders, type Permission } from "./permissions";
import type { Role } from "./roles";
import { decodeSessionToken } from "./session-token";

export type SessionUser = {
  id: string;
  workspaceId: string;
  workspaceName: string;
  /** The workspace's time zone: every time is shown in it (lib/time/format.ts). */
  timeZone: string;
  email: string;
  name: string;
  roles: Role[];
};

/** A request's cookies by name (next/headers' jar, or a parsed Cookie header: lib/http/cookie-header.ts). */
export type CookieJar = { get(name: string): string | undefined; names(): string[] };

/**
 * The session's user, re-read from the database on every request so that deactivation, a
 * password change, a role change or signing out takes effect at once (the JWT alone would
 * outlive them).
 */
export async function sessionUserFromCookies(jar: CookieJar): Promise<SessionUser | null> {
  const claims = await sessionClaims(jar);
  if (!claims?.sub) return null;
  const row = await getSessionUser({ userId: claims.sub, sessionId: typeof claims.sid === "string" ? claims.sid : null });
  if (!row || !row.active || row.sessionRevoked || row.tokenVersion !== claims.tokenVersion || row.workspaceId !== claims.workspaceId) return null;
  return {
    id: row.id,
    workspaceId: row.workspaceId,
    workspaceName: row.workspaceName,
    timeZone: row.timeZone,
    email: row.email,
    name: row.name,
    roles: row.roles as Role[],
  };
}

/**
 * The verified claims of next-auth's session cookie. Decoding the JWT directly (instead of
 * getServerSession, which runs next-auth's whole session endpoint) keeps every API request cheap;
 * next-auth still issues and encrypts the cookie. Large cookies are split into .0, .1, … chunks.
 * Only the cookie name of the app's scheme counts (lib/auth/cookies.ts).
 */
async function sessionClaims(jar: CookieJar) {
  const name = sessionCookieName(servedOverHttps(env().APP_URL));
  const whole = jar.get(name);
  const chunks = whole
    ? [whole]
    : jar
        .names()
        .filter((n) => n.startsWith(`${name}.`))
        .sort((a, b) => Number(a.split(".").pop()) - Number(b.split(".").pop()))
        .map((n) => jar.get(n) ?? "");
  if (!chunks.length) return null;
  return decodeSessionToken(chunks.join(""), process.env.NEXTAUTH_SECRET ?? "");
}

/**
 * The one authorisation rule: AppError 401 without a valid session, 403 when none of the user's
 * roles holds the permission (lib/auth/permissions.ts; leads hold every one). Without a
 * permission, any signed-in user passes.
 */
export function authorise(user: SessionUser | null, permission?: Permission): SessionUser {
  if (!user) throw new AppError("unauthorized", "You are not signed in, or your session has ended. Sign in to continue.");
  if (permission && !can(user, permission)) {
    throw new AppError("forbidden", `This needs the ${describeHolders(permission)} role, which your account does not have.`);
  }
  return user;
}
