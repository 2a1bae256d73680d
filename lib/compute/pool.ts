/**
 * CPU-heavy work (measuring, suggestions) runs here, in a small pool of worker threads, never on
 * the thread that answers requests: a slow measurement cannot stall the web process, and a task
 * that outlives its hard time limit is stopped by ending its thread (piscina terminates a thread
 * whose task is aborted), whatever loop it was in.
 *
 * Limits, per process (the web app and the job worker each have one pool):
 * - COMPUTE_THREADS threads (default 2, at most the CPU count) and COMPUTE_QUEUE tasks waiting;
 * - per kind, at most `concurrent` tasks at once — a further request is refused at once with
 *   ComputeBusy (503 with a sentence) instead of piling up behind the others;
 * - per task, a hard time limit (the caller's, else the kind's).
 */
import os from "node:os";
import path from "node:path";
import { Piscina } from "piscina";
import { AppError } from "@/lib/errors";
import { reviveError, type TaskInput, type TaskName, type TaskOutput, type TaskResult } from "./tasks";

type KindLimits = { concurrent: number; hardTimeoutMs: number; what: string; advice: string };

export const COMPUTE_LIMITS: Record<TaskName, KindLimits> = {
  "measure-unit": { concurrent: 2, hardTimeoutMs: 90_000, what: "Measuring", advice: "Nothing was stored; use fewer or simpler regions, or try again." },
  "suggest-surface": { concurrent: 2, hardTimeoutMs: 8_000, what: "Finding the Surface", advice: "Mark it by hand, or try again." },
  "score-calibration": { concurrent: 2, hardTimeoutMs: 60_000, what: "Scoring the attempt", advice: "Nothing was submitted; your answers are kept. Try again in a moment." },
  "pixel-candidates": { concurrent: 1, hardTimeoutMs: 20_000, what: "Looking for pixel faults", advice: "Mark them by hand, or try again." },
  // Only the job worker runs it (one training at a time per process); the bench measures ~30 s for 1 000 regions.
  "train-suggestion-model": { concurrent: 1, hardTimeoutMs: 15 * 60_000, what: "Training the suggestion model", advice: "Nothing was stored; it will be tried again." },
  "suggest-learned": { concurrent: 2, hardTimeoutMs: 15_000, what: "Finding learned suggestions", advice: "Mark by hand, or try again." },
};

/**
 * Added to a task's own time budget for its hard limit: waiting for a free thread and, the first
 * time, starting one (tsx compiles the task modules; about 2 s on a loaded 2-CPU machine).
 */
export const COMPUTE_START_ALLOWANCE_MS = 10_000;

/** Every thread of the pool is busy with this kind of work; the caller may queue it or ask to retry. */
export class ComputeBusy extends AppError {
  constructor(what: string) {
    super("unavailable", `${what} is busy with other requests right now. Try again in a moment.`);
  }
}

/** The task ran past its hard time limit and its thread was stopped. */
export class ComputeTimeout extends AppError {
  constructor(limits: Pick<KindLimits, "what" | "advice">, ms: number) {
    super("unavailable", `${limits.what} took longer than ${Math.round(ms / 1000)} s and was stopped. ${limits.advice}`);
  }
}

function settings() {
  const cpus = os.availableParallelism();
  const threads = Number(process.env.COMPUTE_THREADS ?? Math.min(2, cpus));
  const queue = Number(process.env.COMPUTE_QUEUE ?? 8);
  return { threads: Number.isInteger(threads) && threads > 0 ? threads : 1, queue: Number.isInteger(queue) && queue >= 0 ? queue : 8 };
}

const cache = globalThis as unknown as { __partproofCompute?: { pool: Piscina; inFlight: Map<TaskName, number> } };

function compute() {
  if (!cache.__partproofCompute) {
    const { threads, queue } = settings();
    const pool = new Piscina({
      // A path computed at run time: the thread loads the TypeScript sources itself (thread.mjs).
      filename: path.join(process.cwd(), "lib", "compute", "thread.mjs"),
      minThreads: 1,
      maxThreads: threads,
      maxQueue: queue,
      idleTimeout: 60_000,
      // The parent's flags (e.g. the worker's --import tsx) are not needed: thread.mjs registers tsx.
      execArgv: [],
    });
    cache.__partproofCompute = { pool, inFlight: new Map() };
  }
  return cache.__partproofCompute;
}

const isAbort = (err: unknown) => err instanceof Error && (err.name === "AbortError" || /aborted/i.test(err.message));
const isQueueFull = (err: unknown) => err instanceof Error && /queue is at limit/i.test(err.message);

/**
 * Runs one task in a compute thread. Rejects with ComputeBusy (too many of this kind at once, or
 * the queue is full), ComputeTimeout (hard limit passed; the thread was ended) or the task's own
 * error (AppError with its code, DeadlineExceeded, or a plain Error).
 */
export async function runInThread<N extends TaskName>(name: N, input: TaskInput<N>, options: { timeoutMs?: number } = {}): Promise<TaskOutput<N>> {
  const limits = COMPUTE_LIMITS[name];
  const { pool, inFlight } = compute();
  const running = inFlight.get(name) ?? 0;
  if (running >= limits.concurrent) throw new ComputeBusy(limits.what);
  inFlight.set(name, running + 1);
  const timeoutMs = options.timeoutMs ?? limits.hardTimeoutMs;
  try {
    const result = (await pool.run({ name, input }, { signal: AbortSignal.timeout(timeoutMs) })) as TaskResult<TaskOutput<N>>;
    if (!result.ok) throw reviveError(result.error);
    return result.value;
  } catch (err) {
    if (isAbort(err)) throw new ComputeTimeout(limits, timeoutMs);
    if (isQueueFull(err)) throw new ComputeBusy(limits.what);
    throw err;
  } finally {
    inFlight.set(name, (inFlight.get(name) ?? 1) - 1);
  }
}

/** Ends the threads (scripts and tests that exit on their own). */
export async function closeCompute(): Promise<void> {
  const current = cache.__partproofCompute;
  cache.__partproofCompute = undefined;
  await current?.pool.destroy();
}

/** Starts the pool's first thread now, so the first measurement does not wait for it (instrumentation.ts). */
export function warmCompute(): void {
  compute();
}
