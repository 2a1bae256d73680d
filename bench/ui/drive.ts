/**
 * The UI benchmark's browser part: Debian's Chromium, headless, with the flags of docs/stack.md (a
 * fresh profile per launch; anything not on loopback is refused), the Bench opened on the
 * fixture unit, then wheel zooms and middle-button pans with page.mouse while probe.ts times
 * every frame and a performance trace records the main thread's work (trace.ts).
 */
import fs from "node:fs";
import { chromium, type Browser, type Page } from "playwright-core";
import { LOOPBACK, type Session } from "./api";
import { intervalsOf, percentile, PROBE_SCRIPT, summarise, type RawFrame, type Summary } from "./probe";
import { REGION_COUNT } from "./scene";
import { frameWork, TRACE_CATEGORIES } from "./trace";

export const CHROMIUM = "/usr/bin/chromium";
export const BASE_FLAGS = ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"];
export const UNTHROTTLE_FLAGS = ["--disable-frame-rate-limit", "--disable-gpu-vsync"];
export const VIEWPORT = { width: 1440, height: 900 };
export const TARGET_MS = 16;

/** Wheel: notches in, then as many out, around each anchor (stage fractions). 100 px is one notch of a common mouse. */
export const ZOOM = {
  anchors: [
    [0.3, 0.3],
    [0.7, 0.35],
    [0.5, 0.62],
    [0.35, 0.7],
  ] as const,
  notches: 14,
  delta: 100,
};
/** Middle-button drags at 1:1: one stroke per letter, each `moves` moves of `step` px. */
export const PAN = { strokes: "LLURRRRDLL", moves: 20, step: 16 };
/** A phase stops early after this long (a very slow machine), and says so. */
const PHASE_CAP_MS = 15_000;

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const launch = (flags: readonly string[]) => chromium.launch({ executablePath: CHROMIUM, headless: true, args: [...BASE_FLAGS, ...flags] });
const rafScript = (n: number) =>
  `new Promise((done) => { const t = []; const f = (ts) => { t.push(ts); if (t.length <= ${n}) requestAnimationFrame(f); else done(t.slice(1).map((v, i) => v - t[i])); }; requestAnimationFrame(f); })`;

/** The median rAF interval of an empty page with these flags: tells whether the frame rate is capped. */
export async function idleFrameInterval(flags: readonly string[]): Promise<number> {
  const browser = await launch(flags);
  try {
    const page = await browser.newPage();
    await page.goto("about:blank");
    return percentile((await page.evaluate(rafScript(90))) as number[], 50);
  } finally {
    await browser.close();
  }
}

export type CanvasRun = {
  version: string;
  stage: { width: number; height: number };
  fitZoom: number;
  maxZoom: number;
  displayMs: number;
  zoom: Summary;
  pan: Summary;
  settle: Summary;
  stoppedEarly: string[];
  errors: string[];
  openSeconds: number;
};

type Options = {
  base: string;
  session: Session;
  unitId: string;
  photoId: string;
  flags: readonly string[];
  dpr: number;
  /** Where to keep the performance trace (it opens in the DevTools Performance panel), or null. */
  traceFile: string | null;
  log(message: string): void;
};

const setPhase = (page: Page, phase: string | null) => page.evaluate(`window.__uiBench.phase = ${JSON.stringify(phase)}`);
const stageData = (page: Page) => page.getByTestId("annotation-stage").evaluate((el: HTMLElement) => ({ ...el.dataset }));

async function openBench(browser: Browser, o: Options, errors: string[]): Promise<Page> {
  const context = await browser.newContext({ viewport: VIEWPORT, deviceScaleFactor: o.dpr });
  await context.route(
    (url) => !LOOPBACK.test(url.href) && !["data:", "blob:"].includes(url.protocol),
    (route) => route.abort("blockedbyclient"),
  );
  await context.addCookies(o.session.cookies.map((c) => ({ ...c, url: o.base })));
  const page = await context.newPage();
  page.on("pageerror", (e) => errors.push(e.message));
  await page.goto(`${o.base}/units/${o.unitId}?photo=${o.photoId}`, { timeout: 60_000 });
  const deadline = Date.now() + 45_000;
  for (;;) {
    const data = await stageData(page).catch(() => null);
    if (data?.ready === "true" && data.regionCount === String(REGION_COUNT)) break;
    if (Date.now() > deadline) {
      throw new Error(
        `The canvas did not become ready with ${REGION_COUNT} regions within 45 s (ready=${data?.ready}, regions=${data?.regionCount}); is the unit still on the demo inspector's bench?`,
      );
    }
    await sleep(250);
  }
  return page;
}

async function stageBox(page: Page) {
  const box = await page.getByTestId("annotation-stage").boundingBox();
  if (!box) throw new Error("The canvas stage has no box on the page.");
  return box;
}

async function phase(page: Page, name: string, stoppedEarly: string[], gesture: (inTime: () => boolean) => Promise<void>) {
  const until = performance.now() + PHASE_CAP_MS;
  await setPhase(page, name);
  await gesture(() => {
    if (performance.now() < until) return true;
    if (!stoppedEarly.includes(name)) stoppedEarly.push(name);
    return false;
  });
  await setPhase(page, "settle");
  await sleep(400);
  await setPhase(page, null);
}

async function zoomGesture(page: Page, inTime: () => boolean) {
  const box = await stageBox(page);
  for (const [fx, fy] of ZOOM.anchors) {
    await page.mouse.move(box.x + box.width * fx, box.y + box.height * fy);
    for (let i = 0; i < ZOOM.notches && inTime(); i++) await page.mouse.wheel(0, -ZOOM.delta);
    for (let i = 0; i < ZOOM.notches && inTime(); i++) await page.mouse.wheel(0, ZOOM.delta);
  }
}

async function panGesture(page: Page, inTime: () => boolean) {
  const box = await stageBox(page);
  const centre = { x: box.x + box.width / 2, y: box.y + box.height / 2 };
  const dirs: Record<string, [number, number]> = { L: [-1, 0], R: [1, 0], U: [0, -1], D: [0, 1] };
  const length = PAN.moves * PAN.step;
  for (const stroke of PAN.strokes) {
    const [dx, dy] = dirs[stroke];
    const start = { x: centre.x - (dx * length) / 2, y: centre.y - (dy * length) / 2 };
    await page.mouse.move(start.x, start.y);
    await page.mouse.down({ button: "middle" });
    for (let i = 1; i <= PAN.moves && inTime(); i++) await page.mouse.move(start.x + dx * i * PAN.step, start.y + dy * i * PAN.step);
    await page.mouse.up({ button: "middle" });
  }
}

export async function measureCanvas(o: Options): Promise<CanvasRun> {
  const browser = await launch(o.flags);
  try {
    const t0 = performance.now();
    const errors: string[] = [];
    const page = await openBench(browser, o, errors);
    const openSeconds = (performance.now() - t0) / 1000;
    o.log(`    Bench open with ${REGION_COUNT} regions after ${openSeconds.toFixed(1)} s`);
    const stage = page.getByTestId("annotation-stage");
    await stage.evaluate((el) => el.scrollIntoView({ block: "center" }));
    await stage.focus();
    await page.keyboard.press("0"); // fit the photo
    await sleep(600);
    if ((await page.evaluate(PROBE_SCRIPT)) !== "installed") throw new Error("The frame probe was already installed.");
    await setPhase(page, "idle");
    await sleep(1000);
    await setPhase(page, null);
    const fitZoom = Number((await stageData(page)).zoom);
    const stoppedEarly: string[] = [];
    await browser.startTracing(page, { categories: TRACE_CATEGORIES });
    await phase(page, "zoom", stoppedEarly, (inTime) => zoomGesture(page, inTime));
    await page.keyboard.press("Shift+Digit0"); // 1:1 around the stage centre
    await page.waitForFunction(() => document.querySelector('[data-testid="annotation-stage"]')?.getAttribute("data-zoom") === "1", undefined, { timeout: 10_000 });
    await sleep(300);
    await phase(page, "pan", stoppedEarly, (inTime) => panGesture(page, inTime));
    const trace = await browser.stopTracing();
    if (o.traceFile) fs.writeFileSync(o.traceFile, trace);
    const frames = (await page.evaluate("window.__uiBench.running = false, window.__uiBench.frames")) as RawFrame[];
    const intervals = intervalsOf(frames, frameWork(trace));
    const displayMs = percentile(
      intervals.filter((f) => f.phase === "idle").map((f) => f.ms),
      50,
    );
    const box = await stageBox(page);
    return {
      version: browser.version(),
      stage: { width: Math.round(box.width), height: Math.round(box.height) },
      fitZoom,
      maxZoom: fitZoom * Math.exp(ZOOM.notches * ZOOM.delta * 0.0015), // wheelZoomFactor in lib/annotate/coords.ts
      displayMs,
      zoom: summarise(intervals, "zoom", TARGET_MS, displayMs),
      pan: summarise(intervals, "pan", TARGET_MS, displayMs),
      settle: summarise(intervals, "settle", TARGET_MS, displayMs),
      stoppedEarly,
      errors,
      openSeconds,
    };
  } finally {
    await browser.close();
  }
}
