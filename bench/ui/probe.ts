/**
 * Frame timing inside the page. A requestAnimationFrame loop records, for every frame, its
 * timestamp, the phase the driver set (pan, zoom, settle or none), whether the stage's reported
 * viewport changed, and how long Konva spent in Layer#draw since the previous frame (the canvas
 * code's own painting work: the regions cache copy or repaint, the photo, the interaction layer).
 * Konva puts itself on `window.Konva`; its Layer prototype is wrapped, nothing in the app changes.
 * Each frame is also marked (`uib:N`) so trace.ts can find it in a performance trace.
 *
 * Kept as a plain-JS string: functions passed to page.evaluate from tsx-compiled code can carry
 * helper calls that do not exist in the page.
 */
import type { FrameWork } from "./trace";

export const PROBE_SCRIPT = `(() => {
  if (window.__uiBench) return "already installed";
  const stage = document.querySelector('[data-testid="annotation-stage"]');
  if (!stage) throw new Error("no annotation stage on the page");
  const K = window.Konva;
  if (!K || !K.Layer) throw new Error("Konva is not on window; cannot time the canvas draws");
  const probe = { frames: [], phase: null, drawMs: 0, draws: 0, running: true };
  const original = K.Layer.prototype.draw;
  K.Layer.prototype.draw = function (...args) {
    const t0 = performance.now();
    try { return original.apply(this, args); } finally { probe.drawMs += performance.now() - t0; probe.draws++; }
  };
  let last = null;
  const tick = (ts) => {
    if (!probe.running) return;
    const key = stage.dataset.zoom + "," + stage.dataset.offsetX + "," + stage.dataset.offsetY;
    performance.mark("uib:" + probe.frames.length);
    probe.frames.push([ts, probe.phase, key !== last ? 1 : 0, probe.drawMs, probe.draws]);
    probe.drawMs = 0; probe.draws = 0; last = key;
    requestAnimationFrame(tick);
  };
  requestAnimationFrame(tick);
  window.__uiBench = probe;
  return "installed";
})()`;

export type RawFrame = [ts: number, phase: string | null, viewChanged: 0 | 1, drawMs: number, draws: number];

/** One frame interval: from one rAF to the next, with the draw work done inside it. */
export type Interval = { phase: string | null; ms: number; drawMs: number; drew: boolean; work: FrameWork | null };

/**
 * Frame i−1 → i is one interval. Its phase is that of frame i−1 (the driver's phase when the
 * frame began) and its draw work is what frame i reports (Konva draws run in rAF callbacks after
 * the probe's own, so they land between the two timestamps).
 */
export function intervalsOf(frames: readonly RawFrame[], work: ReadonlyMap<number, FrameWork> = new Map()): Interval[] {
  const out: Interval[] = [];
  for (let i = 1; i < frames.length; i++) {
    out.push({ phase: frames[i - 1][1], ms: frames[i][0] - frames[i - 1][0], drawMs: frames[i][3], drew: frames[i][4] > 0, work: work.get(i - 1) ?? null });
  }
  return out;
}

export function percentile(values: readonly number[], p: number): number {
  if (!values.length) return NaN;
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))];
}

export type Summary = {
  frames: number;
  drawing: number;
  /** rAF interval of drawing frames. */
  median: number;
  p95: number;
  max: number;
  /** Drawing frames whose rAF interval exceeded 1.5 display frames (a frame was missed). */
  missed: number;
  /** Konva Layer#draw time (wall clock) per drawing frame. */
  drawMedian: number;
  drawP95: number;
  /** Drawing frames found in the trace. */
  traced: number;
  /** Main-thread CPU time per drawing frame (trace.ts), its mean, and frames above the budget. */
  cpuMedian: number;
  cpuP95: number;
  cpuMean: number;
  cpuOver: number;
  /** Main-thread time inside tasks per drawing frame, CPU waits included. */
  wallMedian: number;
  wallP95: number;
  /** Mean main-thread CPU ms per drawing frame, by kind of work. */
  parts: Record<string, number>;
};

const mean = (values: readonly number[]) => (values.length ? values.reduce((a, b) => a + b, 0) / values.length : NaN);

/**
 * The frames of one phase. Only intervals in which the canvas drew count: a frame with nothing
 * new to draw (no input arrived in time) says nothing about the canvas. `budgetMs` is the
 * target; `displayMs` the idle rAF interval (one display frame).
 */
export function summarise(intervals: readonly Interval[], phase: string, budgetMs: number, displayMs: number): Summary {
  const all = intervals.filter((f) => f.phase === phase);
  const drawing = all.filter((f) => f.drew);
  const ms = drawing.map((f) => f.ms);
  const draw = drawing.map((f) => f.drawMs);
  const traced = drawing.flatMap((f) => (f.work ? [f.work] : []));
  const cpu = traced.map((w) => w.cpuMs);
  const wall = traced.map((w) => w.wallMs);
  const parts: Record<string, number> = {};
  for (const w of traced) for (const [k, v] of Object.entries(w.parts)) parts[k] = (parts[k] ?? 0) + v / traced.length;
  return {
    frames: all.length,
    drawing: drawing.length,
    median: percentile(ms, 50),
    p95: percentile(ms, 95),
    max: ms.length ? Math.max(...ms) : NaN,
    missed: ms.filter((v) => v > 1.5 * displayMs).length,
    drawMedian: percentile(draw, 50),
    drawP95: percentile(draw, 95),
    traced: traced.length,
    cpuMedian: percentile(cpu, 50),
    cpuP95: percentile(cpu, 95),
    cpuMean: mean(cpu),
    cpuOver: cpu.filter((v) => v > budgetMs).length,
    wallMedian: percentile(wall, 50),
    wallP95: percentile(wall, 95),
    parts,
  };
}
