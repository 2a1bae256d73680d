/**
 * mapBounded: results in the items' order, never more than `limit` calls at once, and a failure
 * stops the rest. Timings are made with explicit gates (promises the test resolves), not sleeps.
 */
import { describe, expect, it } from "vitest";
import { mapBounded } from "@/lib/async/map-bounded";

/** A promise the test settles by hand. */
function gate<T = void>() {
  let resolve!: (value: T) => void;
  let reject!: (error: unknown) => void;
  const promise = new Promise<T>((res, rej) => ((resolve = res), (reject = rej)));
  return { promise, resolve, reject };
}
const tick = () => new Promise((resolve) => setImmediate(resolve));

describe("mapBounded", () => {
  it("keeps the items' order when later items finish first", async () => {
    const gates = [gate(), gate(), gate(), gate()];
    const running = mapBounded([10, 20, 30, 40], 4, async (n, i) => {
      await gates[i].promise;
      return n + i;
    });
    for (const i of [3, 2, 1, 0]) {
      gates[i].resolve();
      await tick();
    }
    await expect(running).resolves.toEqual([10, 21, 32, 43]);
  });

  it("runs at most `limit` at once and starts the next as one finishes", async () => {
    const gates = Array.from({ length: 5 }, () => gate());
    const started: number[] = [];
    let inFlight = 0;
    let most = 0;
    const running = mapBounded([0, 1, 2, 3, 4], 2, async (n) => {
      started.push(n);
      most = Math.max(most, ++inFlight);
      await gates[n].promise;
      inFlight--;
      return n * n;
    });
    await tick();
    expect(started).toEqual([0, 1]);
    gates[1].resolve();
    await tick();
    expect(started).toEqual([0, 1, 2]);
    for (const g of gates) g.resolve();
    await expect(running).resolves.toEqual([0, 1, 4, 9, 16]);
    expect(most).toBe(2);
  });

  it("rejects with the first error, starts nothing after it, and waits for the calls already running", async () => {
    const gates = Array.from({ length: 4 }, () => gate());
    const started: number[] = [];
    const finished: number[] = [];
    const running = mapBounded([0, 1, 2, 3], 2, async (n) => {
      started.push(n);
      await gates[n].promise;
      finished.push(n);
      return n;
    });
    let settled = false;
    running.catch(() => {}).finally(() => (settled = true));
    await tick();
    gates[0].reject(new Error("photo 0 is corrupt"));
    await tick();
    expect(settled).toBe(false); // item 1 is still running
    gates[1].resolve();
    await expect(running).rejects.toThrow("photo 0 is corrupt");
    expect(started).toEqual([0, 1]);
    expect(finished).toEqual([1]);
  });

  it("handles an empty list and more lanes than items", async () => {
    await expect(mapBounded([], 3, async () => 1)).resolves.toEqual([]);
    await expect(mapBounded(["a"], 8, async (s) => s.toUpperCase())).resolves.toEqual(["A"]);
  });

  it("refuses a limit that is not a positive integer", async () => {
    await expect(mapBounded([1], 0, async (n) => n)).rejects.toThrow(RangeError);
    await expect(mapBounded([1], 1.5, async (n) => n)).rejects.toThrow(RangeError);
  });
});
