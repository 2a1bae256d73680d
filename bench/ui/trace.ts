/**
 * Main-thread work per frame, from a Chromium performance trace (the categories the DevTools
 * Performance panel records). The probe marks every animation frame (`performance.mark("uib:N")`);
 * frame N's work is every top-level task of the page's main thread from the start of the task
 * that ran mark N (the frame's own task: input, rAF callbacks, style, layout, paint, commit) up
 * to the start of the task that ran mark N+1 — so React renders and timers between frames count
 * too. While the main thread needs more than one display frame for this, frames are missed.
 */

type TraceEvent = { name: string; cat?: string; ph: string; ts: number; dur?: number; tdur?: number; pid: number; tid: number };

export const TRACE_CATEGORIES = ["toplevel", "devtools.timeline", "blink.user_timing"];

/** What the main-thread time of a frame went to (top-most events only, so nothing counts twice). */
const BUCKETS: Record<string, string> = {
  EventDispatch: "input",
  FireAnimationFrame: "rAF (Konva draw)",
  FunctionCall: "other JS",
  TimerFire: "other JS",
  RunMicrotasks: "other JS",
  UpdateLayoutTree: "style+layout",
  Layout: "style+layout",
  PrePaint: "paint+commit",
  Paint: "paint+commit",
  Layerize: "paint+commit",
  UpdateLayer: "paint+commit",
  Commit: "paint+commit",
  MinorGC: "GC",
  MajorGC: "GC",
  HitTest: "hit test",
  "IntersectionObserverController::computeIntersections": "intersections",
};

/**
 * `wallMs`: how long the main thread was inside tasks (on a busy machine this includes waiting
 * for a CPU); `cpuMs`: the CPU time it used in them (the trace's thread time), the work itself.
 * `parts`: CPU ms by kind of work.
 */
export type FrameWork = { wallMs: number; cpuMs: number; parts: Record<string, number> };

/** Per probe frame index N: the main thread's work from frame N's task to frame N+1's. */
export function frameWork(traceJson: Buffer | string): Map<number, FrameWork> {
  const parsed = JSON.parse(traceJson.toString()) as { traceEvents?: TraceEvent[] } | TraceEvent[];
  const events = Array.isArray(parsed) ? parsed : (parsed.traceEvents ?? []);
  const marks = events.filter((e) => e.name.startsWith("uib:") && (e.cat ?? "").includes("blink.user_timing"));
  const out = new Map<number, FrameWork>();
  if (!marks.length) return out;
  // The marks are made on the page's main thread: that is the thread to read.
  const { pid, tid } = marks[0];
  const onMain = events.filter((e) => e.pid === pid && e.tid === tid && e.ph === "X" && typeof e.dur === "number").sort((a, b) => a.ts - b.ts);
  const tasks = onMain.filter((e) => e.name === "ThreadControllerImpl::RunTask" || e.name === "RunTask");
  const taskStartAt = (ts: number) => {
    let lo = 0;
    let hi = tasks.length - 1;
    let found = -1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      if (tasks[mid].ts <= ts) {
        found = mid;
        lo = mid + 1;
      } else hi = mid - 1;
    }
    return found >= 0 && tasks[found].ts + tasks[found].dur! >= ts ? tasks[found].ts : ts;
  };
  const byIndex = new Map<number, number>();
  for (const m of marks) byIndex.set(Number(m.name.slice(4)), taskStartAt(m.ts));
  // Top-most bucketed events (a FunctionCall inside an EventDispatch belongs to the dispatch).
  const top: TraceEvent[] = [];
  let openUntil = -Infinity;
  for (const e of onMain) {
    if (!(e.name in BUCKETS)) continue;
    if (e.ts < openUntil) continue;
    top.push(e);
    openUntil = e.ts + e.dur!;
  }
  const overlap = (e: TraceEvent, a: number, b: number) => Math.max(0, Math.min(b, e.ts + e.dur!) - Math.max(a, e.ts));
  // CPU time of the part of an event inside [a, b), in proportion (a task cut by a frame boundary).
  const cpu = (e: TraceEvent, a: number, b: number) => (e.dur! > 0 ? ((e.tdur ?? e.dur!) * overlap(e, a, b)) / e.dur! : 0);
  const indices = [...byIndex.keys()].sort((a, b) => a - b);
  let t = 0;
  let p = 0;
  for (let k = 0; k + 1 < indices.length; k++) {
    const [a, b] = [byIndex.get(indices[k])!, byIndex.get(indices[k + 1])!];
    if (indices[k + 1] !== indices[k] + 1 || b <= a) continue;
    let wall = 0;
    let used = 0;
    while (t < tasks.length && tasks[t].ts + tasks[t].dur! <= a) t++;
    for (let i = t; i < tasks.length && tasks[i].ts < b; i++) {
      wall += overlap(tasks[i], a, b);
      used += cpu(tasks[i], a, b);
    }
    const parts: Record<string, number> = {};
    while (p < top.length && top[p].ts + top[p].dur! <= a) p++;
    for (let i = p; i < top.length && top[i].ts < b; i++) {
      const bucket = BUCKETS[top[i].name];
      parts[bucket] = (parts[bucket] ?? 0) + cpu(top[i], a, b) / 1000;
    }
    out.set(indices[k], { wallMs: wall / 1000, cpuMs: used / 1000, parts });
  }
  return out;
}
