import "server-only";
import { and, eq, gte, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { signInFailures } from "@/db/schema";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { minutesUntilRetry } from "./retry";

async function failuresSince(column: typeof signInFailures.email | typeof signInFailures.ip, value: string, since: Date) {
  const [row] = await db()
    .select({ n: sql<number>`count(*)::int`, oldest: sql<Date | null>`min(${signInFailures.createdAt})` })
    .from(signInFailures)
    .where(and(eq(column, value), gte(signInFailures.createdAt, since)));
  return { count: row?.n ?? 0, oldest: row?.oldest ? new Date(row.oldest) : null };
}

/**
 * Refuses a sign-in attempt when the account or the client address has failed too often in the
 * window (defaults: 5 per account, 20 per address, 15 minutes), before any password is checked.
 */
export async function assertSignInAllowed({ email, ip, now = new Date() }: { email: string; ip: string; now?: Date }) {
  const { SIGNIN_MAX_FAILURES_PER_ACCOUNT, SIGNIN_MAX_FAILURES_PER_IP, SIGNIN_WINDOW_MINUTES } = env();
  const since = new Date(now.getTime() - SIGNIN_WINDOW_MINUTES * 60_000);
  const [byAccount, byIp] = await Promise.all([failuresSince(signInFailures.email, email, since), failuresSince(signInFailures.ip, ip, since)]);
  const blocked =
    byAccount.count >= SIGNIN_MAX_FAILURES_PER_ACCOUNT ? byAccount : byIp.count >= SIGNIN_MAX_FAILURES_PER_IP ? byIp : null;
  if (blocked?.oldest) {
    const minutes = minutesUntilRetry(blocked.oldest, now, SIGNIN_WINDOW_MINUTES);
    throw new AppError(
      "too_many_requests",
      `Too many failed sign-in attempts. Wait ${minutes} minute${minutes === 1 ? "" : "s"} and try again, or reset your password.`,
    );
  }
}

export async function recordSignInFailure({ email, ip }: { email: string; ip: string }) {
  await db().insert(signInFailures).values({ email, ip });
}

export async function clearSignInFailures({ email }: { email: string }) {
  await db().delete(signInFailures).where(eq(signInFailures.email, email));
}
