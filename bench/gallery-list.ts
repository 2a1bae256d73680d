/**
 * The Gallery list API under load, against the RUNNING production app (`npm start` first; loopback
 * only), and only when it serves this tree's production build (`next build` output in .next, as users
 * get; a `next dev` server is refused). Creates (or reuses) a workspace "Gallery bench (generated)" in the demo database with
 * 5 000 published gallery items (each with a Surface and three defect regions, as a curated
 * example has), then 10 keep-alive connections walk the whole list in keyset pages of 48 (the
 * screen's page), unfiltered and with a part type + class + grade filter, as an inspector (published
 * only) and as a trainer (drafts too). Prints p50 / p95 / p99 page latency; target p95 <= 50 ms.
 * Without a running app it says so and measures nothing.
 */
import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { hash } from "@node-rs/argon2";
import pg from "pg";
import { benchClient, signIn as signInAs } from "../scripts/lib/bench-http";
import { sourceHash } from "../scripts/lib/build";
import { databaseUrl, demoSettings, projectRoot } from "../scripts/lib/settings";

const settings = demoSettings();
const BASE = process.env.BENCH_BASE_URL ?? settings.app.url;
if (!/^http:\/\/(127\.0\.0\.1|localhost)(:\d+)?$/.test(BASE)) throw new Error("bench gallery-list only runs against a loopback URL.");
const ITEMS = 5_000;
const CONNECTIONS = Number(process.env.BENCH_GALLERY_CONNECTIONS ?? 10);
const PASSES = Number(process.env.BENCH_GALLERY_PASSES ?? 2);
const PASSWORD = "gallery-bench-password";
const GRADES = ["A", "B", "C", "Reject"] as const;

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL ?? databaseUrl(settings), max: 4 });
const percentile = (values: number[], p: number) => [...values].sort((a, b) => a - b)[Math.min(values.length - 1, Math.ceil((p / 100) * values.length) - 1)];
const ms = (v: number) => `${v.toFixed(1)} ms`;

/** Item i's regions in a 4 000 × 3 000 photo: the part's outline, a scratch, a dent and (every third) a stain. */
function regionsOf(i: number) {
  const x = 800 + (i % 7) * 100;
  const regions = [
    {
      id: "d1",
      defect: "scratch",
      shape: {
        kind: "line",
        points: [
          [x, 900],
          [x + 600, 1200],
          [x + 900, 1300],
        ],
        width: 12,
      },
    },
    { id: "d2", defect: "dent", shape: { kind: "spot", x: 2400, y: 1600 + (i % 5) * 40, radius: 60 } },
    ...(i % 3 === 0
      ? [
          {
            id: "d3",
            defect: "stain",
            shape: {
              kind: "polygon",
              points: [
                [2800, 1000],
                [3100, 1050],
                [3050, 1300],
                [2780, 1250],
              ],
            },
          },
        ]
      : []),
  ];
  return {
    regions,
    surfaces: [
      {
        id: "s",
        shape: {
          kind: "polygon",
          points: [
            [600, 500],
            [3400, 500],
            [3400, 2500],
            [600, 2500],
          ],
        },
      },
    ],
    ruler: null,
  };
}

async function setUp() {
  const c = await pool.connect();
  try {
    await c.query("BEGIN");
    let { rows } = await c.query("SELECT id FROM workspaces WHERE slug = 'gallery-bench'");
    if (!rows[0]) ({ rows } = await c.query("INSERT INTO workspaces (name, slug) VALUES ('Gallery bench (generated)', 'gallery-bench') RETURNING id"));
    const ws = rows[0].id as string;
    const passwordHash = await hash(PASSWORD);
    for (const [email, role] of [
      ["bench-trainer@gallery-bench.example", "trainer"],
      ["bench-inspector@gallery-bench.example", "inspector"],
    ]) {
      await c.query(
        `INSERT INTO users (workspace_id, email, name, password_hash, roles) VALUES ($1, $2, $3, $4, $5) ON CONFLICT (email) WHERE password_hash IS NOT NULL DO UPDATE SET password_hash = EXCLUDED.password_hash, active = true`,
        [ws, email, `Bench ${role}`, passwordHash, [role]],
      );
    }
    const trainer = (await c.query("SELECT id FROM users WHERE email = 'bench-trainer@gallery-bench.example'")).rows[0].id as string;
    let pt = (await c.query("SELECT id FROM part_types WHERE workspace_id = $1 AND slug = 'gallery-bench-part'", [ws])).rows[0];
    if (!pt) {
      pt = (
        await c.query(
          `INSERT INTO part_types (workspace_id, slug, name, category, views, defect_classes, checklist) VALUES ($1, 'gallery-bench-part', 'Gallery bench part', 'housing', $2, $3, '[]') RETURNING id`,
          [
            ws,
            JSON.stringify([
              { key: "front", label: "Front", required: true, zones: [] },
              { key: "back", label: "Back", required: true, zones: [] },
            ]),
            JSON.stringify([
              { key: "scratch", label: "Scratch", severity: "minor" },
              { key: "dent", label: "Dent", severity: "minor" },
              { key: "stain", label: "Stain", severity: "minor" },
            ]),
          ],
        )
      ).rows[0];
    }
    const have = Number((await c.query("SELECT count(*) FROM gallery_items WHERE workspace_id = $1", [ws])).rows[0].count);
    for (let i = have; i < ITEMS; i++) {
      const photoId = crypto.randomUUID();
      const keys = `photos/${ws}/gallery/${photoId}`;
      await c.query(
        `INSERT INTO photos (id, workspace_id, unit_id, view_key, status, original_key, preview_key, thumbnail_key, content_type, file_name, bytes, sha256, format, width, height, preview_width, preview_height, thumbnail_width, thumbnail_height, uploaded_by)
         VALUES ($1, $2, NULL, $3, 'ready', $4, $5, $6, 'image/jpeg', 'bench.jpg', 3000000, $7, 'jpeg', 4000, 3000, 2560, 1920, 320, 240, $8)`,
        [photoId, ws, i % 4 === 0 ? "back" : "front", `${keys}/original`, `${keys}/preview.webp`, `${keys}/thumbnail.webp`, crypto.randomBytes(32).toString("hex"), trainer],
      );
      const normal = i % 6 === 0;
      const regions = normal ? { regions: [], surfaces: regionsOf(i).surfaces, ruler: null } : regionsOf(i);
      const classes = [...new Set(regions.regions.map((r) => r.defect))].sort();
      await c.query(
        `INSERT INTO gallery_items (workspace_id, part_type_id, view_key, status, kind, photo_id, regions, defect_classes, grade, caption, created_by, published_by, published_at, created_at)
         VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, CASE WHEN $4 = 'draft' THEN NULL ELSE $11::uuid END, CASE WHEN $4 = 'draft' THEN NULL ELSE now() END, now() - ($12 || ' seconds')::interval)`,
        [
          ws,
          pt.id,
          i % 4 === 0 ? "back" : "front",
          i % 50 === 0 ? "draft" : "published",
          normal ? "normal" : "abnormal",
          photoId,
          JSON.stringify(regions),
          classes,
          normal ? "A" : GRADES[1 + (i % 3)],
          `Generated example ${i + 1}: a scratch and a dent on the housing, graded by the bench.`,
          trainer,
          String(i),
        ],
      );
    }
    await c.query("COMMIT");
    await c.query("VACUUM (ANALYZE) gallery_items");
    return { partTypeId: pt.id as string };
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

/** CONNECTIONS clients each walk the whole list PASSES times; returns every page's latency and the items seen per walk. */
async function walk(cookie: string, query: string) {
  const latencies: number[] = [];
  let perWalk = 0;
  let bytes = 0;
  const started = performance.now();
  const cpuBefore = process.cpuUsage();
  await Promise.all(
    Array.from({ length: CONNECTIONS }, async () => {
      for (let pass = 0; pass < PASSES; pass++) {
        let cursor: string | null = null;
        let seen = 0;
        do {
          const t0 = performance.now();
          const res = await get(`/api/gallery?${query}${cursor ? `&cursor=${cursor}` : ""}`, cookie);
          latencies.push(performance.now() - t0);
          if (res.status !== 200) throw new Error(`list answered ${res.status}: ${res.text.slice(0, 200)}`);
          bytes += res.text.length;
          const body = JSON.parse(res.text) as { items: unknown[]; nextCursor: string | null };
          seen += body.items.length;
          cursor = body.nextCursor;
        } while (cursor);
        perWalk = seen;
      }
    }),
  );
  const cpu = process.cpuUsage(cpuBefore);
  const seconds = (performance.now() - started) / 1000;
  // The client shares the machine with the app and PostgreSQL: its own CPU is what they lacked.
  const clientCpuSeconds = (cpu.user + cpu.system) / 1e6;
  return { latencies, perWalk, seconds, bytesPerPage: bytes / latencies.length, clientCpuMsPerPage: (1000 * clientCpuSeconds) / latencies.length, clientShare: clientCpuSeconds / seconds };
}

/**
 * The build id of this tree's production build when the app at BASE serves it: only a server of
 * that build answers its `_next/static/<build id>/_buildManifest.js` (a dev server has no such
 * file). Says whether the build is older than the sources.
 */
async function servedProductionBuild(): Promise<{ id: string; current: boolean } | null> {
  const distDir = path.join(projectRoot, process.env.NEXT_DIST_DIR ?? ".next");
  const idFile = path.join(distDir, "BUILD_ID");
  if (!fs.existsSync(idFile)) return null;
  const id = fs.readFileSync(idFile, "utf8").trim();
  const res = await fetch(`${BASE}/_next/static/${id}/_buildManifest.js`).catch(() => null);
  if (!res?.ok) return null;
  const marker = path.join(distDir, "partproof-build.sha256");
  return { id, current: fs.existsSync(marker) && fs.readFileSync(marker, "utf8") === sourceHash() };
}

async function main() {
  const health = await fetch(`${BASE}/api/health`)
    .then((r) => r.json())
    .catch(() => null);
  if (health?.app !== "partproof") {
    console.log(`No Partproof app answers at ${BASE}: not measured. Start it with \`npm start\` (or set BENCH_BASE_URL), then run \`npm run bench -- gallery-list\`.`);
    return;
  }
  const build = await servedProductionBuild();
  if (!build) {
    console.log(`The app at ${BASE} does not serve this tree's production build (.next): not measured. Start it with \`npm start\` (it builds when the sources changed), not \`npm run dev\`.`);
    return;
  }
  console.log(`Against the production build ${build.id}${build.current ? "" : " (OLDER than the sources: restart `npm start` to rebuild)"}.`);
  console.log(`Setting up ${ITEMS.toLocaleString("en")} gallery items in "Gallery bench (generated)" …`);
  const { partTypeId } = await setUp();
  const [inspector, trainer] = await Promise.all(["bench-inspector@gallery-bench.example", "bench-trainer@gallery-bench.example"].map(signIn));
  await walk(inspector, "limit=48"); // warm-up: connections, prepared plans, the app's JIT
  const runs: [string, string, string][] = [
    ["inspector, every published item", inspector, "limit=48"],
    ["trainer, drafts and published", trainer, "limit=48"],
    ["inspector, part type + stain + grade B", inspector, `partType=${partTypeId}&defect=stain&grade=B&limit=48`],
  ];
  for (const [label, cookie, query] of runs) {
    const { latencies, perWalk, seconds, bytesPerPage, clientCpuMsPerPage, clientShare } = await walk(cookie, query);
    console.log(`${label}: ${CONNECTIONS} connections × ${PASSES} walks, ${perWalk} items per walk, ${latencies.length} keyset pages of 48 (${(bytesPerPage / 1024).toFixed(0)} KiB each)`);
    console.log(
      `   page latency p50 ${ms(percentile(latencies, 50))}, p95 ${ms(percentile(latencies, 95))} (target p95 <= 50 ms), p99 ${ms(percentile(latencies, 99))}; ${(latencies.length / seconds).toFixed(0)} pages/s`,
    );
    console.log(`   this client's own CPU: ${clientCpuMsPerPage.toFixed(2)} ms per page, ${(100 * clientShare).toFixed(0)} % of one core (${os.cpus().length} cores here)`);
  }
  const load = os
    .loadavg()
    .map((l) => l.toFixed(2))
    .join(" ");
  console.log(`load average (1, 5, 15 min): ${load}`);
}

await main().finally(() => {
  closeClient();
  return pool.end();
});
