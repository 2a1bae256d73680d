/**
 * `npm run bench:ui`: frame time of the Bench canvas while panning and zooming, in headless
 * Chromium (Debian's /usr/bin/chromium), against the RUNNING production app (`npm start` first).
 * Loopback only, bounded in time (it stops itself after 110 s).
 *
 * 1. Fixture in the demo database, reused on every run (bench/ui/fixture.ts): a unit of
 *    "UI bench module (generated)" on the demo inspector's bench, a generated 4000 × 3000 JPEG
 *    uploaded once through the real API (the worker makes the preview), and 1 000 deterministic
 *    regions saved through the regions API (only when the stored set differs). The unit goes
 *    back to the queue at the end (due in 2099, so it comes last).
 * 2. The Bench in Chromium (bench/ui/drive.ts): wait for data-region-count=1000, wheel-zoom from
 *    the fitted view, then pan at 1:1 with middle-button drags, timing every frame in the page
 *    (rAF intervals and Konva's draw time, bench/ui/probe.ts) and the main thread's work per
 *    frame from a performance trace (bench/ui/trace.ts).
 * Headless Chromium runs rAF at the display rate (60 Hz), so an interval cannot show a frame
 * cheaper than 16.7 ms. The bench first checks whether --disable-frame-rate-limit
 * --disable-gpu-vsync lift that cap here; if they do, it measures a second time with them.
 * The 16 ms target is judged on the main-thread work per frame (and on the unthrottled
 * interval when there is one). BENCH_UI_DPR=2 runs at device pixel ratio 2; BENCH_UI_TRACE=file.json
 * keeps the trace (open it in the DevTools Performance panel).
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { DEMO_PASSWORD } from "../db/seed/demo-data";
import { ensureRegions, getPhoto, LOOPBACK, releaseUnit, signIn, uploadPhoto, type Session } from "../bench/ui/api";
import { BASE_FLAGS, CHROMIUM, idleFrameInterval, measureCanvas, PAN, TARGET_MS, UNTHROTTLE_FLAGS, VIEWPORT, ZOOM, type CanvasRun } from "../bench/ui/drive";
import { BENCH_INSPECTOR, prepareFixture } from "../bench/ui/fixture";
import type { Summary } from "../bench/ui/probe";
import { benchPhoto, benchRegions, PHOTO, REGION_COUNT } from "../bench/ui/scene";
import { databaseUrl, demoSettings, projectRoot } from "./lib/settings";

const settings = demoSettings();
const BASE = process.env.BENCH_BASE_URL ?? settings.app.url;
const DEADLINE_MS = 110_000;
const DPR = Number(process.env.BENCH_UI_DPR ?? "1");
const TRACE_FILE = process.env.BENCH_UI_TRACE ? path.resolve(process.env.BENCH_UI_TRACE) : null;

const settingProblem = !LOOPBACK.test(BASE)
  ? `BENCH_BASE_URL must be a loopback URL such as http://127.0.0.1:3000 (got "${BASE}"); bench:ui talks to this machine only.`
  : !(DPR >= 1 && DPR <= 3)
    ? `BENCH_UI_DPR must be a number from 1 to 3 (got "${process.env.BENCH_UI_DPR}").`
    : null;
if (settingProblem) {
  console.error(settingProblem);
  process.exit(1);
}

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL ?? databaseUrl(settings), max: 2 });
const started = performance.now();
const f1 = (v: number) => (Number.isFinite(v) ? v.toFixed(1) : "n/a");
const since = (t0: number) => `${((performance.now() - t0) / 1000).toFixed(1)} s`;
const log = (message: string) => console.log(message);
const loadavg = () =>
  os
    .loadavg()
    .map((v) => v.toFixed(2))
    .join(", ");

async function fixture(): Promise<{ session: Session; unitId: string; photoId: string }> {
  const fx = await prepareFixture(pool);
  log(`  unit ${fx.serial} in lot "UI-BENCH (generated)" of the demo workspace${fx.created.length ? ` (created: ${fx.created.join(", ")})` : " (reused)"}`);
  const session = await signIn(BASE, BENCH_INSPECTOR, DEMO_PASSWORD);
  let photoId = fx.photo?.id ?? null;
  if (!photoId) {
    const t0 = performance.now();
    const bytes = await benchPhoto();
    photoId = (await uploadPhoto(session, fx.unitId, bytes)).id;
    log(`  photo uploaded (${(bytes.length / 1e6).toFixed(1)} MB JPEG: intent, PUT to the store, finalise, worker preview) in ${since(t0)}`);
  } else log(`  photo reused from an earlier run (${(fx.photo!.bytes / 1e6).toFixed(1)} MB JPEG)`);
  const photo = await getPhoto(session, photoId);
  if (photo.width !== PHOTO.width || photo.height !== PHOTO.height || !photo.preview)
    throw new Error(`The bench photo is ${photo.width} × ${photo.height} without a preview; expected ${PHOTO.width} × ${PHOTO.height}.`);
  log(`  photo ${photo.width} × ${photo.height} px (${((photo.width * photo.height) / 1e6).toFixed(0)} MP); the canvas draws its ${photo.preview.width} × ${photo.preview.height} preview`);
  const t0 = performance.now();
  const saved = await ensureRegions(session, photoId, benchRegions());
  log(
    saved.saved
      ? `  ${REGION_COUNT} regions saved through the API as version ${saved.version} in ${since(t0)}`
      : `  ${REGION_COUNT} regions already stored (version ${saved.version}), not saved again`,
  );
  return { session, unitId: fx.unitId, photoId };
}

const PART_ORDER = ["input", "hit test", "other JS", "rAF (Konva draw)", "style+layout", "intersections", "paint+commit", "GC"];

function report(label: string, s: Summary, displayMs: number, capped: boolean): void {
  log(`  ${label}: ${s.drawing} frames drew (of ${s.frames}; ${s.traced} found in the trace)`);
  log(
    `    rAF interval         median ${f1(s.median)} ms, p95 ${f1(s.p95)} ms, max ${f1(s.max)} ms; ${s.missed} frames missed (> 1.5 × ${f1(displayMs)} ms)${capped ? " [capped at the display rate]" : ""}`,
  );
  log(`    main-thread CPU      median ${f1(s.cpuMedian)} ms, p95 ${f1(s.cpuP95)} ms per frame; ${s.cpuOver} frames over ${TARGET_MS} ms`);
  log(`    main-thread in tasks median ${f1(s.wallMedian)} ms, p95 ${f1(s.wallP95)} ms per frame (wall clock: CPU plus waiting for a CPU)`);
  const parts = PART_ORDER.filter((k) => s.parts[k] !== undefined).map((k) => `${k} ${f1(s.parts[k])}`);
  const named = Object.values(s.parts).reduce((x, y) => x + y, 0);
  if (parts.length) log(`    CPU mean per frame   ${f1(s.cpuMean)} ms: ${parts.join(", ")}, rest of the tasks ${f1(Math.max(0, s.cpuMean - named))}`);
  log(`    Konva Layer#draw     median ${f1(s.drawMedian)} ms, p95 ${f1(s.drawP95)} ms per frame (wall clock)`);
}

function verdict(name: string, runs: { run: CanvasRun; unthrottled: boolean }[], key: "pan" | "zoom"): void {
  const paced = runs.find((r) => !r.unthrottled)!.run[key];
  const free = runs.find((r) => r.unthrottled)?.run[key];
  const judged = free ? free.median : paced.cpuMedian;
  const basis = free ? `unthrottled rAF interval median ${f1(free.median)} ms, p95 ${f1(free.p95)} ms` : `main-thread CPU per frame median ${f1(paced.cpuMedian)} ms, p95 ${f1(paced.cpuP95)} ms`;
  const ok = Number.isFinite(judged) && judged <= TARGET_MS;
  log(`  ${name}: ${ok ? "MET" : "NOT MET"} (${basis}); on this machine at 60 Hz ${paced.missed} of ${paced.drawing} frames were missed, wall-clock median ${f1(paced.wallMedian)} ms`);
}

async function main() {
  const health = await fetch(`${BASE}/api/health`)
    .then((r) => r.json())
    .catch(() => null);
  if (health?.app !== "partproof") throw new Error(`No Partproof app answers at ${BASE}. Start it with \`npm start\` in another terminal, then run \`npm run bench:ui\` again.`);
  if (health.ok === false) throw new Error(`The app at ${BASE} answers but its database does not; check the \`npm start\` window.`);
  if (!fs.existsSync(CHROMIUM)) throw new Error(`${CHROMIUM} is missing: sudo apt-get update && sudo apt-get install -y chromium fonts-dejavu-core`);
  if (!fs.existsSync(path.join(projectRoot, ".next", "BUILD_ID"))) log("warning: no production build in .next (dev-mode figures are not comparable).");
  const loadAtStart = loadavg();
  log("Fixture:");
  // Whether the flags lift the frame-rate cap, checked on an empty page while the fixture is prepared.
  const [{ session, unitId, photoId }, freeIdle] = await Promise.all([fixture(), idleFrameInterval(UNTHROTTLE_FLAGS)]);
  const lifted = freeIdle < 12;
  log(
    `With ${UNTHROTTLE_FLAGS.join(" ")} an empty page's rAF interval is ${f1(freeIdle)} ms: ${lifted ? "the cap is lifted, measuring in both modes" : "the flags do not lift the display-rate cap in this headless Chromium, so the figure for the target is the main-thread work per frame"}.`,
  );
  const modes = [{ unthrottled: false, flags: [] as string[] }, ...(lifted ? [{ unthrottled: true, flags: UNTHROTTLE_FLAGS }] : [])];
  const runs: { run: CanvasRun; unthrottled: boolean }[] = [];
  try {
    for (const mode of modes) {
      log(`Measuring (${mode.unthrottled ? "unthrottled" : "display-paced"}) …`);
      const t0 = performance.now();
      const traceFile = TRACE_FILE && (mode.unthrottled ? TRACE_FILE.replace(/(\.json)?$/, "-unthrottled.json") : TRACE_FILE);
      const run = await measureCanvas({ base: BASE, session, unitId, photoId, flags: mode.flags, dpr: DPR, traceFile, log });
      runs.push({ run, unthrottled: mode.unthrottled });
      log(`    measured in ${since(t0)}`);
    }
  } finally {
    await releaseUnit(session, unitId).catch((err) => log(`warning: ${err instanceof Error ? err.message : err}`));
  }

  const first = runs[0].run;
  const kinds = benchRegions().regions.reduce<Record<string, number>>((acc, r) => ((acc[r.shape.kind] = (acc[r.shape.kind] ?? 0) + 1), acc), {});
  log("");
  log(
    `Regions: ${REGION_COUNT} (${Object.entries(kinds)
      .map(([k, n]) => `${n} ${k}`)
      .join(", ")}; 4 classes) on a ${PHOTO.width} × ${PHOTO.height} photo (12 MP)`,
  );
  log(`Browser: Chromium ${first.version}, headless, ${BASE_FLAGS.join(" ")} (software rendering)`);
  log(`Viewport ${VIEWPORT.width} × ${VIEWPORT.height} CSS px, DPR ${DPR}, canvas stage ${first.stage.width} × ${first.stage.height} CSS px`);
  log(`Machine: ${os.cpus().length} CPUs, load average ${loadAtStart} at the start, ${loadavg()} at the end (1, 5, 15 min)`);
  log(`Zoom: mouse wheel, ${ZOOM.notches} notches of ${ZOOM.delta} in and out at ${ZOOM.anchors.length} anchors, ${f1(first.fitZoom * 100)} % (fit) to ${f1(first.maxZoom * 100)} %`);
  log(`Pan: middle-button drags at 100 %, ${PAN.strokes.length} strokes of ${PAN.moves} moves × ${PAN.step} px`);
  for (const { run, unthrottled } of runs) {
    log(`\n${unthrottled ? "Unthrottled" : "Display-paced"} (idle rAF interval ${f1(run.displayMs)} ms):`);
    report("zoom", run.zoom, run.displayMs, !unthrottled);
    report("pan", run.pan, run.displayMs, !unthrottled);
    report("settle", run.settle, run.displayMs, !unthrottled);
    if (run.stoppedEarly.length) log(`  stopped early (a phase may take at most 15 s): ${run.stoppedEarly.join(", ")}`);
    if (run.errors.length) log(`  page errors: ${run.errors.slice(0, 3).join(" | ")}`);
  }
  log("\nWhat the figures mean (only frames in which the canvas drew count):");
  log("  rAF interval: time from one animation frame to the next. Display-paced it is a whole number of display frames; p95, max and 'missed' show dropped frames.");
  log("  main-thread CPU: CPU time of all the page's main-thread tasks from one frame's task to the next (input, hit testing, React, Konva draw, style,");
  log("    layout, paint, commit), from a performance trace. This is the work per frame; the 16 ms target is judged on it when the frame rate cannot be unthrottled.");
  log("    Compositing and raster threads run beside the main thread and are not in it. The trace itself adds some overhead.");
  log("    'rest of the tasks' is CPU inside the tasks that no named trace event covers (frame bookkeeping, canvas flush, messages).");
  log("  main-thread in tasks: the same tasks in wall-clock time; above the CPU figure when other processes compete for the CPUs.");
  log("  Konva Layer#draw: time inside Konva's layer draws (regions cache copy or repaint, photo, interaction layer), part of the main-thread work.");
  log("  settle: the frames after each gesture, with the crisp repaint of the regions cache once the view is still.");
  log(`Target: median frame time <= ${TARGET_MS} ms while panning and zooming`);
  verdict("zooming", runs, "zoom");
  verdict("panning", runs, "pan");
  if (runs.some(({ run }) => run.pan.drawing < 50 || run.zoom.drawing < 50)) log("warning: few frames drew; the gestures may not have reached the canvas.");
  log(`\nTotal time ${since(started)}.`);
}

const deadline = setTimeout(() => {
  console.error(`bench:ui took longer than ${DEADLINE_MS / 1000} s and stopped before printing figures (the machine may be busy: load average ${loadavg()}).`);
  process.exit(2);
}, DEADLINE_MS);

main()
  .then(async () => {
    clearTimeout(deadline);
    await pool.end();
  })
  .catch(async (err) => {
    clearTimeout(deadline);
    console.error(err instanceof Error ? err.message : err);
    await pool.end();
    process.exit(1);
  });
