/**
 * The client address for rate limiting. Next.js fills X-Forwarded-For with the socket address
 * when a request arrives without one; behind a reverse proxy, that proxy must overwrite it, or a
 * client could choose its own address (the per-account limit still holds either way).
 */
export function clientIp(headers: Headers | Record<string, string | string[] | undefined>): string {
  const raw = headers instanceof Headers ? headers.get("x-forwarded-for") : headers["x-forwarded-for"];
  const value = Array.isArray(raw) ? raw[0] : raw;
  const first = value?.split(",")[0]?.trim();
  return first ? first.slice(0, 64) : "unknown";
}
