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

/** Node socket errors of a connection attempt that never reached a server. */
const SOCKET_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "ETIMEDOUT", "EPIPE", "EHOSTUNREACH", "ENETUNREACH", "ENOTFOUND", "EAI_AGAIN"]);
/** What pg and pg-pool say when a connection is lost or cannot be had in time. */
const LOST_CONNECTION = /Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error|connection timeout|Connection closed/i;

/**
 * True when the error means "the database cannot be used right now" rather than "this query is
 * wrong": the server is down, restarting or shutting down (SQLSTATE class 08, 57P01–57P03), the
 * connection broke, no connection could be had within the pool's timeout, or a statement ran
 * past statement_timeout (57014) or lock_timeout (55P03). Route handlers answer these with 503.
 */
export function isDatabaseUnavailable(err: unknown): boolean {
  let current: unknown = err;
  for (let i = 0; i < 5 && current && typeof current === "object"; i++) {
    const e = current as { code?: unknown; message?: unknown; cause?: unknown };
    if (typeof e.code === "string") {
      if (SOCKET_CODES.has(e.code)) return true;
      if (/^08[0-9A-Z]{3}$/.test(e.code) || ["57P01", "57P02", "57P03", "57014", "55P03", "53300"].includes(e.code)) return true;
    }
    if (typeof e.message === "string" && LOST_CONNECTION.test(e.message)) return true;
    current = e.cause;
  }
  return false;
}
