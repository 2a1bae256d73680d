import "server-only";
import type { z } from "zod";
import { isDatabaseUnavailable } from "@/db/errors";
import type { Permission } from "@/lib/auth/permissions";
import { requireUser, type SessionUser } from "@/lib/auth/require-user";
import { AppError } from "@/lib/errors";
import { parseSearchParams, parseWith } from "@/lib/validation";
import { guardedRoute } from "./api-guard";

export const DATABASE_UNAVAILABLE_MESSAGE = "The database did not answer in time, so nothing was changed. Try again in a moment; your work on this page is kept.";

export type ErrorBody = { error: { code: string; message: string; fieldErrors?: Record<string, string> } };

/** Maps any thrown value to a JSON error response; unexpected errors are logged, not leaked. */
export function errorResponse(err: unknown): Response {
  if (err instanceof AppError) {
    const body: ErrorBody = { error: { code: err.code, message: err.message, fieldErrors: err.fieldErrors } };
    const headers = err.retryAfterSeconds ? { "Retry-After": String(err.retryAfterSeconds) } : undefined;
    return Response.json(body, { status: err.status, headers });
  }
  if (isDatabaseUnavailable(err)) {
    // Logged in one line: during an outage every request lands here.
    console.error(`Database unavailable: ${err instanceof Error ? err.message : String(err)}`);
    const body: ErrorBody = { error: { code: "unavailable", message: DATABASE_UNAVAILABLE_MESSAGE } };
    return Response.json(body, { status: 503, headers: { "Retry-After": "5" } });
  }
  console.error("Unexpected error in route handler", err);
  const body: ErrorBody = { error: { code: "internal", message: "Something went wrong on the server. Try again; if it keeps happening, tell your QC lead." } };
  return Response.json(body, { status: 500 });
}

/**
 * Who may call a route: a permission from lib/auth/permissions.ts, or `public: true` for the few
 * routes anyone may call (sign-up, password links, health). Every route names one; the route
 * access matrix test (tests/integration/api-access.test.ts) checks the source against its table.
 */
export type RouteAccess = { permission: Permission } | { public: true };

/**
 * Wraps a route handler: refuses cross-site writes and non-JSON bodies first (lib/http/api-guard.ts),
 * checks the session and the permission (401 / 403), hands the user to `fn`, and turns every
 * failure into a JSON error with the right status.
 */
export function handler<C>(access: { permission: Permission }, fn: (req: Request, ctx: C, user: SessionUser) => Promise<Response>): (req: Request, ctx: C) => Promise<Response>;
export function handler<C>(access: { public: true }, fn: (req: Request, ctx: C) => Promise<Response>): (req: Request, ctx: C) => Promise<Response>;
export function handler<C>(access: RouteAccess, fn: (req: Request, ctx: C, user: SessionUser) => Promise<Response>) {
  return guardedRoute(async (req: Request, ctx: C): Promise<Response> => {
    try {
      if ("public" in access) return await (fn as (req: Request, ctx: C) => Promise<Response>)(req, ctx);
      const user = await requireUser({ permission: access.permission });
      return await fn(req, ctx, user);
    } catch (err) {
      return errorResponse(err);
    }
  });
}

const DEFAULT_MAX_BODY = 1024 * 1024;
/** Public routes (sign-up, passwords) take a few short fields: anyone may send them, so keep it small. */
export const PUBLIC_MAX_BODY = 16 * 1024;

const tooLarge = (maxBytes: number) => new AppError("payload_too_large", `The request is too large (limit ${Math.round(maxBytes / 1024)} KB).`);

/**
 * The request body, read as a stream with a byte counter: 413 as soon as the limit is passed,
 * without reading the rest — for a declared Content-Length and for chunked bodies alike (a
 * declared length is only a claim; the counter decides).
 */
export async function readBodyLimited(req: Request, maxBytes: number): Promise<Uint8Array> {
  const declared = req.headers.get("content-length");
  if (declared !== null && Number(declared) > maxBytes) throw tooLarge(maxBytes);
  if (!req.body) return new Uint8Array(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel().catch(() => {});
      throw tooLarge(maxBytes);
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks, total);
}

const utf8 = new TextDecoder("utf-8", { fatal: true });

/** Reads and validates a JSON body (size-limited while reading; wrong content is a 400 with a readable message). */
export async function parseJson<S extends z.ZodType>(req: Request, schema: S, { maxBytes = DEFAULT_MAX_BODY, allowEmpty = false } = {}): Promise<z.infer<S>> {
  const bytes = await readBodyLimited(req, maxBytes);
  let value: unknown;
  try {
    const text = utf8.decode(bytes).trim();
    value = text.length ? JSON.parse(text) : undefined;
  } catch {
    throw new AppError("bad_request", "The request body is not valid JSON (UTF-8 text).");
  }
  if (value === undefined) {
    if (allowEmpty) return parseWith(schema, {});
    throw new AppError("bad_request", "The request has no body; send JSON.");
  }
  return parseWith(schema, value);
}

/** Validates query parameters (single values only) with a schema. */
export function parseQuery<S extends z.ZodType>(req: Request, schema: S): z.infer<S> {
  return parseSearchParams(new URL(req.url).searchParams, schema);
}
