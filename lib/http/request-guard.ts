/**
 * Cross-site write protection for the JSON API (pure; lib/http/api-guard.ts applies it to every /api request).
 *
 * A browser attaches the session cookie to any request to the app, including one a foreign page
 * starts. Every write must therefore come from the app's own pages: the Origin header (sent by
 * browsers on every POST, PUT, PATCH and DELETE) must be the app's, and Sec-Fetch-Site, where the
 * browser sends it, must say "same-origin". A request with neither header is not from a browser
 * page (curl, scripts, tests) and carries no ambient credentials of a victim, so it passes.
 * A body must be JSON: an HTML form can only send url-encoded, multipart or text/plain bodies
 * without a CORS preflight, and the app grants no cross-origin preflight.
 * next-auth's own routes (/api/auth/*) take form posts and keep their double-submit CSRF token;
 * only the origin rule applies to them.
 */
export type Refusal = { status: 403 | 415; code: "forbidden" | "unsupported_media_type"; message: string };

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

export const CROSS_SITE_MESSAGE = "This request came from another site, so it was refused. Open Partproof itself and try again there.";
export const JSON_ONLY_MESSAGE = "Send the request body as JSON (Content-Type: application/json).";

function hasBody(headers: Headers): boolean {
  const length = headers.get("content-length");
  if (length !== null && length.trim() !== "") return Number(length) !== 0;
  return headers.has("transfer-encoding");
}

function isJson(contentType: string | null): boolean {
  const essence = (contentType ?? "").split(";")[0].trim().toLowerCase();
  return essence === "application/json";
}

/** The request's refusal, or null when it may go on to its handler. */
export function crossSiteRefusal({ method, pathname, headers, allowedOrigins }: { method: string; pathname: string; headers: Headers; allowedOrigins: readonly string[] }): Refusal | null {
  if (SAFE_METHODS.has(method.toUpperCase())) return null;
  const origin = headers.get("origin");
  if (origin !== null && !allowedOrigins.includes(origin.toLowerCase())) return { status: 403, code: "forbidden", message: CROSS_SITE_MESSAGE };
  const site = headers.get("sec-fetch-site");
  if (site !== null && site !== "same-origin" && site !== "none") return { status: 403, code: "forbidden", message: CROSS_SITE_MESSAGE };
  if (pathname === "/api/auth" || pathname.startsWith("/api/auth/")) return null;
  const contentType = headers.get("content-type");
  if ((hasBody(headers) || contentType !== null) && !isJson(contentType)) return { status: 415, code: "unsupported_media_type", message: JSON_ONLY_MESSAGE };
  return null;
}

/**
 * The origins the app answers writes from: the configured APP_URL's, and the one the browser
 * reached (the Host header) — a page served under another name of the same server is still
 * the app's own page, and a foreign page cannot choose the Host its requests go to.
 */
export function appOrigins({ appUrl, host, https }: { appUrl: string; host: string | null; https: boolean }): string[] {
  const origins = [new URL(appUrl).origin.toLowerCase()];
  if (host) origins.push(`${https ? "https" : "http"}://${host.toLowerCase()}`);
  return origins;
}
