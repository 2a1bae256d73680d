import "server-only";
/**
 * The sign-in limit (policy in README, "Sign-in protection"). Every attempt is counted before its
 * password is checked, atomically (lib/rate-limit/limits.ts), against three limits per window:
 *   - per account and client address (default 5): a stranger guessing from one address stops
 *     there, while the owner, from any other address, is not affected;
 *   - per client address (default 20), across accounts: one address cannot spray many accounts;
 *   - per account (default 50), from every address: a ceiling against guessing from many
 *     addresses at once.
 * A good password hands back the attempt's own events and clears its pair, so only failures
 * count. Only the account ceiling can lock the owner out, and only while ten or more addresses
 * keep failing; a password reset by e-mail clears the account's count (unlockAccount).
 */
import { env } from "@/lib/env";
import { clearLimit, returnAllowance, takeAllowance, waitPhrase, type Limit, type Taken } from "@/lib/rate-limit/limits";

const PAIR = "sign-in:account+address";
const ADDRESS = "sign-in:address";
const ACCOUNT = "sign-in:account";

export function signInLimits({ email, ip }: { email: string; ip: string }): Limit[] {
  const e = env();
  const windowSeconds = e.SIGNIN_WINDOW_MINUTES * 60;
  return [
    { bucket: PAIR, key: `${email}|${ip}`, max: e.SIGNIN_MAX_FAILURES_PER_ACCOUNT_ADDRESS, windowSeconds },
    { bucket: ADDRESS, key: ip, max: e.SIGNIN_MAX_FAILURES_PER_IP, windowSeconds },
    { bucket: ACCOUNT, key: email, max: e.SIGNIN_MAX_FAILURES_PER_ACCOUNT, windowSeconds },
  ];
}

export type SignInAttempt = { ok: true; taken: Taken[] } | { ok: false; message: string };

/** Counts the attempt, or refuses it with the sentence to show when a limit is used up. */
export async function beginSignInAttempt({ email, ip }: { email: string; ip: string }): Promise<SignInAttempt> {
  const allowance = await takeAllowance(signInLimits({ email, ip }));
  if (allowance.ok) return allowance;
  return { ok: false, message: `Too many failed sign-in attempts. ${waitPhrase(allowance.retryAfterSeconds)} and try again, or reset your password.` };
}

/** The password was right: this attempt does not count, and neither do the pair's earlier ones. */
export async function signInSucceeded({ email, ip, taken }: { email: string; ip: string; taken: Taken[] }) {
  await returnAllowance(taken);
  await clearLimit({ bucket: PAIR, key: `${email}|${ip}` });
}

/** A password set through an e-mailed link proves the owner: every failure of the account is forgotten. */
export async function unlockAccount({ email }: { email: string }) {
  await clearLimit({ bucket: ACCOUNT, key: email });
  await clearLimit({ bucket: PAIR, keyPrefix: `${email}|` });
}
