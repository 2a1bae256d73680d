/**
 * The reproducible sample draw.
 * XS   ml-xsadd 2.0.0 (npm), an independent JavaScript implementation of Saito & Matsumoto's XSadd
 *      generator (a): our generator must produce the same numbers for the same seed.
 * FY   Fisher–Yates / Durstenfeld shuffle (Knuth TAOCP vol. 2 §3.4.2 Algorithm P, b): every ordered
 *      selection equally likely.
 * CHI  χ² critical value, 9 degrees of freedom, p = 0.001: 27.877 (a, standard χ² tables).
 */
import XSaddReference from "ml-xsadd";
import { describe, expect, it } from "vitest";
import { drawSample, parseSeed } from "@/lib/units/sample-draw";
import { XSadd } from "@/lib/units/xsadd";

describe("XSadd", () => {
  it("matches ml-xsadd for several seeds, over 1 000 outputs each (XS)", () => {
    for (const seed of [0, 1, 42, 123456789, 0xffffffff]) {
      const ours = new XSadd(seed);
      const reference = new XSaddReference(seed);
      for (let i = 0; i < 1000; i++) expect(ours.nextUint32(), `seed ${seed}, output ${i}`).toBe(reference.getUint32());
    }
  });

  it("nextBelow stays in range and refuses a bad bound", () => {
    const random = new XSadd(7);
    for (let i = 0; i < 1000; i++) {
      const value = random.nextBelow(13);
      expect(value).toBeGreaterThanOrEqual(0);
      expect(value).toBeLessThan(13);
    }
    expect(() => random.nextBelow(0)).toThrow(RangeError);
    expect(() => new XSadd(-1)).toThrow(RangeError);
  });
});

describe("drawSample", () => {
  const pool = Array.from({ length: 200 }, (_, i) => `OV-CAM-24-${String(i + 1).padStart(6, "0")}`);

  it("is reproducible: the same list and seed give the same sample in the same order", () => {
    const first = drawSample(pool, 32, "3141592653");
    expect(drawSample(pool, 32, "3141592653")).toEqual(first);
    expect(drawSample(pool, 32, "2718281828")).not.toEqual(first);
  });

  it("draws distinct items of the pool, and a longer draw starts with the shorter one", () => {
    const sample = drawSample(pool, 50, "99");
    expect(new Set(sample).size).toBe(50);
    expect(sample.every((s) => pool.includes(s))).toBe(true);
    expect(drawSample(pool, 20, "99")).toEqual(sample.slice(0, 20));
    expect(drawSample(pool, 200, "99").slice().sort()).toEqual(pool.slice().sort());
  });

  it("picks every position about equally often (FY; CHI at p = 0.001)", () => {
    // 10 items, draw 3, 20 000 seeds: each item is expected in 6 000 samples.
    const items = Array.from({ length: 10 }, (_, i) => i);
    const counts = new Array(10).fill(0);
    const firsts = new Array(10).fill(0);
    for (let seed = 0; seed < 20_000; seed++) {
      const sample = drawSample(items, 3, String((seed * 2654435761) % 4294967296));
      for (const item of sample) counts[item] += 1;
      firsts[sample[0]] += 1;
    }
    const chi = (observed: number[], expected: number) => observed.reduce((sum, o) => sum + (o - expected) ** 2 / expected, 0);
    expect(chi(counts, 6000)).toBeLessThan(27.877);
    expect(chi(firsts, 2000)).toBeLessThan(27.877);
  });

  it("refuses impossible draws and malformed seeds", () => {
    expect(() => drawSample(pool, 201, "1")).toThrow(/Cannot draw 201/);
    expect(() => drawSample(pool, 5, "-1")).toThrow(RangeError);
    expect(() => parseSeed("4294967296")).toThrow(RangeError);
    expect(() => parseSeed("12a")).toThrow(RangeError);
  });
});
