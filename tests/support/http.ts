/** HTTP helpers for integration tests against the running test server (real auth, real DB). */
export const BASE_URL = process.env.TEST_BASE_URL ?? "http://127.0.0.1:3100";

export type Session = { cookie: string; email: string };

/**
 * The client address this test file acts as. The test server trusts one proxy hop
 * (TRUSTED_PROXY_HOPS=1 in scripts/test.ts), so X-Forwarded-For names the client, and each file
 * gets its own address (from 198.18.0.0/15, the benchmarking range): the per-address limits of
 * one file never spill into another. Tests of those limits pass addresses of their own.
 */
export const FILE_CLIENT_ADDRESS = `198.18.${Math.floor(Math.random() * 256)}.${1 + Math.floor(Math.random() * 254)}`;
const asClient = (headers: Record<string, string>) => ({ "x-forwarded-for": FILE_CLIENT_ADDRESS, ...headers });

function cookiesFrom(res: Response, jar: Map<string, string>) {
  for (const line of res.headers.getSetCookie()) {
    const [pair] = line.split(";");
    const eq = pair.indexOf("=");
    jar.set(pair.slice(0, eq), pair.slice(eq + 1));
  }
}
const header = (jar: Map<string, string>) => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");

/** Signs in through next-auth's credentials endpoint, as the browser form does. */
export async function trySignIn(email: string, password: string, headers: Record<string, string> = {}) {
  const jar = new Map<string, string>();
  const csrfRes = await fetch(`${BASE_URL}/api/auth/csrf`, { headers: asClient(headers) });
  cookiesFrom(csrfRes, jar);
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const res = await fetch(`${BASE_URL}/api/auth/callback/credentials`, {
    method: "POST",
    redirect: "manual",
    headers: asClient({ "content-type": "application/x-www-form-urlencoded", cookie: header(jar), ...headers }),
    body: new URLSearchParams({ csrfToken, email, password, json: "true" }),
  });
  cookiesFrom(res, jar);
  const body = (await res.json().catch(() => ({}))) as { url?: string };
  const error = body.url ? new URL(body.url).searchParams.get("error") : null;
  const signedIn = [...jar.keys()].some((k) => k.endsWith("next-auth.session-token"));
  return { signedIn, error, session: signedIn ? ({ cookie: header(jar), email } as Session) : null };
}

const sessions = new Map<string, Session>();

/** A signed-in session (cached per account: argon2 makes each sign-in cost ~100 ms). */
export async function signIn(email: string, password = "partproof-demo"): Promise<Session> {
  const cached = sessions.get(email);
  if (cached) return cached;
  const result = await trySignIn(email, password);
  if (!result.session) throw new Error(`Sign-in as ${email} failed: ${result.error}`);
  sessions.set(email, result.session);
  return result.session;
}

export function forgetSession(email: string) {
  sessions.delete(email);
}

export type ApiResult<T = Record<string, unknown>> = { status: number; body: T; headers: Headers };

export async function api<T = Record<string, unknown>>(session: Session | null, method: string, path: string, body?: unknown, extraHeaders: Record<string, string> = {}): Promise<ApiResult<T>> {
  const headers: Record<string, string> = { ...extraHeaders };
  if (session) headers.cookie = session.cookie;
  let payload: string | undefined;
  if (body !== undefined) {
    headers["content-type"] ??= "application/json";
    payload = typeof body === "string" ? body : JSON.stringify(body);
  }
  const res = await fetch(`${BASE_URL}${path}`, { method, headers: asClient(headers), body: payload, redirect: "manual" });
  const text = await res.text();
  let parsed: unknown = text;
  try {
    parsed = text ? JSON.parse(text) : null;
  } catch {
    /* not JSON */
  }
  return { status: res.status, body: parsed as T, headers: res.headers };
}

/** The body of an API answer that must have `status` (default 200); otherwise fails naming `what`, the status and the body. */
export async function ok<T>(res: Promise<{ status: number; body: T }>, what: string, status = 200): Promise<T> {
  const r = await res;
  if (r.status !== status) throw new Error(`${what} → ${r.status}: ${JSON.stringify(r.body)}`);
  return r.body;
}
