/**
 * Gwet's AC1 for any number of raters, and the Wilson interval of a share.
 * IRR   Gwet (2014), Handbook of Inter-Rater Reliability, 4th ed.: the 4 raters × 12 units data
 *       (p. 120) and the 5 observers × 15 units data (p. 125), as published in his irrCAC package
 *       (`cac.raw4raters`, `cac.raw5observers`) and in its Python port's tests
 *       (afergadis/irrCAC, test/unit/irrCAC/raw/test_gwet.py): AC1 0.775 (p_a 0.818, p_e 0.190)
 *       and 0.497 (p_a 0.616, p_e 0.236) (a).
 * ABS   irrCAC's vignette: the two-rater table cont3x3abstractors [[13,0,0],[0,20,7],[0,4,56]] →
 *       Gwet's AC1 0.8493305 (a).
 * REF   docs/references.md: Gwet (2014) 4 × 4 two-rater table → AC1 0.456 (a).
 * NEW   Newcombe (1998), Statistics in Medicine 17:857–872, Table I, Wilson score interval without
 *       continuity correction: 81/263 → 0.2553–0.3662, 15/148 → 0.0624–0.1605, 0/20 → 0–0.1611,
 *       1/29 → 0.0061–0.1718 (b, from memory) — all four confirmed to 10 digits by SciPy 1.17.1
 *       (the machine's Python 3.11 site packages, `binomtest(k, n).proportion_ci(method="wilson")`),
 *       a reference library; SciPy also for 4/5 and 29/29.
 */
import { describe, expect, it } from "vitest";
import { gwetAc1, gwetAc1Units, wilsonInterval, type Label } from "@/lib/agreement";

const round = (value: number, digits: number) => Number(value.toFixed(digits));

/** Units as lists of the ratings they got (nulls dropped), from one column per rater. */
function unitsOf(raters: (number | null)[][]): number[][] {
  return raters[0].map((_, unit) => raters.map((row) => row[unit]).filter((value): value is number => value !== null));
}

// cac.raw4raters, one array per rater, units 1–12.
const FOUR_RATERS = unitsOf([
  [1, 2, 3, 3, 2, 1, 4, 1, 2, null, null, null],
  [1, 2, 3, 3, 2, 2, 4, 1, 2, 5, null, null],
  [null, 3, 3, 3, 2, 3, 4, 2, 2, 5, 1, 3],
  [1, 2, 3, 3, 2, 4, 4, 1, 2, 5, 1, null],
]);
// cac.raw5observers, one array per observer, units 1–15.
const FIVE_OBSERVERS = unitsOf([
  [1, 1, 2, null, 0, 0, 1, 1, 2, 2, null, 0, 1, 3, 1],
  [1, 1, 3, 0, 0, 0, 0, null, 2, 1, 1, 0, 2, 3, 1],
  [2, 0, 3, 0, 0, 0, 2, 2, 2, 1, 0, 0, 2, 2, 1],
  [null, 1, 3, null, null, null, null, 0, null, 1, 0, 0, 2, 2, null],
  [2, null, null, 0, 0, 0, 1, null, 2, null, null, null, null, 3, 1],
]);

function pairsOf(table: number[][], categories: Label[]): [Label, Label][] {
  const pairs: [Label, Label][] = [];
  table.forEach((row, i) =>
    row.forEach((count, j) => {
      for (let k = 0; k < count; k++) pairs.push([categories[i], categories[j]]);
    }),
  );
  return pairs;
}

describe("gwetAc1Units", () => {
  it("Gwet (2014) 4 raters × 12 units with missing ratings → AC1 0.775 (IRR a)", () => {
    expect(round(gwetAc1Units(FOUR_RATERS, { categories: [1, 2, 3, 4, 5] }), 3)).toBe(0.775);
  });

  it("Gwet (2014) 5 observers × 15 units → AC1 0.497 (IRR a)", () => {
    expect(round(gwetAc1Units(FIVE_OBSERVERS, { categories: [0, 1, 2, 3] }), 3)).toBe(0.497);
  });

  it("with two ratings per unit it is the two-rater AC1: 0.8493305 and 0.456 (ABS a, REF a)", () => {
    const abstractors = pairsOf(
      [
        [13, 0, 0],
        [0, 20, 7],
        [0, 4, 56],
      ],
      ["ectopic", "aiu", "niu"],
    );
    expect(
      gwetAc1Units(
        abstractors.map((pair) => [...pair]),
        { categories: ["ectopic", "aiu", "niu"] },
      ),
    ).toBeCloseTo(0.8493305, 7);
    const grades = ["A", "B", "C", "Reject"];
    const gwet = pairsOf(
      [
        [40, 4, 4, 17],
        [6, 25, 2, 13],
        [4, 1, 21, 12],
        [15, 5, 9, 45],
      ],
      grades,
    );
    const twoRater = gwetAc1(gwet, { categories: grades });
    expect(round(twoRater, 3)).toBe(0.456);
    expect(
      gwetAc1Units(
        gwet.map((pair) => [...pair]),
        { categories: grades },
      ),
    ).toBeCloseTo(twoRater, 12);
  });

  it("weights: a unit of weight w gives the AC1 of that unit repeated w times (IRR data)", () => {
    for (const [units, categories] of [
      [FOUR_RATERS, [1, 2, 3, 4, 5]],
      [FIVE_OBSERVERS, [0, 1, 2, 3]],
    ] as const) {
      const weights = units.map((_, unit) => (unit % 3) + 1);
      const repeated = units.flatMap((unit, index) => Array.from({ length: weights[index] }, () => unit));
      const weighted = gwetAc1Units(units, { categories, weights });
      expect(weighted).toBeCloseTo(gwetAc1Units(repeated, { categories }), 12);
      expect(Math.abs(weighted - gwetAc1Units(units, { categories }))).toBeGreaterThan(1e-6);
    }
    expect(round(gwetAc1Units(FOUR_RATERS, { categories: [1, 2, 3, 4, 5], weights: new Array(12).fill(1) }), 3)).toBe(0.775);
    expect(() => gwetAc1Units(FOUR_RATERS, { categories: [1, 2, 3, 4, 5], weights: [2] })).toThrow(/one entry per unit/);
  });

  it("a unit rated once counts in the chance term only; NaN when no unit has two ratings", () => {
    // Hand computation: units [A,A], [B,B], [A]; p_a = 1; π_A = (1 + 0 + 1)/3, π_B = 1/3;
    // p_e = (2/3·1/3 + 1/3·2/3) / (2 − 1) = 4/9; AC1 = (1 − 4/9)/(1 − 4/9) = 1.
    expect(gwetAc1Units([["A", "A"], ["B", "B"], ["A"]], { categories: ["A", "B"] })).toBeCloseTo(1, 12);
    // Units [A,B], [A,A,B]: p_a = (0 + 2/6)/2 = 1/6; π_A = (1/2 + 2/3)/2 = 7/12; p_e = 2·(7/12)(5/12)/1 = 70/144;
    // AC1 = (1/6 − 70/144)/(1 − 70/144) = (24 − 70)/(144 − 70) = −46/74.
    expect(
      gwetAc1Units(
        [
          ["A", "B"],
          ["A", "A", "B"],
        ],
        { categories: ["A", "B"] },
      ),
    ).toBeCloseTo(-46 / 74, 12);
    expect(gwetAc1Units([["A"], []], { categories: ["A", "B"] })).toBeNaN();
  });

  it("refuses a label off the scale and a missing scale", () => {
    expect(() => gwetAc1Units([["A", "D"]], { categories: ["A", "B"] })).toThrow(/not one of the categories/);
    expect(() => gwetAc1Units([["A", "B"]], undefined as never)).toThrow(/categories are required/);
  });
});

describe("wilsonInterval", () => {
  it("Newcombe (1998) Table I examples, confirmed by SciPy (NEW)", () => {
    const cases: [number, number, number, number][] = [
      [81, 263, 0.2552885199, 0.366209577],
      [15, 148, 0.0623863995, 0.1604872417],
      [0, 20, 0, 0.1611251581],
      [1, 29, 0.0061132143, 0.1717552188],
      [4, 5, 0.3755346298, 0.9637758914],
      [29, 29, 0.8830302015, 1],
    ];
    for (const [k, n, low, high] of cases) {
      const interval = wilsonInterval(k, n);
      expect(interval.share).toBe(k / n);
      expect(interval.low, `${k}/${n} low`).toBeCloseTo(low, 9);
      expect(interval.high, `${k}/${n} high`).toBeCloseTo(high, 9);
    }
  });

  it("n = 0 has no interval; bad counts are refused", () => {
    expect(wilsonInterval(0, 0)).toMatchObject({ n: 0, share: Number.NaN, low: Number.NaN });
    expect(() => wilsonInterval(3, 2)).toThrow(RangeError);
    expect(() => wilsonInterval(-1, 2)).toThrow(RangeError);
    expect(() => wilsonInterval(1.5, 2)).toThrow(RangeError);
  });
});
