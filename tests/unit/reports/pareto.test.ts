/**
 * Pareto rows and chart geometry. The worked example is ours (c): counts 40, 25, 15, 10, 6, 4
 * (total 100) make the cumulative shares 40, 65, 80, 90, 96, 100 % by hand. The geometry is
 * checked against d3-scale's documented behaviour (band scale with padding; linear `nice`, a)
 * recomputed here by hand for a small case.
 */
import { describe, expect, it } from "vitest";
import { paretoRows } from "@/lib/reports/pareto";
import { countAxis, paretoGeometry } from "@/lib/reports/pareto-geometry";

const input = [
  { key: "dent", label: "Dent", count: 10 },
  { key: "scratch", label: "Scratch", count: 40 },
  { key: "chip", label: "Chip", count: 6 },
  { key: "crack", label: "Crack", count: 25 },
  { key: "dust", label: "Dust under glass", count: 4 },
  { key: "moisture", label: "Moisture mark", count: 15 },
  { key: "swelling", label: "Swelling", count: 0 },
];

describe("paretoRows", () => {
  it("sorts by count and adds shares and cumulative shares (hand-computed example)", () => {
    const rows = paretoRows(input);
    expect(rows.map((r) => r.key)).toEqual(["scratch", "crack", "moisture", "dent", "chip", "dust"]);
    expect(rows.map((r) => r.cumulative)).toEqual([40, 65, 80, 90, 96, 100]);
    expect(rows.map((r) => r.cumulativeShare)).toEqual([0.4, 0.65, 0.8, 0.9, 0.96, 1]);
    expect(rows.map((r) => r.share)).toEqual([0.4, 0.25, 0.15, 0.1, 0.06, 0.04]);
  });

  it("marks the vital few up to and including the class that reaches the cut-off", () => {
    expect(paretoRows(input).map((r) => r.vitalFew)).toEqual([true, true, true, false, false, false]);
    expect(paretoRows(input, { cutoff: 0.5 }).map((r) => r.vitalFew)).toEqual([true, true, false, false, false, false]);
  });

  it("breaks ties by label, merges repeated keys and drops zero counts", () => {
    const rows = paretoRows([
      { key: "b", label: "Écaille", count: 2 },
      { key: "a", label: "Ecart", count: 2 },
      { key: "a", label: "Ecart", count: 1 },
      { key: "z", label: "Zero", count: 0 },
    ]);
    expect(rows.map((r) => [r.key, r.count])).toEqual([
      ["a", 3],
      ["b", 2],
    ]);
    // Locale order reads "Écaille" before "Ecart" (i < r); code-unit order would put É after E.
    const tied = [
      { key: "b", label: "Ecart", count: 1 },
      { key: "a", label: "Écaille", count: 1 },
    ];
    expect(paretoRows(tied).map((r) => r.label)).toEqual(["Écaille", "Ecart"]);
  });

  it("ends at exactly 100 % with awkward counts, and is empty for no defects", () => {
    const rows = paretoRows([1, 1, 1, 1, 1, 1, 1].map((count, i) => ({ key: `k${i}`, label: `K${i}`, count })));
    expect(rows.at(-1)?.cumulativeShare).toBe(1);
    expect(paretoRows([])).toEqual([]);
  });

  it("refuses counts that are not whole numbers >= 0 and a cut-off outside (0, 1]", () => {
    expect(() => paretoRows([{ key: "a", label: "A", count: -1 }])).toThrow(/whole number/);
    expect(() => paretoRows([{ key: "a", label: "A", count: 1.5 }])).toThrow(/whole number/);
    expect(() => paretoRows(input, { cutoff: 0 })).toThrow(/cut-off/);
  });
});

describe("paretoGeometry", () => {
  const rows = paretoRows([
    { key: "a", label: "A", count: 9 },
    { key: "b", label: "B", count: 2 },
    { key: "c", label: "C", count: 1 },
  ]);
  const margin = { top: 0, right: 0, bottom: 0, left: 0 };

  it("places bars on a padded band scale and heights on a nice count axis (recomputed by hand)", () => {
    const g = paretoGeometry(rows, { width: 320, height: 100, margin });
    // Band scale, 3 bands, padding 0.2 (inner and outer): step = 320 / (3 - 0.2 + 2 * 0.2) = 100, bandwidth 80, first at 20.
    const round = (n: number) => Math.round(n * 1e6) / 1e6;
    expect(g.bars.map((b) => [round(b.x), round(b.width)])).toEqual([
      [20, 80],
      [120, 80],
      [220, 80],
    ]);
    // nice(5) on [0, 9]: 9 / 5 = 1.8 ≥ √2, so the step is 2 (d3's 1-2-5 rule, b) and the domain [0, 10].
    expect(g.bars.map((b) => round(b.height))).toEqual([90, 20, 10]);
    expect(g.countTicks.map((t) => t.value)).toEqual([0, 2, 4, 6, 8, 10]);
  });

  it("joins the bar centres at their cumulative share, with the cut-off line at 80 %", () => {
    const g = paretoGeometry(rows, { width: 320, height: 100, margin });
    const round = (n: number) => Math.round(n * 1e6) / 1e6;
    // Cumulative shares 9/12, 11/12 and 12/12 of a 100-unit-high plot.
    expect(g.line.map((p) => [round(p.x), round(p.y)])).toEqual([
      [60, 25],
      [160, round(100 / 12)],
      [260, 0],
    ]);
    expect(g.cutoff?.value).toBe(0.8);
    expect(g.cutoff?.y).toBeCloseTo(20, 9);
  });

  it("shows whole-number ticks only, and refuses a chart smaller than its margins", () => {
    const g = paretoGeometry(paretoRows([{ key: "a", label: "A", count: 1 }]), { width: 200, height: 100 });
    expect(g.countTicks.every((t) => Number.isInteger(t.value))).toBe(true);
    expect(() => paretoGeometry(rows, { width: 50, height: 40 })).toThrow(/too small/);
  });

  // The screen's recharts axis takes these too (components/reports/pareto-chart.tsx).
  it("gives a count axis that ends at the data's nice maximum, in whole numbers (d3 nice, 1-2-5 steps, a)", () => {
    // One defect: [0, 1] is already nice (step 0.2), so the axis ends at 1 with ticks 0 and 1 (not 0–4).
    expect(countAxis(1)).toEqual({ max: 1, ticks: [0, 1] });
    expect(countAxis(0)).toEqual({ max: 1, ticks: [0, 1] });
    // 3 / 5 = 0.6 → step 0.5; [0, 3] stays; the whole ticks are 0, 1, 2, 3.
    expect(countAxis(3)).toEqual({ max: 3, ticks: [0, 1, 2, 3] });
    // 7 / 5 = 1.4 < √2 ≈ 1.414 (d3 tickIncrement: thresholds √50, √10, √2) → step 1, so [0, 7].
    expect(countAxis(7)).toEqual({ max: 7, ticks: [0, 1, 2, 3, 4, 5, 6, 7] });
    // 9 → step 2, [0, 10] (as the geometry test above); 83 → step 20, [0, 100].
    expect(countAxis(9)).toEqual({ max: 10, ticks: [0, 2, 4, 6, 8, 10] });
    expect(countAxis(83)).toEqual({ max: 100, ticks: [0, 20, 40, 60, 80, 100] });
  });
});
