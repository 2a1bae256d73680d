/**
 * The scorecards API under load, against the RUNNING production app (`npm start` first; loopback
 * only). Creates (or reuses) a workspace "Scorecards bench (generated)" in the demo database with
 * 100 000 graded units (20 graders over the last 12 weeks) and 5 000 submitted rechecks (one
 * grade in 20, 250 per grader, three auditors, about one in seven a step apart, each with a class IoU), then 5
 * keep-alive connections as a lead ask GET /api/recheck/scorecards for the default period (the
 * last 12 weeks: every grade and recheck) and for the last 4 weeks. Prints p50 / p95 / p99;
 * target p95 <= 200 ms at 5 connections. Without a running app it says so and measures nothing.
 * Rows are made in SQL (generate_series), not through the app: the bench measures the read (the
 * rechecks' class rows, recheck_class_scores, are written by the same trigger as in the app).
 * The default period is the one /recheck/scorecards opens with (lib/recheck/scorecards-read.ts).
 * The generated comparisons repeat (60 distinct ones), which flattered the former read that
 * expanded each comparison's JSON (PostgreSQL memoized it); the class rows do not depend on that.
 */
import { hash } from "@node-rs/argon2";
import pg from "pg";
import { benchClient, signIn as signInAs } from "../scripts/lib/bench-http";
import { databaseUrl, demoSettings } from "../scripts/lib/settings";
import { benchLotPlan } from "../scripts/lib/bench-plan";

const settings = demoSettings();
const BASE = process.env.BENCH_BASE_URL ?? settings.app.url;
if (!/^http:\/\/(127\.0\.0\.1|localhost)(:\d+)?$/.test(BASE)) throw new Error("bench scorecards-api only runs against a loopback URL.");
const UNITS = 100_000;
const RECHECK_EVERY = 20; // 100 000 / 20 = 5 000 rechecks
const GRADERS = 20;
const CONNECTIONS = Number(process.env.BENCH_SCORECARDS_CONNECTIONS ?? 5);
const REQUESTS = Number(process.env.BENCH_SCORECARDS_REQUESTS ?? 40);
const PASSWORD = "scorecards-bench-password";
const LEAD = "bench-lead@scorecards-bench.example";

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL ?? databaseUrl(settings), max: 2 });
const percentile = (values: number[], p: number) => [...values].sort((a, b) => a - b)[Math.min(values.length - 1, Math.ceil((p / 100) * values.length) - 1)];
const ms = (v: number) => `${v.toFixed(1)} ms`;

async function setUp() {
  const c = await pool.connect();
  try {
    await c.query("BEGIN");
    let { rows } = await c.query("SELECT id FROM workspaces WHERE slug = 'scorecards-bench'");
    if (!rows[0]) ({ rows } = await c.query("INSERT INTO workspaces (name, slug) VALUES ('Scorecards bench (generated)', 'scorecards-bench') RETURNING id"));
    const ws = rows[0].id as string;
    const passwordHash = await hash(PASSWORD);
    const people: [string, string, string | null][] = [
      [LEAD, "lead", passwordHash],
      ...Array.from({ length: 3 }, (_, i): [string, string, null] => [`bench-auditor-${i + 1}@scorecards-bench.example`, "auditor", null]),
      ...Array.from({ length: GRADERS }, (_, i): [string, string, null] => [`bench-grader-${String(i + 1).padStart(2, "0")}@scorecards-bench.example`, "inspector", null]),
    ];
    for (const [email, role, pw] of people) {
      await c.query(
        `INSERT INTO users (workspace_id, email, name, password_hash, roles) VALUES ($1, $2, $3, $4, $5) ON CONFLICT (workspace_id, email) DO UPDATE SET password_hash = EXCLUDED.password_hash, active = true`,
        [ws, email, `Bench ${email.split("@")[0].slice(6)}`, pw, [role]],
      );
    }
    const ids = async (role: string) => (await c.query("SELECT id FROM users WHERE workspace_id = $1 AND $2 = ANY(roles) ORDER BY email", [ws, role])).rows.map((r) => r.id as string);
    const [lead] = await ids("lead");
    const graders = await ids("inspector");
    const auditors = await ids("auditor");
    const have = Number((await c.query("SELECT count(*) FROM grades WHERE workspace_id = $1", [ws])).rows[0].count);
    if (have === 0) {
      const pt = (
        await c.query(
          `INSERT INTO part_types (workspace_id, slug, name, category, views, defect_classes, checklist) VALUES ($1, 'scorecards-bench-part', 'Scorecards bench part', 'housing', $2, $3, '[]')
         ON CONFLICT (workspace_id, slug) DO UPDATE SET name = EXCLUDED.name RETURNING id`,
          [
            ws,
            JSON.stringify([{ key: "front", label: "Front", required: true, zones: [] }]),
            JSON.stringify([
              { key: "scratch", label: "Scratch", severity: "minor" },
              { key: "dent", label: "Dent", severity: "minor" },
            ]),
          ],
        )
      ).rows[0].id as string;
      // A published version is immutable (a trigger refuses any UPDATE, even a no-op upsert): reuse it when it is there.
      const existing = (await c.query("SELECT id FROM rubric_versions WHERE part_type_id = $1 AND version = 1", [pt])).rows[0];
      const rv = (
        existing ??
        (
          await c.query(
            `INSERT INTO rubric_versions (workspace_id, part_type_id, version, status, rubric, published_at, published_by) VALUES ($1, $2, 1, 'published', '{"rules":[],"notes":[]}', now(), $3) RETURNING id`,
            [ws, pt, lead],
          )
        ).rows[0]
      ).id as string;
      const sup = (await c.query(`INSERT INTO suppliers (workspace_id, name, contact_email) VALUES ($1, 'Bench supplier (generated)', 'bench@scorecards-bench.example') RETURNING id`, [ws])).rows[0]
        .id as string;
      // 100 lots of 1 000 units each (one transaction: a run either made all of it or nothing).
      await c.query(
        `INSERT INTO lots (workspace_id, supplier_id, part_type_id, purchase_ref, quantity, received_on, due_on, inspection_level, aql_major, aql_minor, inspection_severity, plan, created_by)
         SELECT $1, $2, $3, 'SB-' || n, 1000, current_date - 84, current_date - 80, 'II', 1.0, 2.5, 'normal', $6, $4 FROM generate_series(1, $5::int) n`,
        [ws, sup, pt, lead, UNITS / 1000, JSON.stringify(benchLotPlan(1000, "Scorecards bench (generated)"))],
      );
      await c.query(
        `INSERT INTO units (workspace_id, lot_id, sample_index, serial, status, part_type_id, supplier_id, lot_due_on, lot_received_on, lot_created_at, graded_at)
         SELECT $1, l.id, s.i, l.purchase_ref || '-' || s.i, 'graded', $2, $3, l.due_on, l.received_on, l.created_at, now()
         FROM lots l CROSS JOIN generate_series(1, 1000) s(i) WHERE l.workspace_id = $1`,
        [ws, pt, sup],
      );
      // Grade k: grader k mod 20, spread evenly over the last 84 days, grades mostly A.
      await c.query(
        `INSERT INTO grades (workspace_id, unit_id, kind, proposed_grade, final_grade, rubric_version_id, measurement_ids, explanation, regions_versions, graded_by, created_at)
         SELECT $1, u.id, 'inspection', g.grade, g.grade, $2, '{}', '{"lines":[],"notes":[]}', '{}', ($3::uuid[])[1 + u.k % $4], now() - make_interval(secs => u.k * (84 * 86400.0 / $5))
         FROM (SELECT id, row_number() OVER (ORDER BY lot_id, sample_index) - 1 AS k FROM units WHERE workspace_id = $1) u
         CROSS JOIN LATERAL (SELECT CASE WHEN (u.k * 7 + u.k / 20) % 20 < 12 THEN 'A' WHEN (u.k * 7 + u.k / 20) % 20 < 17 THEN 'B' WHEN (u.k * 7 + u.k / 20) % 20 < 19 THEN 'C' ELSE 'Reject' END AS grade) g`,
        [ws, rv, graders, GRADERS, UNITS],
      );
      const draw = (await c.query(`INSERT INTO recheck_draws (workspace_id, trigger, seed, algorithm, input, outcome) VALUES ($1, 'scheduled', '1', 'bench-generated', '{}', '{}') RETURNING id`, [ws]))
        .rows[0].id as string;
      // One grade in 20 is rechecked, each grader's in turn; one in seven a step apart (a step up, or down from Reject).
      await c.query(
        `INSERT INTO rechecks (workspace_id, unit_id, grade_id, first_grader_id, first_grade, first_graded_at, part_type_id, rubric_version_id, reason, draw_id, status, auditor_id, measurement, proposed_grade, recheck_grade, comparison, adjudication_reasons, submitted_at, created_at)
         SELECT $1, g.unit_id, g.id, g.graded_by, g.final_grade, g.created_at, $2, $3, 'rate', $4, CASE WHEN r.grade = g.final_grade THEN 'agreed' ELSE 'adjudication' END, ($5::uuid[])[1 + g.k % 3], '{}', r.grade, r.grade,
                jsonb_build_object('classes', jsonb_build_object('scratch', jsonb_build_object('iou', 0.35 + (g.k % 60) / 100.0, 'unionPx', 400 + g.k % 300), 'dent', jsonb_build_object('iou', 0.5 + (g.k % 40) / 100.0, 'unionPx', 200))),
                '[]', g.created_at + interval '1 day', g.created_at + interval '1 minute'
         FROM (SELECT id, unit_id, graded_by, final_grade, created_at, row_number() OVER (ORDER BY created_at, id) - 1 AS k FROM grades WHERE workspace_id = $1) g
         CROSS JOIN LATERAL (SELECT CASE WHEN (g.k / $6) % 7 <> 0 THEN g.final_grade WHEN g.final_grade = 'A' THEN 'B' WHEN g.final_grade = 'B' THEN 'C' WHEN g.final_grade = 'C' THEN 'Reject' ELSE 'C' END AS grade) r
         WHERE g.k % $6 = (g.k / $6) % $6`,
        [ws, pt, rv, draw, auditors, RECHECK_EVERY],
      );
    }
    await c.query("COMMIT");
    // What autovacuum does on a live database; the per-day counts take one UPDATE per grade above,
    // and the class rows (written by the rechecks' trigger) are new: both need their statistics.
    await c.query("VACUUM (ANALYZE) grades, rechecks, recheck_class_scores, grader_day_counts");
    const counts = (await c.query("SELECT (SELECT count(*) FROM grades WHERE workspace_id = $1) AS grades, (SELECT count(*) FROM rechecks WHERE workspace_id = $1) AS rechecks", [ws])).rows[0];
    return { grades: Number(counts.grades), rechecks: Number(counts.rechecks) };
  } catch (err) {
    await c.query("ROLLBACK");
    throw err;
  } finally {
    c.release();
  }
}

const signIn = (email: string) => signInAs(BASE, email, PASSWORD);
const { request, close: closeClient } = benchClient(BASE, CONNECTIONS);
const get = (pathname: string, cookie: string) => request("GET", pathname, { cookie });

/** CONNECTIONS clients each ask REQUESTS times; every answer's latency. */
async function load(cookie: string, path: string) {
  const latencies: number[] = [];
  let bytes = 0;
  let summary = "";
  const started = performance.now();
  await Promise.all(
    Array.from({ length: CONNECTIONS }, async () => {
      for (let i = 0; i < REQUESTS; i++) {
        const t0 = performance.now();
        const res = await get(path, cookie);
        latencies.push(performance.now() - t0);
        if (res.status !== 200) throw new Error(`${path} answered ${res.status}: ${res.text.slice(0, 200)}`);
        bytes = res.text.length;
        if (!summary) {
          const body = JSON.parse(res.text) as { graders: unknown[]; team: { graded: number; rechecked: number }; weeks: string[] };
          summary = `${body.graders.length} graders, ${body.weeks.length} weeks, team graded ${body.team.graded}, rechecked ${body.team.rechecked}`;
        }
      }
    }),
  );
  return { latencies, seconds: (performance.now() - started) / 1000, bytes, summary };
}

const isoDate = (ms: number) => new Date(ms).toISOString().slice(0, 10);

async function main() {
  const health = await fetch(`${BASE}/api/health`)
    .then((r) => r.json())
    .catch(() => null);
  if (health?.app !== "partproof") {
    console.log(`No Partproof app answers at ${BASE}: not measured. Start it with \`npm start\` (or set BENCH_BASE_URL), then run \`npm run bench -- scorecards-api\`.`);
    return;
  }
  console.log(`Setting up ${UNITS.toLocaleString("en")} graded units and ${(UNITS / RECHECK_EVERY).toLocaleString("en")} rechecks in "Scorecards bench (generated)" …`);
  const made = await setUp();
  console.log(`   workspace holds ${made.grades.toLocaleString("en")} grades and ${made.rechecks.toLocaleString("en")} rechecks`);
  const lead = await signIn(LEAD);
  const now = Date.now();
  const runs: [string, string][] = [
    ["default period (last 12 weeks: every grade and recheck)", "/api/recheck/scorecards"],
    ["last 4 weeks", `/api/recheck/scorecards?from=${isoDate(now - 27 * 86_400_000)}&to=${isoDate(now)}`],
  ];
  await load(lead, runs[0][1]); // warm-up: connections, plans, the app's JIT
  for (const [label, path] of runs) {
    const { latencies, seconds, bytes, summary } = await load(lead, path);
    console.log(`${label}: ${CONNECTIONS} connections × ${REQUESTS} requests (${summary}; ${(bytes / 1024).toFixed(0)} KiB per answer)`);
    console.log(
      `   latency p50 ${ms(percentile(latencies, 50))}, p95 ${ms(percentile(latencies, 95))} (target p95 <= 200 ms), p99 ${ms(percentile(latencies, 99))}; ${(latencies.length / seconds).toFixed(1)} requests/s`,
    );
  }
  const load1 = (await import("node:os"))
    .loadavg()
    .map((l) => l.toFixed(2))
    .join(" ");
  console.log(`load average (1, 5, 15 min): ${load1}`);
}

await main().finally(() => {
  closeClient();
  return pool.end();
});
