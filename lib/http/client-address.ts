/**
 * Which address a request comes from, for per-address limits. A client can write anything into
 * X-Forwarded-For; only the entries that trusted proxies appended can be believed. With
 * `trustedHops` reverse proxies in front of the app, each appending the address it received the
 * request from, the chain is the header's entries plus the socket's peer, and the client is the
 * right-most address that none of the trusted hops could have written: counting from the right,
 * the entry just past the trusted hops. With no trusted hops, that is the socket's peer itself.
 * A chain shorter than the hops (a proxy that did not append) falls back to its left-most entry.
 */
export function clientAddress({ forwardedFor, socketAddress, trustedHops }: { forwardedFor: string | string[] | undefined; socketAddress: string | undefined; trustedHops: number }): string {
  const forwarded = (Array.isArray(forwardedFor) ? forwardedFor.join(",") : (forwardedFor ?? ""))
    .split(",")
    .map((entry) => entry.trim())
    .filter(Boolean);
  const chain = [...forwarded, socketAddress ?? ""].filter(Boolean).map(normalizeAddress);
  if (!chain.length) return "unknown";
  const index = Math.max(0, chain.length - 1 - Math.max(0, Math.floor(trustedHops)));
  return chain[index].slice(0, 64);
}

/** IPv4 peers on a dual-stack socket show as ::ffff:a.b.c.d; count them as the IPv4 address. */
export function normalizeAddress(address: string): string {
  const lower = address.toLowerCase();
  return lower.startsWith("::ffff:") && lower.includes(".") ? lower.slice(7) : lower;
}

/** TRUSTED_PROXY_HOPS as a whole number >= 0 (0 when unset); anything else is a start-up error. */
export function trustedProxyHops(raw: string | undefined): number {
  if (raw === undefined || raw.trim() === "") return 0;
  const hops = Number(raw);
  if (!Number.isInteger(hops) || hops < 0 || hops > 10) throw new Error(`TRUSTED_PROXY_HOPS must be a whole number from 0 to 10 (got "${raw}").`);
  return hops;
}
