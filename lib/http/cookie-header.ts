import type { CookieJar } from "@/lib/auth/session-user";

/**
 * A request's Cookie header as a jar, read the way next/headers' cookies() reads it
 * (@edge-runtime/cookies): pairs split at "; ", a name without "=" counts as "true", values
 * URL-decoded, a value that does not decode is skipped, and the last of two same-named cookies wins.
 * For the plain Node routes (lib/http/node-routes.ts), which answer without Next.js.
 */
export function cookieJarFromHeader(header: string | string[] | undefined): CookieJar {
  const map = new Map<string, string>();
  for (const pair of (Array.isArray(header) ? header.join("; ") : (header ?? "")).split(/; */)) {
    if (!pair) continue;
    const at = pair.indexOf("=");
    if (at === -1) {
      map.set(pair, "true");
      continue;
    }
    try {
      map.set(pair.slice(0, at), decodeURIComponent(pair.slice(at + 1)));
    } catch {
      // A malformed escape: next/headers drops the cookie too.
    }
  }
  return { get: (name) => map.get(name), names: () => [...map.keys()] };
}
