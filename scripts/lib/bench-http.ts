/**
 * The HTTP client of the load benchmarks (scripts/bench-queue.ts, bench/scorecards-api.ts,
 * bench/gallery-list.ts): a signed-in session's cookie and timed requests over node:http with
 * keep-alive sockets — fetch (undici) cost about a third of a core at these rates, CPU that the app
 * and PostgreSQL on the same 2 cores then lacked.
 */
import http from "node:http";

export type BenchResponse = { status: number; text: string };

/** Signs in through next-auth's credentials callback; the cookie header of the session. */
export async function signIn(baseUrl: string, email: string, password: string): Promise<string> {
  const csrfRes = await fetch(`${baseUrl}/api/auth/csrf`);
  const jar = csrfRes.headers.getSetCookie().map((c) => c.split(";")[0]);
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const res = await fetch(`${baseUrl}/api/auth/callback/credentials`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: jar.join("; ") },
    body: new URLSearchParams({ csrfToken, email, password, json: "true" }),
  });
  const cookies = [...jar, ...res.headers.getSetCookie().map((c) => c.split(";")[0])];
  if (!cookies.some((c) => c.includes("session-token"))) throw new Error(`Sign-in failed for ${email}`);
  return cookies.join("; ");
}

/** Requests over at most `maxSockets` kept-alive connections to `baseUrl`; `close` ends the sockets so the script can exit. */
export function benchClient(baseUrl: string, maxSockets: number) {
  const agent = new http.Agent({ keepAlive: true, maxSockets });
  const base = new URL(baseUrl);
  function request(method: string, pathname: string, { cookie, json }: { cookie: string; json?: unknown }): Promise<BenchResponse> {
    const body = json === undefined ? undefined : JSON.stringify(json);
    const headers: Record<string, string> = { cookie };
    if (body !== undefined) Object.assign(headers, { "content-type": "application/json", "content-length": String(Buffer.byteLength(body)) });
    return new Promise((resolve, reject) => {
      const req = http.request({ host: base.hostname, port: base.port, path: pathname, method, agent, headers }, (res) => {
        let text = "";
        res.setEncoding("utf8");
        res.on("data", (chunk) => (text += chunk));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, text }));
        res.on("error", reject);
      });
      req.on("error", reject);
      req.end(body);
    });
  }
  return { request, close: () => agent.destroy() };
}
