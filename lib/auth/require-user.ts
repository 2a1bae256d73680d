import "server-only";
import { cookies } from "next/headers";
import { forbidden, redirect } from "next/navigation";
import { cache } from "react";
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

/**
 * The session's user, re-read from the database on every request so that deactivation, a
 * password change, a role change or signing out takes effect at once (the JWT alone would
 * outlive them).
 */
const loadSessionUser = cache(async (): Promise<SessionUser | null> => {
  const claims = await sessionClaims();
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
});

/**
 * The verified claims of next-auth's session cookie. Decoding the JWT directly (instead of
 * getServerSession, which runs next-auth's whole session endpoint) keeps every API request cheap;
 * next-auth still issues and encrypts the cookie. Large cookies are split into .0, .1, … chunks.
 * Only the cookie name of the app's scheme counts (lib/auth/cookies.ts).
 */
async function sessionClaims() {
  const jar = await cookies();
  const name = sessionCookieName(servedOverHttps(env().APP_URL));
  const whole = jar.get(name)?.value;
  const chunks = whole
    ? [whole]
    : jar
        .getAll()
        .filter((c) => c.name.startsWith(`${name}.`))
        .sort((a, b) => Number(a.name.split(".").pop()) - Number(b.name.split(".").pop()))
        .map((c) => c.value);
  if (!chunks.length) return null;
  return decodeSessionToken(chunks.join(""), process.env.NEXTAUTH_SECRET ?? "");
}

/**
 * The one authorisation check. Every route handler (through `handler({ permission })` in
 * lib/http/route.ts) and protected page calls it. Throws AppError 401 without a valid session and
 * 403 when none of the user's roles holds the permission (lib/auth/permissions.ts; leads hold
 * every one). Without a permission, any signed-in user passes (the app's layout).
 */
export async function requireUser(opts: { permission?: Permission } = {}): Promise<SessionUser> {
  const user = await loadSessionUser();
  if (!user) throw new AppError("unauthorized", "You are not signed in, or your session has ended. Sign in to continue.");
  if (opts.permission && !can(user, opts.permission)) {
    throw new AppError("forbidden", `This needs the ${describeHolders(opts.permission)} role, which your account does not have.`);
  }
  return user;
}

/** For pages: like requireUser, but sends a visitor without a session to sign in. */
export async function requirePageUser(opts: { permission?: Permission; from?: string } = {}): Promise<SessionUser> {
  try {
    return await requireUser(opts);
  } catch (err) {
    if (err instanceof AppError && err.code === "unauthorized") {
      redirect(opts.from ? `/sign-in?callbackUrl=${encodeURIComponent(opts.from)}` : "/sign-in");
    }
    if (err instanceof AppError && err.code === "forbidden") forbidden();
    throw err;
  }
}

/** The signed-in user or null, for public pages that change when someone is signed in. */
export async function optionalUser(): Promise<SessionUser | null> {
  return loadSessionUser();
}
