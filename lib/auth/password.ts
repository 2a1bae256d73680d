import "server-only";
import { hash, verify } from "@node-rs/argon2";

// A fixed valid hash used when the account is unknown, so a wrong e-mail costs as much time as a
// wrong password and response times don't reveal which accounts exist.
const DUMMY_HASH = "$argon2id$v=19$m=19456,t=2,p=1$5snKbW0k8hS58j7Cb2AcXw$6KcTLUlbT6RpriXr3pRL0fZNgeFinNz0YJRSZm8uKdw";

/** argon2id with the library defaults (m=19456 KiB, t=2, p=1: OWASP's minimum recommendation). */
export function hashPassword(password: string): Promise<string> {
  return hash(password);
}

export async function verifyPassword(passwordHash: string | null, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash ?? DUMMY_HASH, password);
  } catch {
    return false;
  }
}
