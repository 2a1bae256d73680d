/**
 * Two instances behave as one: two web servers (scripts/serve.ts, as `npm start` runs it) and two
 * workers on one PostgreSQL and one object store, with the test run's own worker stopped
 * meanwhile. A session made on one server works on the other; the sign-in limit counts across
 * both (and with TRUSTED_PROXY_HOPS at its default 0, a made-up X-Forwarded-For does not escape
 * it); 20 claimers spread over both get every unit exactly once; photos finalised through one are
 * processed once, by one of the workers; the orphan sweep, scheduled every minute here, runs once
 * per minute, not once per worker. A third server configured for https shows the secure cookie
 * and HSTS, and a production start without NEXTAUTH_SECRET refuses to run.
 */
import { inArray, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { photos } from "@/db/schema";
import { createUser, createWorkspace, TEST_PASSWORD, uniqueEmail, workspaceBySlug } from "../support/db";
import { BASE_URL } from "../support/http";
import { startWebServer, startWorker, stopAll, logOf, type Instance } from "../support/instances";
import { createLotWithUnits, createPartTypeAndSupplier } from "../support/lot-fixtures";
import { makePhotoLikeJpeg } from "@/support/fixtures/make-photos";
import { createPhotoUnits } from "../support/photos";
import { serviceControl } from "../support/services";

const basePort = Number(new URL(BASE_URL).port);
let a: Instance, b: Instance, secure: Instance, w1: Instance, w2: Instance;
let suiteWorkerStopped = false;
let startedAt: Date;
/** Just before the two workers start; from then on only they run jobs (the suite's own worker is stopped). */
let workersFrom: Date;

beforeAll(async () => {
  await serviceControl("worker", "kill");
  suiteWorkerStopped = true;
  // Both workers keep the schedule and race for every minute's sweep (pg-boss checks every 30 s).
  const workerEnv = { PHOTO_SWEEP_CRON: "* * * * *" };
  // The default: no proxy trusted, the socket's address is the client (the test run's own server trusts one hop).
  const web = { TRUSTED_PROXY_HOPS: "0" };
  workersFrom = new Date();
  [a, b, secure, w1, w2] = await Promise.all([
    startWebServer("instance-a", basePort + 1, web),
    startWebServer("instance-b", basePort + 2, web),
    startWebServer("instance-https", basePort + 3, { ...web, APP_URL: `https://127.0.0.1:${basePort + 3}`, NEXTAUTH_URL: `https://127.0.0.1:${basePort + 3}` }),
    startWorker("worker-1", workerEnv),
    startWorker("worker-2", workerEnv),
  ]);
  startedAt = new Date();
}, 300_000);

afterAll(async () => {
  // Every server and worker started, also those of a start that failed half-way.
  await stopAll();
  if (suiteWorkerStopped) await serviceControl("worker", "start");
}, 60_000);

type Jar = Map<string, string>;
const cookieHeader = (jar: Jar) => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
function keepCookies(res: Response, jar: Jar) {
  for (const line of res.headers.getSetCookie()) {
    const [pair] = line.split(";");
    jar.set(pair.slice(0, pair.indexOf("=")), pair.slice(pair.indexOf("=") + 1));
  }
}

/** Sign-in through next-auth on one server, without any X-Forwarded-For unless given. */
async function signInOn(server: Instance, email: string, password: string, headers: Record<string, string> = {}) {
  const jar: Jar = new Map();
  const csrf = await fetch(`${server.url}/api/auth/csrf`, { headers });
  keepCookies(csrf, jar);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const res = await fetch(`${server.url}/api/auth/callback/credentials`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: cookieHeader(jar), ...headers },
    body: new URLSearchParams({ csrfToken, email, password, json: "true" }),
  });
  keepCookies(res, jar);
  const body = (await res.json().catch(() => ({}))) as { url?: string };
  return { jar, setCookies: res.headers.getSetCookie(), error: body.url ? new URL(body.url).searchParams.get("error") : null };
}

const call = (server: Instance, jar: Jar, method: string, path: string, body?: unknown) =>
  fetch(`${server.url}${path}`, {
    method,
    headers: { cookie: cookieHeader(jar), ...(body === undefined ? {} : { "content-type": "application/json" }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });

describe("two web servers and two workers on one database and one store", () => {
  it("a session made on one server is valid on the other", async () => {
    const { jar } = await signInOn(a, "inspector@vellmoor.example", "partproof-demo");
    const me = await call(b, jar, "GET", "/api/me");
    expect(me.status).toBe(200);
    expect(((await me.json()) as { user: { email: string } }).user.email).toBe("inspector@vellmoor.example");
  });

  it("the sign-in limit counts attempts on both servers together; a made-up X-Forwarded-For changes nothing", async () => {
    const ws = await createWorkspace();
    const user = await createUser({ workspaceId: ws.id, roles: ["inspector"] });
    for (let i = 0; i < 5; i++) {
      const server = i % 2 ? b : a;
      // With TRUSTED_PROXY_HOPS=0 the socket's address counts, whatever the client writes.
      const { error } = await signInOn(server, user.email, `wrong-${i}`, { "x-forwarded-for": `203.0.113.${100 + i}` });
      expect(error).toMatch(/not right/);
    }
    for (const server of [a, b]) expect((await signInOn(server, user.email, TEST_PASSWORD, { "x-forwarded-for": "198.51.100.222" })).error).toMatch(/Too many failed sign-in attempts/);
  });

  it("20 claimers spread over both servers get every unit exactly once", async () => {
    const ws = await createWorkspace();
    const lead = await createUser({ workspaceId: ws.id, roles: ["lead"] });
    const { partType, supplier } = await createPartTypeAndSupplier(ws.id);
    const lot = await createLotWithUnits({ workspaceId: ws.id, createdBy: lead.id, count: 60, partTypeId: partType.id, supplierId: supplier.id });
    const claimers = await Promise.all(
      Array.from({ length: 20 }, async (_, i) => {
        const user = await createUser({ workspaceId: ws.id, roles: ["inspector"], email: uniqueEmail(`claimer${i}`) });
        return { id: user.id, jar: (await signInOn(i % 2 ? b : a, user.email, TEST_PASSWORD)).jar };
      }),
    );
    const claimed = new Map<string, string[]>();
    await Promise.all(
      claimers.map(async (claimer, i) => {
        for (let n = 0; ; n++) {
          const res = await call((i + n) % 2 ? b : a, claimer.jar, "POST", "/api/queue/next", { lotId: lot.id });
          if (res.status === 204) return;
          expect(res.status).toBe(200);
          const { unit } = (await res.json()) as { unit: { id: string } };
          claimed.set(unit.id, [...(claimed.get(unit.id) ?? []), claimer.id]);
        }
      }),
    );
    expect([...claimed.values()].filter((who) => who.length > 1)).toEqual([]);
    expect(claimed.size).toBe(60);
    const { rows } = await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM units WHERE lot_id = ${lot.id} AND status = 'on_bench'`);
    expect(rows[0].n).toBe(60);
  });

  it("photos finalised through one server are processed once, by one of the two workers", async () => {
    const { jar } = await signInOn(b, "inspector@vellmoor.example", "partproof-demo");
    const [unitId] = (await createPhotoUnits({ slug: "vellmoor" })).unitIds;
    const ids: string[] = [];
    for (let i = 0; i < 4; i++) {
      const bytes = await makePhotoLikeJpeg({ width: 1600, height: 1200, seed: 900 + i });
      const intent = await call(a, jar, "POST", `/api/units/${unitId}/photos/uploads`, { viewKey: "front", fileName: `two-${i}.jpg`, contentType: "image/jpeg", bytes: bytes.length });
      expect(intent.status).toBe(201);
      const { ticket, upload } = (await intent.json()) as { ticket: string; upload: { url: string; headers: Record<string, string> } };
      expect((await fetch(upload.url, { method: "PUT", headers: upload.headers, body: new Uint8Array(bytes) })).status).toBe(200);
      const done = await call(a, jar, "POST", `/api/units/${unitId}/photos`, { ticket });
      expect(done.status).toBe(201);
      ids.push(((await done.json()) as { photo: { id: string; status: string } }).photo.id);
    }
    const rows = await db().select({ status: photos.status, attempts: photos.attempts }).from(photos).where(inArray(photos.id, ids));
    expect(rows.map((r) => [r.status, r.attempts])).toEqual(ids.map(() => ["ready", 1]));
    const logs = [logOf(w1), logOf(w2)];
    for (const id of ids) expect(logs.join("\n").match(new RegExp(`photo ${id}: ready`, "g"))).toHaveLength(1);
  });

  it("the orphan sweep, scheduled every minute, runs once per minute, not once per worker", { timeout: 150_000 }, async () => {
    // Both workers check the schedule (pg-boss, every 30 s) and race at each minute mark: wait
    // for the first mark at least 5 s after they started, plus that check and the polling.
    const firstMark = Math.ceil((startedAt.getTime() + 5_000) / 60_000) * 60_000;
    const wait = firstMark + 40_000 - Date.now();
    if (wait > 0) await new Promise((r) => setTimeout(r, wait));
    const { rows } = await db().execute<{ minute: string; n: number }>(
      sql`SELECT date_trunc('minute', created_on)::text AS minute, count(*)::int AS n FROM pgboss.job WHERE name = 'photo-sweep' AND created_on >= ${startedAt} GROUP BY 1 ORDER BY 1`,
    );
    expect(rows.length).toBeGreaterThanOrEqual(1);
    expect(rows.every((r) => r.n === 1)).toBe(true);
    const runs = (logOf(w1).match(/orphan sweep:/g)?.length ?? 0) + (logOf(w2).match(/orphan sweep:/g)?.length ?? 0);
    // Every sweep the two workers ran, also one queued before they started (so counted by completion).
    const { rows: done } = await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'photo-sweep' AND completed_on >= ${workersFrom} AND state = 'completed'`);
    expect(runs).toBe(done[0].n);
    expect(runs).toBeGreaterThanOrEqual(rows.length - 1);
  });
});

describe("a server configured for https", () => {
  it("issues only the __Secure- session cookie, marked Secure, sends HSTS, and ignores a cookie of the plain name", async () => {
    const vellmoor = await workspaceBySlug("vellmoor");
    const user = await createUser({ workspaceId: vellmoor.id, roles: ["inspector"] });
    const { jar, setCookies } = await signInOn(secure, user.email, TEST_PASSWORD);
    const session = setCookies.find((c) => c.includes("session-token"))!;
    expect(session).toMatch(/^__Secure-next-auth\.session-token=/);
    expect(session).toMatch(/;\s*Secure/i);
    const me = await call(secure, jar, "GET", "/api/me");
    expect(me.status).toBe(200);
    expect(me.headers.get("strict-transport-security")).toMatch(/max-age=\d+/);
    // The same token under the plain name (as planted over http) is not a session here.
    const token = jar.get("__Secure-next-auth.session-token")!;
    const planted = await fetch(`${secure.url}/api/me`, { headers: { cookie: `next-auth.session-token=${token}` } });
    expect(planted.status).toBe(401);
  });
});

describe("a production start", () => {
  it("refuses to run without NEXTAUTH_SECRET and says why, before answering anyone", async () => {
    const production = { NEXTAUTH_SECRET: "", APP_URL: "https://qc.partproof.example", NEXTAUTH_URL: "https://qc.partproof.example" };
    await expect(startWebServer("instance-no-secret", basePort + 4, production)).rejects.toThrow(/exited \(1\)[\s\S]*NEXTAUTH_SECRET is not set[\s\S]*production start/);
  });
});
