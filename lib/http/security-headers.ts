/**
 * Security headers of every response (pure; proxy.ts sets them, next.config.ts adds the static
 * ones to the files it serves without the proxy).
 *
 * Pages get a Content-Security-Policy with a fresh nonce per request: Next.js reads the nonce
 * from the request's CSP header and puts it on its own scripts, and 'strict-dynamic' lets those
 * load the page's chunks; no other script runs. Images and canvases take blob: and data: URLs
 * (the Bench draws decoded photos), uploads go straight to the object store (connect-src), and
 * nobody may frame the app (frame-ancestors 'none', against clickjacking). JSON answers get a
 * policy that allows nothing at all.
 */
export type PageCspOptions = { nonce: string; connectSources: readonly string[]; https: boolean; dev: boolean };

export function pageContentSecurityPolicy({ nonce, connectSources, https, dev }: PageCspOptions): string {
  const directives = [
    "default-src 'self'",
    // React's development build evaluates code for its error overlays; production never does.
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ""}`,
    `style-src 'self' 'nonce-${nonce}'`,
    // React renders `style` props as attributes in the server's HTML (positions, sizes, colours
    // of data); an attribute cannot carry a nonce. Attributes cannot load or run anything.
    "style-src-attr 'unsafe-inline'",
    "img-src 'self' blob: data:",
    "font-src 'self'",
    ["connect-src 'self'", ...connectSources].join(" "),
    "media-src 'self' blob:",
    "worker-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ];
  if (https) directives.push("upgrade-insecure-requests");
  return directives.join("; ");
}

/** For JSON and other non-page answers: nothing may load from them, nothing may frame them. */
export const API_CONTENT_SECURITY_POLICY = "default-src 'none'; frame-ancestors 'none'";

/** Headers that do not depend on the request. HSTS only when the app is served over https. */
export function staticSecurityHeaders({ https }: { https: boolean }): Record<string, string> {
  const headers: Record<string, string> = {
    "X-Content-Type-Options": "nosniff",
    "Referrer-Policy": "strict-origin-when-cross-origin",
    // The Bench takes photos with the device camera; nothing else of these is used.
    "Permissions-Policy": "camera=(self), microphone=(), geolocation=(), payment=(), usb=()",
    // For browsers without frame-ancestors support.
    "X-Frame-Options": "DENY",
  };
  // Two years, the preload list's expectation; only sent where https is actually in use, since a
  // browser that saw it over http would refuse plain-http access to the host afterwards.
  if (https) headers["Strict-Transport-Security"] = "max-age=63072000; includeSubDomains";
  return headers;
}

/**
 * The browser's upload target: the origin of presigned URLs for the configured store. Path-style
 * (and any explicit endpoint with forcePathStyle) uses the endpoint's origin; virtual-hosted style
 * puts the bucket in front of the host; without an endpoint it is AWS S3's regional host.
 */
export function objectStoreOrigin({ endpoint, bucket, region, forcePathStyle }: { endpoint?: string; bucket: string; region: string; forcePathStyle: boolean }): string {
  if (endpoint) {
    const url = new URL(endpoint);
    return forcePathStyle ? url.origin : `${url.protocol}//${bucket}.${url.host}`;
  }
  return `https://${bucket}.s3.${region}.amazonaws.com`;
}
