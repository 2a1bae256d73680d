import "server-only";
/**
 * Plain Node routes: hot, read-only GET routes that the production server (scripts/serve.ts)
 * answers itself, ahead of Next.js's request handling. Measured on the Gallery list (bench/gallery-list.ts,
 * December 2026): an empty App Router route handler cost about 1.1 ms of the server's CPU per request
 * and the same answer from a plain Node handler about 0.03 ms, while the list's own work (session,
 * query, 48 cards) is about 0.7 ms; with one server thread on two cores that overhead was most of
 * the list's p95 under 10 connections.
 *
 * Each route here also exists as an App Router handler under app/api (the same path, method and
 * permission; tests/unit/http/route-table.test.ts checks that), which `next dev` and `next start`
 * serve; both call the same function for the answer, so only the transport differs. What every
 * /api answer gets is repeated here: the session check and permission (lib/auth/session-user.ts),
 * zod on the query, errors mapped as lib/http/route.ts maps them (401/403/400/404/503/500, logged
 * the same way), and the headers next.config.ts and lib/http/api-guard.ts add to /api answers
 * (tests/integration/node-routes.test.ts compares them with an App Router route's).
 */
import type { IncomingMessage, ServerResponse } from "node:http";
import type { Permission } from "@/lib/auth/permissions";
import { authorise, sessionUserFromCookies, type SessionUser } from "@/lib/auth/session-user";
import { servedOverHttps } from "@/lib/auth/cookies";
import { env } from "@/lib/env";
import { galleryListAnswer } from "@/lib/gallery/list-answer";
import { cookieJarFromHeader } from "./cookie-header";
import { errorResponse } from "./route";
import { API_CONTENT_SECURITY_POLICY, staticSecurityHeaders } from "./security-headers";

export type NodeRoute = {
  method: "GET";
  /** The exact pathname (no trailing slash, no parameters in the path). */
  path: string;
  permission: Permission;
  /** The answer's JSON text for the signed-in, permitted user; throw AppError for a 4xx. */
  answer: (params: URLSearchParams, user: SessionUser) => Promise<string>;
};

export const NODE_ROUTES: readonly NodeRoute[] = [{ method: "GET", path: "/api/gallery", permission: "gallery.read", answer: galleryListAnswer }];

/** The headers of every /api answer: next.config.ts's (security headers, a CSP that allows nothing) and api-guard's HSTS on https. */
function apiHeaders(): Record<string, string> {
  return { ...staticSecurityHeaders({ https: servedOverHttps(env().APP_URL) }), "Content-Security-Policy": API_CONTENT_SECURITY_POLICY };
}

/** Answers one request on a route of NODE_ROUTES, writing the whole answer with its length. */
export async function answerNodeRoute(route: NodeRoute, req: IncomingMessage, res: ServerResponse): Promise<void> {
  let status = 200;
  let body: string;
  let retryAfter: string | null = null;
  try {
    const user = authorise(await sessionUserFromCookies(cookieJarFromHeader(req.headers.cookie)), route.permission);
    body = await route.answer(new URL(req.url ?? "/", "http://localhost").searchParams, user);
  } catch (err) {
    const failed = errorResponse(err);
    status = failed.status;
    retryAfter = failed.headers.get("retry-after");
    body = await failed.text();
  }
  const bytes = Buffer.from(body, "utf8");
  res.writeHead(status, {
    ...apiHeaders(),
    "Content-Type": "application/json",
    "Content-Length": bytes.length,
    ...(retryAfter && { "Retry-After": retryAfter }),
  });
  res.end(bytes);
}

/** The route that answers a request, if one of NODE_ROUTES does (method and exact pathname). */
export function findNodeRoute(method: string | undefined, url: string | undefined): NodeRoute | undefined {
  if (method !== "GET" || !url) return undefined;
  const q = url.indexOf("?");
  const pathname = q === -1 ? url : url.slice(0, q);
  return NODE_ROUTES.find((r) => r.path === pathname);
}
