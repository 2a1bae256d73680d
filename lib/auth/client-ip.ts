/**
 * The client address for per-address limits. The web server (scripts/serve.ts) replaces every
 * request's X-Forwarded-For with the one address it worked out from TRUSTED_PROXY_HOPS, so the
 * header holds exactly that; whatever a client sent itself is gone by then.
 */
export function clientIp(headers: Headers | Record<string, string | string[] | undefined>): string {
  const raw = headers instanceof Headers ? headers.get("x-forwarded-for") : headers["x-forwarded-for"];
  const value = Array.isArray(raw) ? raw[0] : raw;
  const first = value?.split(",")[0]?.trim();
  return first ? first.slice(0, 64) : "unknown";
}
