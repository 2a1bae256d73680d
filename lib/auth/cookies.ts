/**
 * The session cookie's name. Served over https, next-auth marks its cookies Secure and gives them
 * the __Secure- prefix, which a browser accepts only from a secure origin; the app then reads that
 * name alone, so a cookie planted over plain http (or by a sibling host) is never taken for a
 * session.
 */
export const SESSION_COOKIE = "next-auth.session-token";

export function sessionCookieName(https: boolean): string {
  return https ? `__Secure-${SESSION_COOKIE}` : SESSION_COOKIE;
}

/** Whether the app is served over https, from its configured public URL. */
export const servedOverHttps = (appUrl: string) => appUrl.trim().toLowerCase().startsWith("https:");
