import "server-only";
/**
 * What every /api answer goes through before its handler (lib/http/route.ts's handler(), and
 * next-auth's and the health check's routes directly): cross-site writes and non-JSON bodies are
 * refused (lib/http/request-guard.ts), and HSTS is added when the app is served over https.
 *
 * Why here and not in proxy.ts: for a request the proxy sees, Next.js copies the body for the
 * proxy and holds the route back until the whole body has arrived (next/dist/server/body-streams.js,
 * getCloneableBody), so a route could no longer answer 413 while an oversized body is still being
 * sent. proxy.ts therefore leaves /api alone. The request-independent headers of /api answers
 * (nosniff, the policies, a CSP that allows nothing) come from next.config.ts, which also covers
 * paths no route answers.
 */
import { servedOverHttps } from "@/lib/auth/cookies";
import { env } from "@/lib/env";
import { appOrigins, crossSiteRefusal } from "./request-guard";
import { staticSecurityHeaders } from "./security-headers";

function refusal(req: Request): Response | null {
  const appUrl = env().APP_URL;
  const https = servedOverHttps(appUrl);
  const found = crossSiteRefusal({
    method: req.method,
    pathname: new URL(req.url).pathname,
    headers: req.headers,
    allowedOrigins: appOrigins({ appUrl, host: req.headers.get("host"), https }),
  });
  return found && Response.json({ error: { code: found.code, message: found.message } }, { status: found.status });
}

/** HSTS on an https deployment (next.config.ts cannot know the deployment's scheme at build time). */
function withTransportSecurity(res: Response): Response {
  const hsts = staticSecurityHeaders({ https: servedOverHttps(env().APP_URL) })["Strict-Transport-Security"];
  if (!hsts) return res;
  try {
    res.headers.set("Strict-Transport-Security", hsts);
    return res;
  } catch {
    // A response with immutable headers (Response.redirect): copy it.
    const copy = new Response(res.body, res);
    copy.headers.set("Strict-Transport-Security", hsts);
    return copy;
  }
}

/** Wraps an /api route function: the refusal if there is one, else its own answer; HSTS on both. */
export function guardedRoute<A extends unknown[]>(fn: (req: Request, ...rest: A) => Promise<Response>) {
  return async (req: Request, ...rest: A): Promise<Response> => withTransportSecurity(refusal(req) ?? (await fn(req, ...rest)));
}
