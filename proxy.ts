import { getToken } from "next-auth/jwt";
import { NextResponse, type NextRequest } from "next/server";
import { servedOverHttps, sessionCookieName } from "@/lib/auth/cookies";
import { env } from "@/lib/env";
import { objectStoreOrigin, pageContentSecurityPolicy, staticSecurityHeaders } from "@/lib/http/security-headers";

// "/verify": a certificate's verification page, opened by a buyer's phone from the QR code;
// "/evidence": an evidence pack's link, opened by the supplier from the e-mail.
const PUBLIC_PAGES = ["/sign-in", "/sign-up", "/forgot-password", "/set-password", "/verify", "/evidence"];

let cached: ReturnType<typeof readSettings> | undefined;
const settings = () => (cached ??= readSettings());

function readSettings() {
  const e = env();
  const https = servedOverHttps(e.APP_URL);
  return {
    https,
    headers: staticSecurityHeaders({ https }),
    storeOrigin: objectStoreOrigin({ endpoint: e.S3_ENDPOINT, bucket: e.S3_BUCKET, region: e.S3_REGION, forcePathStyle: e.S3_FORCE_PATH_STYLE }),
  };
}

function withHeaders(res: NextResponse, headers: Record<string, string>): NextResponse {
  for (const [name, value] of Object.entries(headers)) res.headers.set(name, value);
  return res;
}

/**
 * Pages: a fresh CSP nonce per request (Next.js puts it on its scripts), then a convenience
 * redirect to sign-in for visitors without a session cookie. The redirect is never the access
 * check: every page and route handler calls requireUser itself.
 */
async function page(req: NextRequest, s: ReturnType<typeof settings>): Promise<NextResponse> {
  const nonce = Buffer.from(crypto.getRandomValues(new Uint8Array(18))).toString("base64");
  const csp = pageContentSecurityPolicy({ nonce, connectSources: [s.storeOrigin], https: s.https, dev: process.env.NODE_ENV === "development" });
  const headers = { ...s.headers, "Content-Security-Policy": csp };
  const { pathname, search } = req.nextUrl;
  if (!PUBLIC_PAGES.some((p) => pathname === p || pathname.startsWith(`${p}/`))) {
    const token = await getToken({ req, secret: process.env.NEXTAUTH_SECRET, cookieName: sessionCookieName(s.https) });
    if (!token) {
      const url = req.nextUrl.clone();
      url.pathname = "/sign-in";
      url.search = pathname === "/" ? "" : `?callbackUrl=${encodeURIComponent(pathname + search)}`;
      return withHeaders(NextResponse.redirect(url), headers);
    }
  }
  const requestHeaders = new Headers(req.headers);
  requestHeaders.set("content-security-policy", csp);
  requestHeaders.set("x-nonce", nonce);
  return withHeaders(NextResponse.next({ request: { headers: requestHeaders } }), headers);
}

export async function proxy(req: NextRequest) {
  return page(req, settings());
}

export const config = {
  // Pages only. Not the build's static files (next.config.ts gives those the static headers), and
  // not /api: a request the proxy sees has its whole body read before the route runs, which would
  // defeat the routes' streamed size limits (lib/http/api-guard.ts guards /api instead).
  matcher: ["/((?!api/|_next/static/|_next/image|favicon.ico|icon.svg|fonts/).*)"],
};
