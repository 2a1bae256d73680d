/**
 * The units CSV export of 100 000 units through the app's own path: lib/reports/exports.ts's
 * exportCsv (a pg-cursor on a connection of its own, 500 rows at a time, into csv-stream.ts) from
 * PostgreSQL, read to the end as a download would. Prints the time, CPU time and peak RSS growth
 * of this process; targets <= 5 s and <= 100 MB. Run: `npm run bench -- csv-export`.
 *
 * The database: the demo's PostgreSQL (PG_PORT, `.data/postgres`), started and migrated the way
 * `npm start` does (scripts/lib/services.ts) when it is not running, and stopped again if this
 * bench started it. The rows: a workspace "CSV bench (generated)" made once in SQL (100 lots of
 * 1 000 graded units, generate_series, one transaction) and reused by later runs; the bench
 * measures the read, not the making.
 */
import { availableParallelism, loadavg } from "node:os";
import pg from "pg";
import { benchLotPlan } from "../scripts/lib/bench-plan";
import { startServices } from "../scripts/lib/services";
import { appDatabaseUrl, databaseUrl, demoSettings } from "../scripts/lib/settings";
import { readMeasured } from "./_stream-measure";

const UNITS = 100_000;
const settings = demoSettings();
const services = await startServices(settings, { localS3: false, localMail: false });
// What the app connects as (db/client.ts reads it when first used).
process.env.DATABASE_URL ??= appDatabaseUrl(settings);
const mb = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

async function setUp(): Promise<string> {
  const c = new pg.Client({ connectionString: databaseUrl(settings) });
  await c.connect();
  try {
    await c.query("BEGIN");
    let { rows } = await c.query("SELECT id FROM workspaces WHERE slug = 'csv-bench'");
    if (!rows[0]) ({ rows } = await c.query("INSERT INTO workspaces (name, slug) VALUES ('CSV bench (generated)', 'csv-bench') RETURNING id"));
    const ws = rows[0].id as string;
    const have = Number((await c.query("SELECT count(*) FROM units WHERE workspace_id = $1", [ws])).rows[0].count);
    if (have === 0) {
      const lead = (
        await c.query(
          `INSERT INTO users (workspace_id, email, name, roles) VALUES ($1, 'bench-lead@csv-bench.example', 'Bench Lead Åsa Ørsted', '{lead}')
           ON CONFLICT (workspace_id, email) DO UPDATE SET active = true RETURNING id`,
          [ws],
        )
      ).rows[0].id as string;
      const pt = (
        await c.query(
          `INSERT INTO part_types (workspace_id, slug, name, category, views, defect_classes, checklist) VALUES ($1, 'csv-bench-part', 'CSV bench part', 'housing', $2, $3, '[]') RETURNING id`,
          [ws, JSON.stringify([{ key: "front", label: "Front", required: true, zones: [] }]), JSON.stringify([{ key: "scratch", label: "Scratch", severity: "minor" }])],
        )
      ).rows[0].id as string;
      const rv = (
        await c.query(
          `INSERT INTO rubric_versions (workspace_id, part_type_id, version, status, rubric, published_at, published_by) VALUES ($1, $2, 1, 'published', '{"rules":[],"notes":[]}', now(), $3) RETURNING id`,
          [ws, pt, lead],
        )
      ).rows[0].id as string;
      const sup = (await c.query(`INSERT INTO suppliers (workspace_id, name, contact_email) VALUES ($1, 'Bench supplier Ž (generated)', 'bench@csv-bench.example') RETURNING id`, [ws])).rows[0]
        .id as string;
      await c.query(
        `INSERT INTO lots (workspace_id, supplier_id, part_type_id, purchase_ref, quantity, received_on, due_on, inspection_level, aql_major, aql_minor, inspection_severity, plan, created_by)
         SELECT $1, $2, $3, 'CB-' || n, 1000, current_date - 60, current_date - 50, 'II', 1.0, 2.5, 'normal', $6, $4 FROM generate_series(1, $5::int) n`,
        [ws, sup, pt, lead, UNITS / 1000, JSON.stringify(benchLotPlan(1000, "CSV bench (generated)"))],
      );
      await c.query(
        `INSERT INTO units (workspace_id, lot_id, sample_index, serial, status, part_type_id, supplier_id, lot_due_on, lot_received_on, lot_created_at, graded_at)
         SELECT $1, l.id, s.i, l.purchase_ref || '-' || lpad(s.i::text, 6, '0'), 'graded', $2, $3, l.due_on, l.received_on, l.created_at, now()
         FROM lots l CROSS JOIN generate_series(1, 1000) s(i) WHERE l.workspace_id = $1`,
        [ws, pt, sup],
      );
      await c.query(
        `INSERT INTO grades (workspace_id, unit_id, kind, proposed_grade, final_grade, rubric_version_id, measurement_ids, explanation, regions_versions, graded_by, created_at)
         SELECT $1, u.id, 'inspection', g, g, $2, '{}', '{"lines":[],"notes":[]}', '{}', $3, now() - make_interval(secs => u.k * 30)
         FROM (SELECT id, row_number() OVER (ORDER BY lot_id, sample_index) - 1 AS k FROM units WHERE workspace_id = $1) u
         CROSS JOIN LATERAL (SELECT (ARRAY['A', 'A', 'B', 'C', 'Reject'])[1 + u.k % 5] AS g) pick`,
        [ws, rv, lead],
      );
    }
    await c.query("COMMIT");
    await c.query("VACUUM (ANALYZE) lots, units, grades");
    return ws;
  } catch (err) {
    await c.query("ROLLBACK");
    throw err;
  } finally {
    await c.end();
  }
}

try {
  const workspaceId = await setUp();
  // Imported after DATABASE_URL is set (db/client.ts makes its pool on first use).
  const { exportCsv } = await import("@/lib/reports/exports");
  const { closeDb } = await import("@/db/client");
  const run = async () => {
    let lines = 0;
    const cost = await readMeasured(exportCsv("units", { workspaceId, filter: {}, timeZone: "UTC" }), (chunk) => {
      for (const byte of chunk) if (byte === 10) lines++;
    });
    return { ...cost, lines };
  };
  for (let i = 0; i < 3; i++) {
    const r = await run();
    if (r.lines !== UNITS + 1) throw new Error(`expected ${UNITS + 1} lines (header + units), got ${r.lines}`);
    console.log(
      `units CSV export from PostgreSQL (pg-cursor → csv-stream), ${UNITS.toLocaleString("en")} rows, run ${i + 1}: ${r.elapsed.toFixed(0)} ms (CPU of this process ${r.cpu.toFixed(0)} ms), ${mb(r.bytes)},` +
        ` peak RSS growth ${mb(r.growth)} (before ${mb(r.before)}, peak ${mb(r.peak)})`,
    );
  }
  console.log("  targets: <= 5 s, peak RSS growth <= 100 MB");
  console.log(
    `load average while measuring: ${loadavg()
      .map((l) => l.toFixed(1))
      .join(" ")} on ${availableParallelism()} CPUs`,
  );
  await closeDb();
} finally {
  await services.stop();
}
