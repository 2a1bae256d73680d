/** PostgreSQL error helpers (drizzle wraps the pg error in `cause`). */
type PgError = { code?: string; constraint?: string; cause?: unknown };

function pgError(err: unknown): PgError | null {
  let current: unknown = err;
  for (let i = 0; i < 4 && current && typeof current === "object"; i++) {
    const e = current as PgError;
    if (typeof e.code === "string" && /^[0-9A-Z]{5}$/.test(e.code)) return e;
    current = e.cause;
  }
  return null;
}

export function isUniqueViolation(err: unknown, constraint?: string): boolean {
  const e = pgError(err);
  return e?.code === "23505" && (!constraint || e.constraint === constraint);
}

export function isForeignKeyViolation(err: unknown): boolean {
  return pgError(err)?.code === "23503";
}
