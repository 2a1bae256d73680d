import "server-only";
/**
 * Limits of the public account endpoints, per client address and per e-mail address, counted in
 * PostgreSQL so every instance shares them (lib/rate-limit/limits.ts). They apply the same to
 * addresses with and without an account, so a 429 reveals nothing either. 429 answers say how
 * long to wait.
 */
import { enforceLimits, waitPhrase, type Limit } from "@/lib/rate-limit/limits";

const HOUR = 3600;
const QUARTER = 15 * 60;

export const PUBLIC_LIMITS = {
  forgotPerAddress: { max: 10, windowSeconds: HOUR },
  forgotPerEmail: { max: 3, windowSeconds: HOUR },
  setPasswordPerAddress: { max: 10, windowSeconds: QUARTER },
  setPasswordPerAccount: { max: 5, windowSeconds: QUARTER },
  signUpPerAddress: { max: 5, windowSeconds: HOUR },
  signUpPerEmail: { max: 3, windowSeconds: HOUR },
} as const;

const limit = (bucket: string, key: string, l: { max: number; windowSeconds: number }): Limit => ({ bucket, key, ...l });

export function limitForgotPassword({ ip, email }: { ip: string; email: string }) {
  return enforceLimits(
    [limit("forgot:address", ip, PUBLIC_LIMITS.forgotPerAddress), limit("forgot:email", email, PUBLIC_LIMITS.forgotPerEmail)],
    (s) => `Too many password-reset requests. ${waitPhrase(s)} and try again; a link already sent keeps working until it expires.`,
  );
}

export function limitSetPasswordByAddress({ ip }: { ip: string }) {
  return enforceLimits([limit("set-password:address", ip, PUBLIC_LIMITS.setPasswordPerAddress)], (s) => `Too many attempts to set a password from here. ${waitPhrase(s)} and try again.`);
}

export function limitSetPasswordByAccount({ key }: { key: string }) {
  return enforceLimits([limit("set-password:account", key, PUBLIC_LIMITS.setPasswordPerAccount)], (s) => `Too many attempts to set this password. ${waitPhrase(s)} and try again.`);
}

export function limitSignUp({ ip, email }: { ip: string; email: string }) {
  return enforceLimits(
    [limit("sign-up:address", ip, PUBLIC_LIMITS.signUpPerAddress), limit("sign-up:email", email, PUBLIC_LIMITS.signUpPerEmail)],
    (s) => `Too many sign-ups. ${waitPhrase(s)} and try again; a confirmation link already sent keeps working until it expires.`,
  );
}
