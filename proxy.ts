import { getToken } from "next-auth/jwt";
import { NextResponse, type NextRequest } from "next/server";

const PUBLIC_PAGES = ["/sign-in", "/sign-up", "/forgot-password", "/set-password"];

/**
 * Only a convenience redirect to the sign-in page for visitors without a session cookie. It is
 * never the access check: every page and route handler calls requireUser itself.
 */
export async function proxy(req: NextRequest) {
  const { pathname, search } = req.nextUrl;
  if (PUBLIC_PAGES.some((p) => pathname === p || pathname.startsWith(`${p}/`))) return NextResponse.next();
  const token = await getToken({ req, secret: process.env.NEXTAUTH_SECRET });
  if (token) return NextResponse.next();
  const url = req.nextUrl.clone();
  url.pathname = "/sign-in";
  url.search = pathname === "/" ? "" : `?callbackUrl=${encodeURIComponent(pathname + search)}`;
  return NextResponse.redirect(url);
}

export const config = {
  // Pages only: API routes answer 401 JSON themselves; static assets need no session.
  matcher: ["/((?!api/|_next/|favicon.ico|icon.svg|fonts/).*)"],
};
