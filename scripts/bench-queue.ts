/**
 * `npm run bench:queue`: load on the queue of the RUNNING production app (start it first with
 * `npm start`). Loopback only, bounded in count and time. It creates (or resets) a workspace
 * "Queue bench (generated)" in the demo database with 50 inspectors and its own lots, then:
 *   1. 50 concurrent HTTP clients take next and submit (measure + accept the grade) as fast as
 *      they can → duplicates (must be 0) and saturated throughput;
 *   2. an offered load of 100 claims/s (open loop) → p50/p95 claim latency (target p95 <= 25 ms);
 *   3. the list API over 100 000 units, 10 concurrent connections, keyset pages of 50
 *      → p50/p95 page latency (target p95 <= 50 ms).
 * Requests are timed with node:http keep-alive sockets, and the tables a phase wrote are vacuumed
 * before the next one starts, so each figure is the phase's own.
 */
import fs from "node:fs";
import path from "node:path";
import { hash } from "@node-rs/argon2";
import pg from "pg";
import { benchClient, signIn as signInAs } from "./lib/bench-http";
import { benchLotPlan } from "./lib/bench-plan";
import { databaseUrl, demoSettings, projectRoot } from "./lib/settings";

const settings = demoSettings();
const BASE = process.env.BENCH_BASE_URL ?? settings.app.url;
if (!/^http:\/\/(127\.0\.0\.1|localhost)(:\d+)?$/.test(BASE)) throw new Error("bench:queue only runs against a loopback URL.");
const INSPECTORS = 50;
const SATURATION_UNITS = 2_000;
const SATURATION_SECONDS = 30;
const OFFERED_RATE = 100;
const OFFERED_SECONDS = 10;
const LIST_UNITS = 100_000;
const LIST_CONNECTIONS = 10;
// 10 × 200 pages of 50 lists 100 000 rows in all, about 5 s. With 60 pages (2 s) one pause of
// half a second (a major GC in the app, an autovacuum) was a quarter of the phase and moved the
// p95 between 40 and 95 ms from run to run. BENCH_LIST_PAGES=60 repeats the short phase.
const LIST_PAGES_PER_CONNECTION = Number(process.env.BENCH_LIST_PAGES ?? 200);
const PASSWORD = "queue-bench-password";

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL ?? databaseUrl(settings), max: 4 });

function percentile(values: number[], p: number): number {
  if (!values.length) return NaN;
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}
const ms = (v: number) => `${v.toFixed(1)} ms`;

async function setUp() {
  const c = await pool.connect();
  try {
    await c.query("BEGIN");
    let { rows } = await c.query("SELECT id FROM workspaces WHERE slug = 'queue-bench'");
    if (!rows[0]) ({ rows } = await c.query("INSERT INTO workspaces (name, slug) VALUES ('Queue bench (generated)', 'queue-bench') RETURNING id"));
    const ws = rows[0].id as string;
    // Grades are append-only, so earlier runs' work stays; each run gets a fresh work lot and
    // reuses the 100 000-unit list lot.
    const passwordHash = await hash(PASSWORD);
    const emails: string[] = [];
    for (let i = 1; i <= INSPECTORS + 1; i++) {
      const email = i <= INSPECTORS ? `bench-inspector-${i}@queue-bench.example` : "bench-lead@queue-bench.example";
      emails.push(email);
      await c.query(
        `INSERT INTO users (workspace_id, email, name, password_hash, roles) VALUES ($1, $2, $3, $4, $5)
         ON CONFLICT (email) WHERE password_hash IS NOT NULL DO UPDATE SET password_hash = EXCLUDED.password_hash, active = true`,
        [ws, email, i <= INSPECTORS ? `Bench inspector ${i}` : "Bench lead", passwordHash, i <= INSPECTORS ? ["inspector"] : ["lead"]],
      );
    }
    const lead = (await c.query("SELECT id FROM users WHERE email = 'bench-lead@queue-bench.example'")).rows[0].id;
    let pt = (await c.query("SELECT id FROM part_types WHERE workspace_id = $1 AND slug = 'bench-part'", [ws])).rows[0];
    if (!pt) {
      pt = (
        await c.query(
          `INSERT INTO part_types (workspace_id, slug, name, category, views, defect_classes, checklist)
           VALUES ($1, 'bench-part', 'Bench part', 'flex', '[{"key":"front","label":"Front","required":false,"zones":[]}]', '[{"key":"scratch","label":"Scratch","severity":"minor"}]', '[]') RETURNING id`,
          [ws],
        )
      ).rows[0];
    }
    const rubric = { rules: [{ id: "bench-scratch", metric: "count", defect: "scratch", comparison: ">", threshold: 3, grade: "B" }], notes: ["Generated for the queue benchmark."] };
    await c.query(
      `INSERT INTO rubric_versions (workspace_id, part_type_id, version, status, rubric, created_by, published_by, published_at)
       SELECT $1, $2, 1, 'published', $3, $4, $4, now() WHERE NOT EXISTS (SELECT 1 FROM rubric_versions WHERE part_type_id = $2)`,
      [ws, pt.id, JSON.stringify(rubric), lead],
    );
    let sup = (await c.query("SELECT id FROM suppliers WHERE workspace_id = $1", [ws])).rows[0];
    if (!sup) sup = (await c.query("INSERT INTO suppliers (workspace_id, name, contact_email) VALUES ($1, 'Bench supplier', 'bench@supplier.example') RETURNING id", [ws])).rows[0];
    const plan = (n: number) => JSON.stringify(benchLotPlan(n, "queue benchmark"));
    async function lotWithUnits(ref: string, n: number, due: string) {
      const lot = (
        await c.query(
          `INSERT INTO lots (workspace_id, supplier_id, part_type_id, purchase_ref, quantity, received_on, due_on, inspection_level, aql_major, aql_minor, inspection_severity, plan, created_by)
           VALUES ($1, $2, $3, $4, $5, '2026-12-01', $6, 'II', 1, 2.5, 'normal', $7, $8) RETURNING id, created_at`,
          [ws, sup.id, pt.id, ref, n, due, plan(n), lead],
        )
      ).rows[0];
      await c.query(
        `INSERT INTO units (workspace_id, lot_id, sample_index, serial, part_type_id, supplier_id, lot_due_on, lot_received_on, lot_created_at)
         SELECT $1, $2, g, 'QB-' || $3 || '-' || lpad(g::text, 6, '0'), $4, $5, $6, '2026-12-01', $7 FROM generate_series(1, $8) g`,
        [ws, lot.id, ref, pt.id, sup.id, due, lot.created_at, n],
      );
      return lot.id as string;
    }
    // Earlier runs' work lots are closed as a lead's decision closes a lot (lib/lots/lots.ts
    // decideLot): their units not yet graded leave the queue and any bench, so no lease of
    // theirs expires during this run and no claim walks past them (this workspace's generated data only).
    await c.query(
      `UPDATE units SET status = 'not_graded', lease_holder_id = NULL, lease_expires_at = NULL, claimed_at = NULL, updated_at = now()
       WHERE workspace_id = $1 AND status IN ('queued', 'on_bench') AND lot_id IN (SELECT id FROM lots WHERE workspace_id = $1 AND purchase_ref LIKE 'WORK-%')`,
      [ws],
    );
    await c.query("UPDATE lots SET status = 'decided' WHERE workspace_id = $1 AND purchase_ref LIKE 'WORK-%' AND status = 'open'", [ws]);
    const workLot = await lotWithUnits(`WORK-${Date.now().toString(36)}`, SATURATION_UNITS + OFFERED_RATE * OFFERED_SECONDS + 500, "2026-12-05");
    // Each work unit gets one processed photo with no regions (a clean unit, grade A), so a
    // submit is the real measure + grade path. The rows name no real objects: this workspace
    // exists only for the benchmark.
    await c.query(
      `INSERT INTO photos (id, workspace_id, unit_id, view_key, status, original_key, preview_key, thumbnail_key, content_type, file_name, bytes, sha256, format, width, height, uploaded_by, processed_at)
       SELECT gen_random_uuid(), $1, u.id, 'front', 'ready', 'bench/' || u.id || '/o', 'bench/' || u.id || '/p', 'bench/' || u.id || '/t', 'image/jpeg', 'bench.jpg', 1000, md5(u.id::text), 'jpeg', 4000, 3000, $2, now()
       FROM units u WHERE u.lot_id = $3`,
      [ws, lead, workLot],
    );
    const existingList = (await c.query("SELECT id FROM lots WHERE workspace_id = $1 AND purchase_ref = 'LIST' AND status = 'open'", [ws])).rows[0];
    const listLot = existingList ? (existingList.id as string) : await lotWithUnits("LIST", LIST_UNITS, "2026-12-31");
    await c.query("COMMIT");
    // The set-up's own churn (earlier runs' units withdrawn, thousands inserted) leaves dead index
    // entries at the head of the queue order until autovacuum comes by; clear them so the phases
    // measure the workload, not the set-up.
    await c.query("VACUUM (ANALYZE) units");
    return { emails, workLot, listLot };
  } catch (err) {
    await c.query("ROLLBACK");
    throw err;
  } finally {
    c.release();
  }
}

const signIn = (email: string) => signInAs(BASE, email, PASSWORD);
const { request, close: closeClient } = benchClient(BASE, INSPECTORS);

async function timed<T>(fn: () => Promise<T>): Promise<[T, number]> {
  const t0 = performance.now();
  const v = await fn();
  return [v, performance.now() - t0];
}

async function claim(cookie: string, lotId: string) {
  const res = await request("POST", "/api/queue/next", { cookie, json: { lotId } });
  if (res.status === 204) return null;
  if (res.status !== 200) throw new Error(`claim answered ${res.status}: ${res.text}`);
  return (JSON.parse(res.text) as { unit: { id: string } }).unit.id;
}

async function submit(cookie: string, unitId: string) {
  const measure = await request("POST", `/api/units/${unitId}/measure`, { cookie });
  if (measure.status < 200 || measure.status > 299) throw new Error(`measure answered ${measure.status}: ${measure.text}`);
  const grade = await request("POST", `/api/units/${unitId}/grades`, { cookie, json: { decision: "accept" } });
  if (grade.status !== 201) throw new Error(`grade answered ${grade.status}: ${grade.text}`);
}

async function saturated(cookies: string[], lotId: string) {
  const seen = new Map<string, number>();
  const deadline = Date.now() + SATURATION_SECONDS * 1000;
  let claimed = 0;
  const t0 = performance.now();
  await Promise.all(
    cookies.map(async (cookie) => {
      while (Date.now() < deadline && claimed < SATURATION_UNITS) {
        const id = await claim(cookie, lotId);
        if (!id) return;
        claimed++;
        seen.set(id, (seen.get(id) ?? 0) + 1);
        await submit(cookie, id);
      }
    }),
  );
  const seconds = (performance.now() - t0) / 1000;
  const duplicates = [...seen.values()].filter((n) => n > 1).length;
  console.log(`1. saturated: ${INSPECTORS} clients, ${claimed} units taken and submitted in ${seconds.toFixed(1)} s`);
  console.log(`   duplicates: ${duplicates} (must be 0)`);
  console.log(`   throughput: ${(claimed / seconds).toFixed(1)} units/s (take next + measure + grade each)`);
  return duplicates;
}

async function offered(cookies: string[], lotId: string) {
  const latencies: number[] = [];
  const total = OFFERED_RATE * OFFERED_SECONDS;
  const start = performance.now();
  const pending: Promise<void>[] = [];
  for (let i = 0; i < total; i++) {
    const due = start + (i * 1000) / OFFERED_RATE;
    const wait = due - performance.now();
    if (wait > 0) await new Promise((r) => setTimeout(r, wait));
    pending.push(timed(() => claim(cookies[i % cookies.length], lotId)).then(([, t]) => void latencies.push(t)));
  }
  await Promise.all(pending);
  const achieved = total / ((performance.now() - start) / 1000);
  console.log(`2. offered load: ${OFFERED_RATE} claims/s for ${OFFERED_SECONDS} s (achieved ${achieved.toFixed(1)}/s)`);
  console.log(`   claim latency p50 ${ms(percentile(latencies, 50))}, p95 ${ms(percentile(latencies, 95))} (target p95 <= 25 ms), max ${ms(Math.max(...latencies))}`);
}

async function listing(cookie: string, lotId: string) {
  const latencies: number[] = [];
  const started = performance.now();
  await Promise.all(
    Array.from({ length: LIST_CONNECTIONS }, async () => {
      let cursor: string | null = null;
      for (let page = 0; page < LIST_PAGES_PER_CONNECTION; page++) {
        const url: string = `/api/queue?lotId=${lotId}&limit=50${cursor ? `&cursor=${cursor}` : ""}`;
        const [body, t]: [{ units: unknown[]; nextCursor: string | null }, number] = await timed(async () => {
          const res = await request("GET", url, { cookie });
          if (res.status !== 200) throw new Error(`list answered ${res.status}`);
          return JSON.parse(res.text) as { units: unknown[]; nextCursor: string | null };
        });
        latencies.push(t);
        cursor = body.nextCursor;
        if (!cursor) break;
      }
    }),
  );
  const seconds = (performance.now() - started) / 1000;
  console.log(`3. list API over ${LIST_UNITS.toLocaleString("en")} units: ${LIST_CONNECTIONS} connections, ${latencies.length} keyset pages of 50`);
  console.log(
    `   page latency p50 ${ms(percentile(latencies, 50))}, p95 ${ms(percentile(latencies, 95))} (target p95 <= 50 ms), p99 ${ms(percentile(latencies, 99))};` +
      ` ${(latencies.length / seconds).toFixed(0)} pages/s`,
  );
}

async function main() {
  const health = await fetch(`${BASE}/api/health`)
    .then((r) => r.json())
    .catch(() => null);
  if (health?.app !== "partproof") throw new Error(`No Partproof app answers at ${BASE}; start it with \`npm start\` first.`);
  if (!fs.existsSync(path.join(projectRoot, ".next", "BUILD_ID"))) console.warn("warning: no production build found in .next");
  console.log("Setting up the bench workspace …");
  const { emails, workLot, listLot } = await setUp();
  const cookies = await Promise.all(emails.slice(0, INSPECTORS).map(signIn));
  // Warm up the route handlers (JIT) and the app's connection pool, ten clients at once as a busy
  // app would have it, then let the set-up's writes settle.
  await Promise.all(
    Array.from({ length: 10 }, async (_, client) => {
      for (let i = client; i < 200; i += 10) {
        await request("GET", `/api/queue?lotId=${listLot}&limit=50`, { cookie: cookies[i % cookies.length] });
        const id = await claim(cookies[i % cookies.length], workLot);
        if (id) await request("DELETE", `/api/units/${id}/lease`, { cookie: cookies[i % cookies.length] });
      }
    }),
  );
  await new Promise((r) => setTimeout(r, 5000));
  // BENCH_PHASES=offered,list runs a subset.
  const phases = (process.env.BENCH_PHASES ?? "saturated,offered,list").split(",");
  // Each phase leaves a few thousand updated units and new log rows; autovacuum and auto-analyze
  // then ran during the next phase (seen in the PostgreSQL log) and took its CPU. Vacuuming them
  // here starts every phase from the same state; the pause lets the app's own work settle.
  const settle = async () => {
    await pool.query("VACUUM (ANALYZE) units, activity_log, grades, measurements");
    await new Promise((r) => setTimeout(r, 3000));
  };
  const duplicates = phases.includes("saturated") ? await saturated(cookies, workLot) : 0;
  if (phases.includes("offered")) {
    await settle();
    await offered(cookies, workLot);
  }
  if (phases.includes("list")) {
    await settle();
    await listing(cookies[0], listLot);
  }
  await pool.end();
  closeClient();
  if (duplicates) process.exit(1);
}

main().catch(async (err) => {
  console.error(err instanceof Error ? err.message : err);
  await pool.end();
  process.exit(1);
});
