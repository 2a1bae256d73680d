/**
 * The Bench's autosave for one photo's regions, without React (the hook in use-region-autosave.ts
 * wraps it; tests drive it with fake timers and a fake `send`).
 *
 * - Every committed edit calls `edit(payload)`; the set is sent `debounceMs` after the last one.
 * - One save is in flight at a time; edits made meanwhile are sent right after it.
 * - A failure that may pass (offline, 5xx, 503, 429) is retried with exponential backoff and
 *   shown as "unsaved"; the edits stay in `latest`, never dropped. `retryNow()` (the browser came
 *   back online, or the person asked) skips the wait.
 * - 409 with the current state (someone else saved first) stops saving until `resolveConflict`:
 *   the Bench asks the person (reload theirs, keep mine, merge).
 * - Any other refusal (4xx) is shown with the server's sentence and retried only after the next edit.
 * A set equal to the one last saved is never sent (so reloading theirs does not save again).
 */
import { samePayload } from "@/lib/regions/payload";
import type { RegionSetPayload } from "@/lib/geometry/validate";

export type SaveRequest = { baseVersion: number; regions: RegionSetPayload };
export type ServerSet = { version: number; regions: RegionSetPayload; updatedByName?: string | null };

export type SendResult = { kind: "saved"; set: ServerSet } | { kind: "conflict"; current: ServerSet; message: string } | { kind: "retryable"; message: string } | { kind: "refused"; message: string };

export type SaveStatus =
  | { kind: "saved"; version: number; at: number | null }
  | { kind: "pending" }
  /** `attempt` > 0: an earlier try failed and this is a retry. */
  | { kind: "saving"; attempt?: number }
  | { kind: "retrying"; attempt: number; retryInMs: number; message: string }
  | { kind: "conflict"; current: ServerSet; message: string }
  | { kind: "refused"; message: string };

type Timers = { setTimeout(fn: () => void, ms: number): unknown; clearTimeout(handle: unknown): void; now(): number };

export type AutosaverOptions = {
  /** The server's set this editor starts from. */
  initial: ServerSet;
  send(request: SaveRequest): Promise<SendResult>;
  debounceMs?: number;
  firstRetryMs?: number;
  maxRetryMs?: number;
  timers?: Timers;
  /** After every successful save (e.g. to mark the measurement stale). */
  onSaved?(set: ServerSet): void;
};

const browserTimers: Timers = {
  setTimeout: (fn, ms) => globalThis.setTimeout(fn, ms),
  clearTimeout: (handle) => globalThis.clearTimeout(handle as ReturnType<typeof setTimeout>),
  now: () => Date.now(),
};

export class RegionAutosaver {
  private version: number;
  /** What the server holds at `version`, as far as this editor knows. */
  private saved: RegionSetPayload;
  /** The editor's newest set. */
  private latest: RegionSetPayload;
  private inFlight = false;
  private attempt = 0;
  private timer: unknown = null;
  private status: SaveStatus;
  private listeners = new Set<() => void>();
  private waiters: ((saved: boolean) => void)[] = [];
  private readonly opts: Required<Omit<AutosaverOptions, "onSaved" | "initial">> & Pick<AutosaverOptions, "onSaved">;

  constructor(options: AutosaverOptions) {
    this.opts = { debounceMs: 800, firstRetryMs: 1000, maxRetryMs: 30_000, timers: browserTimers, ...options };
    this.version = options.initial.version;
    this.saved = options.initial.regions;
    this.latest = options.initial.regions;
    this.status = { kind: "saved", version: this.version, at: null };
  }

  getStatus = (): SaveStatus => this.status;

  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  /** Edits not yet on the server (including a conflict or refusal waiting for the person). */
  hasUnsaved(): boolean {
    return this.inFlight || !samePayload(this.latest, this.saved);
  }

  /** The editor's newest set (what to show again when the person comes back to this photo). */
  latestRegions(): RegionSetPayload {
    return this.latest;
  }

  baseVersion(): number {
    return this.version;
  }

  lastSaved(): RegionSetPayload {
    return this.saved;
  }

  edit(payload: RegionSetPayload): void {
    this.latest = payload;
    if (this.status.kind === "conflict") return;
    this.clearTimer();
    if (this.inFlight) return this.set({ kind: "saving" });
    if (!this.hasUnsaved()) return this.settle();
    this.set({ kind: "pending" });
    this.timer = this.opts.timers.setTimeout(() => void this.sendNow(), this.opts.debounceMs);
  }

  /** Sends now; resolves true once everything is saved, false if it could not be (it keeps retrying). */
  flush(): Promise<boolean> {
    if (!this.hasUnsaved()) return Promise.resolve(true);
    if (this.status.kind === "conflict") return Promise.resolve(false);
    const done = new Promise<boolean>((resolve) => this.waiters.push(resolve));
    if (!this.inFlight) {
      this.clearTimer();
      void this.sendNow();
    }
    return done;
  }

  retryNow(): void {
    if (this.status.kind === "retrying" || this.status.kind === "refused") {
      this.clearTimer();
      void this.sendNow();
    }
  }

  /**
   * After a conflict: `current` is the server's set the person has now seen, `keep` what the
   * editor should hold from here (theirs, mine, or a merge). Saves `keep` over `current` unless
   * they are the same.
   */
  resolveConflict(current: ServerSet, keep: RegionSetPayload): void {
    this.version = current.version;
    this.saved = current.regions;
    this.latest = keep;
    this.attempt = 0;
    this.status = { kind: "pending" };
    if (!this.hasUnsaved()) return this.settle();
    this.clearTimer();
    void this.sendNow();
  }

  /** Stops the timers (the page is going away); unsaved edits stay readable. */
  dispose(): void {
    this.clearTimer();
    this.listeners.clear();
  }

  private async sendNow(): Promise<void> {
    this.timer = null;
    if (this.inFlight) return;
    if (!this.hasUnsaved()) return this.settle();
    const regions = this.latest;
    this.inFlight = true;
    this.set(this.attempt > 0 ? { kind: "saving", attempt: this.attempt } : { kind: "saving" });
    let result: SendResult;
    try {
      result = await this.opts.send({ baseVersion: this.version, regions });
    } catch (err) {
      result = { kind: "retryable", message: err instanceof Error ? err.message : "The save did not go through." };
    }
    this.inFlight = false;
    if (result.kind === "saved") {
      this.version = result.set.version;
      // What was sent is what the server stored (it validates, never rewrites).
      this.saved = regions;
      this.attempt = 0;
      this.opts.onSaved?.(result.set);
      if (this.hasUnsaved()) return void this.sendNow();
      return this.settle();
    }
    if (result.kind === "conflict") {
      this.set({ kind: "conflict", current: result.current, message: result.message });
      return this.release(false);
    }
    if (result.kind === "refused") {
      this.set({ kind: "refused", message: result.message });
      return this.release(false);
    }
    this.attempt += 1;
    const retryInMs = Math.min(this.opts.maxRetryMs, this.opts.firstRetryMs * 2 ** (this.attempt - 1));
    this.set({ kind: "retrying", attempt: this.attempt, retryInMs, message: result.message });
    this.timer = this.opts.timers.setTimeout(() => void this.sendNow(), retryInMs);
    this.release(false);
  }

  private settle(): void {
    this.set({ kind: "saved", version: this.version, at: this.status.kind === "saved" ? this.status.at : this.opts.timers.now() });
    this.release(true);
  }

  private release(saved: boolean): void {
    const waiting = this.waiters;
    this.waiters = [];
    for (const resolve of waiting) resolve(saved);
  }

  private clearTimer(): void {
    if (this.timer !== null) this.opts.timers.clearTimeout(this.timer);
    this.timer = null;
  }

  private set(status: SaveStatus): void {
    this.status = status;
    for (const listener of this.listeners) listener();
  }
}
