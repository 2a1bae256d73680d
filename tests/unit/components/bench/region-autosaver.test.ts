/**
 * The Bench's autosave, driven with a fake clock and a fake server: debounce, one save in flight,
 * exponential retry while offline (nothing dropped), 409 held for the person, flush for photo
 * switches and measuring. The backoff (1 s doubling to a 30 s cap) is the usual capped
 * exponential backoff (common practice (c)).
 */
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { RegionAutosaver, type SaveRequest, type SendResult } from "@/components/bench/region-autosaver";
import type { RegionSetPayload } from "@/lib/geometry/validate";

const set = (...ids: string[]): RegionSetPayload => ({ regions: ids.map((id, i) => ({ id, defect: "scratch", shape: { kind: "rect", x: i, y: 0, width: 2, height: 2 } })), surfaces: [], ruler: null });

type Call = { request: SaveRequest; answer(result: SendResult): void };

function setup(initialVersion = 3) {
  const calls: Call[] = [];
  const saved: number[] = [];
  const saver = new RegionAutosaver({
    initial: { version: initialVersion, regions: set() },
    send: (request) => new Promise<SendResult>((resolve) => calls.push({ request, answer: resolve })),
    timers: { setTimeout: (fn, ms) => setTimeout(fn, ms), clearTimeout: (h) => clearTimeout(h as ReturnType<typeof setTimeout>), now: () => Date.now() },
    onSaved: (s) => saved.push(s.version),
  });
  const ok = (call: Call, version: number) => call.answer({ kind: "saved", set: { version, regions: call.request.regions } });
  return { saver, calls, saved, ok };
}

beforeEach(() => vi.useFakeTimers());
afterEach(() => vi.useRealTimers());

describe("autosave", () => {
  it("waits for the debounce after the last edit, then sends the newest set once", async () => {
    const { saver, calls, ok, saved } = setup();
    saver.edit(set("a"));
    await vi.advanceTimersByTimeAsync(500);
    saver.edit(set("a", "b"));
    await vi.advanceTimersByTimeAsync(799);
    expect(calls).toHaveLength(0);
    expect(saver.getStatus().kind).toBe("pending");
    await vi.advanceTimersByTimeAsync(1);
    expect(calls).toHaveLength(1);
    expect(calls[0].request).toEqual({ baseVersion: 3, regions: set("a", "b") });
    ok(calls[0], 4);
    await vi.advanceTimersByTimeAsync(0);
    expect(saver.getStatus()).toMatchObject({ kind: "saved", version: 4 });
    expect(saver.hasUnsaved()).toBe(false);
    expect(saved).toEqual([4]);
  });

  it("sends edits made during a save right after it, on the new version", async () => {
    const { saver, calls, ok } = setup();
    saver.edit(set("a"));
    await vi.advanceTimersByTimeAsync(800);
    saver.edit(set("a", "b"));
    expect(saver.getStatus().kind).toBe("saving");
    ok(calls[0], 4);
    await vi.advanceTimersByTimeAsync(0);
    expect(calls).toHaveLength(2);
    expect(calls[1].request).toEqual({ baseVersion: 4, regions: set("a", "b") });
  });

  it("while offline retries with growing waits, keeps the edits, and says unsaved", async () => {
    const { saver, calls, ok } = setup();
    saver.edit(set("a"));
    await vi.advanceTimersByTimeAsync(800);
    calls[0].answer({ kind: "retryable", message: "offline" });
    await vi.advanceTimersByTimeAsync(0);
    expect(saver.getStatus()).toEqual({ kind: "retrying", attempt: 1, retryInMs: 1000, message: "offline" });
    await vi.advanceTimersByTimeAsync(1000);
    calls[1].answer({ kind: "retryable", message: "offline" });
    await vi.advanceTimersByTimeAsync(0);
    expect(saver.getStatus()).toMatchObject({ kind: "retrying", attempt: 2, retryInMs: 2000 });
    await vi.advanceTimersByTimeAsync(1999);
    expect(calls).toHaveLength(2);
    saver.retryNow(); // the browser is online again
    expect(calls).toHaveLength(3);
    expect(saver.hasUnsaved()).toBe(true);
    expect(saver.latestRegions()).toEqual(set("a"));
    ok(calls[2], 4);
    await vi.advanceTimersByTimeAsync(0);
    expect(saver.getStatus()).toMatchObject({ kind: "saved", version: 4 });
  });

  it("caps the wait at 30 s", async () => {
    const { saver, calls } = setup();
    saver.edit(set("a"));
    await vi.advanceTimersByTimeAsync(800);
    const waits: number[] = [];
    for (let i = 0; i < 7; i++) {
      calls[i].answer({ kind: "retryable", message: "down" });
      await vi.advanceTimersByTimeAsync(0);
      const wait = (saver.getStatus() as { retryInMs: number }).retryInMs;
      waits.push(wait);
      await vi.advanceTimersByTimeAsync(wait);
    }
    expect(waits).toEqual([1000, 2000, 4000, 8000, 16000, 30000, 30000]);
    expect(calls).toHaveLength(8);
    expect(saver.getStatus()).toEqual({ kind: "saving", attempt: 7 }); // a retry, so the page keeps its "Try again now" button (disabled);
  });

  it("holds a 409 for the person, then saves what they chose over the server's version", async () => {
    const { saver, calls, ok } = setup();
    saver.edit(set("mine"));
    await vi.advanceTimersByTimeAsync(800);
    const current = { version: 5, regions: set("theirs") };
    calls[0].answer({ kind: "conflict", current, message: "changed elsewhere" });
    await vi.advanceTimersByTimeAsync(0);
    expect(saver.getStatus()).toEqual({ kind: "conflict", current, message: "changed elsewhere" });
    saver.edit(set("mine", "more"));
    await vi.advanceTimersByTimeAsync(5000);
    expect(calls).toHaveLength(1); // nothing is sent until the person decides
    expect(await saver.flush()).toBe(false);
    saver.resolveConflict(current, set("theirs", "mine", "more"));
    expect(calls[1].request).toEqual({ baseVersion: 5, regions: set("theirs", "mine", "more") });
    ok(calls[1], 6);
    await vi.advanceTimersByTimeAsync(0);
    expect(saver.getStatus()).toMatchObject({ kind: "saved", version: 6 });
  });

  it("taking theirs saves nothing (the set is the server's already)", async () => {
    const { saver, calls } = setup();
    saver.edit(set("mine"));
    await vi.advanceTimersByTimeAsync(800);
    const current = { version: 5, regions: set("theirs") };
    calls[0].answer({ kind: "conflict", current, message: "x" });
    await vi.advanceTimersByTimeAsync(0);
    saver.resolveConflict(current, current.regions);
    saver.edit(JSON.parse(JSON.stringify(current.regions))); // the canvas reports the replaced set
    await vi.advanceTimersByTimeAsync(2000);
    expect(calls).toHaveLength(1);
    expect(saver.getStatus()).toMatchObject({ kind: "saved", version: 5 });
  });

  it("flush sends at once and resolves true when saved, false when the save failed (it keeps retrying)", async () => {
    const { saver, calls, ok } = setup();
    expect(await saver.flush()).toBe(true);
    saver.edit(set("a"));
    const flushed = saver.flush();
    expect(calls).toHaveLength(1);
    ok(calls[0], 4);
    expect(await flushed).toBe(true);
    saver.edit(set("a", "b"));
    const failing = saver.flush();
    calls[1].answer({ kind: "retryable", message: "offline" });
    expect(await failing).toBe(false);
    expect(saver.getStatus().kind).toBe("retrying");
  });

  it("a refusal (4xx) shows the server's sentence and waits for the next edit or Try again", async () => {
    const { saver, calls } = setup();
    saver.edit(set("a"));
    await vi.advanceTimersByTimeAsync(800);
    calls[0].answer({ kind: "refused", message: "Ines has this unit on their bench" });
    await vi.advanceTimersByTimeAsync(60_000);
    expect(calls).toHaveLength(1);
    expect(saver.getStatus()).toEqual({ kind: "refused", message: "Ines has this unit on their bench" });
    saver.retryNow();
    expect(calls).toHaveLength(2);
  });

  it("an edit back to the saved set needs no save", async () => {
    const { saver, calls } = setup();
    saver.edit(set("a"));
    saver.edit(set());
    await vi.advanceTimersByTimeAsync(2000);
    expect(calls).toHaveLength(0);
    expect(saver.getStatus().kind).toBe("saved");
  });
});
