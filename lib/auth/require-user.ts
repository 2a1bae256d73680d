import "server-only";
import { cookies } from "next/headers";
import { forbidden, redirect } from "next/navigation";
import { cache } from "react";
import { AppError } from "@/lib/errors";
import type { Permission } from "./permissions";
import { authorise, sessionUserFromCookies, type SessionUser } from "./session-user";

export type { SessionUser } from "./session-user";

/** The session's user, once per request (React's request cache), from next/headers' cookie jar. */
const loadSessionUser = cache(async (): Promise<SessionUser | null> => {
  const jar = await cookies();
  return sessionUserFromCookies({ get: (name) => jar.get(name)?.value, names: () => jar.getAll().map((c) => c.name) });
});

/**
 * The one authorisation check. Every route handler (through `handler({ permission })` in
 * lib/http/route.ts) and protected page calls it. Throws AppError 401 without a valid session and
 * 403 when none of the user's roles holds the permission (lib/auth/permissions.ts; leads hold
 * every one). Without a permission, any signed-in user passes (the app's layout).
 */
export async function requireUser(opts: { permission?: Permission } = {}): Promise<SessionUser> {
  return authorise(await loadSessionUser(), opts.permission);
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
