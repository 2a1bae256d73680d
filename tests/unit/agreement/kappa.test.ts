/**
 * Cohen's kappa, its 95 % interval and Gwet's AC1 against outside figures. Marks as in
 * docs/references.md: (a) read in a public source, (b) from memory, (c) common practice or our
 * own decision.
 * REF   docs/references.md, "Agreement between graders": worked examples (a).
 * SAS   SAS PROC FREQ printout for the 3 × 3 table [[0,4,1],[0,8,0],[0,1,5]] (simple and
 *       Cicchetti–Allison weighted kappa, ASE, 95 % limits), reproduced as the expected values of
 *       statsmodels' tests (statsmodels/stats/tests/test_inter_rater.py, TestUnweightedCohens and
 *       TestWeightedCohens) (a).
 * SM    statsmodels 0.13.5 (Debian python3-statsmodels), `cohens_kappa(table, wt=…)`, run
 *       2026-12-02: kappa, std_kappa, kappa_low, kappa_upp — an independent implementation of the
 *       Fleiss–Cohen–Everitt standard error (reference library).
 * HAND  hand computation written out beside the check.
 */
import { describe, expect, it } from "vitest";
import { cohenKappa, cohenKappaInterval, gwetAc1, kappaFromTable, kappaIntervalFromTable, type LabelPair } from "@/lib/agreement";

const GRADES = ["A", "B", "C", "Reject"] as const;

/** One [row category, column category] pair per count of a table. */
function pairsOf<T>(table: number[][], categories: readonly T[]): [T, T][] {
  const pairs: [T, T][] = [];
  table.forEach((row, i) =>
    row.forEach((count, j) => {
      for (let k = 0; k < count; k++) pairs.push([categories[i], categories[j]]);
    }),
  );
  return pairs;
}
const round = (value: number, digits: number) => Number(value.toFixed(digits));

const GWET_TABLE = [
  [40, 4, 4, 17],
  [6, 25, 2, 13],
  [4, 1, 21, 12],
  [15, 5, 9, 45],
];
const SAS_TABLE = [
  [0, 4, 1],
  [0, 8, 0],
  [0, 1, 5],
];

describe("cohenKappa: worked examples", () => {
  it("[[20, 5], [10, 15]] → p_o 0.70, p_e 0.50, κ 0.40 (REF a)", () => {
    expect(
      cohenKappa(
        pairsOf(
          [
            [20, 5],
            [10, 15],
          ],
          ["yes", "no"],
        ),
      ),
    ).toBeCloseTo(0.4, 12);
  });

  it("[[20, 20], [10, 50]] → κ ≈ 0.348 (REF a, Artstein & Poesio 2008 via scikit-learn's test)", () => {
    expect(
      round(
        cohenKappa(
          pairsOf(
            [
              [20, 20],
              [10, 50],
            ],
            [0, 1],
          ),
        ),
        3,
      ),
    ).toBe(0.348);
  });

  it("Gwet (2014) 4 × 4 table → κ 0.432 (REF a)", () => {
    expect(round(cohenKappa(pairsOf(GWET_TABLE, GRADES)), 3)).toBe(0.432);
  });

  it("SAS printout: simple κ 0.4842, Cicchetti–Allison (linear) weighted κ 0.4701 (SAS a)", () => {
    const pairs = pairsOf(SAS_TABLE, [1, 2, 3]);
    expect(round(cohenKappa(pairs), 4)).toBe(0.4842);
    expect(round(cohenKappa(pairs, { weights: "linear" }), 4)).toBe(0.4701);
  });

  it("quadratic weights match statsmodels on the Gwet table and the SAS table (SM)", () => {
    expect(cohenKappa(pairsOf(GWET_TABLE, GRADES), { weights: "quadratic", categories: GRADES })).toBeCloseTo(0.3831859441, 9);
    expect(cohenKappa(pairsOf(GWET_TABLE, GRADES), { weights: "linear", categories: GRADES })).toBeCloseTo(0.406810874, 9);
    expect(kappaFromTable(SAS_TABLE, "quadratic")).toBeCloseTo(0.4501607717, 9);
  });

  it("a table of counts gives the same kappa as its pairs", () => {
    for (const weights of ["none", "linear", "quadratic"] as const) {
      expect(kappaFromTable(GWET_TABLE, weights)).toBe(cohenKappa(pairsOf(GWET_TABLE, GRADES), { weights, categories: GRADES }));
    }
  });
});

describe("cohenKappa: the full grade scale (our choice, c)", () => {
  // Nobody gave a B. Pairs (first, second): (A,A) (C,C) (Reject,Reject) (A,C) (C,Reject); n = 5.
  // Rows A 2, C 2, Reject 1; columns A 1, C 2, Reject 2.
  const gradePairs: LabelPair[] = [
    ["A", "A"],
    ["C", "C"],
    ["Reject", "Reject"],
    ["A", "C"],
    ["C", "Reject"],
  ];

  it("quadratic weights on the full scale A=0, B=1, C=2, Reject=3 give 2/3 (HAND)", () => {
    // w: A–C 4, A–Reject 9, C–Reject 1. Σw·o = 4 + 1 = 5.
    // Σw·e = Σ w r_i c_j / n = (4·2·2 + 9·2·2 + 4·2·1 + 1·2·2 + 9·1·1 + 1·1·2) / 5 = 75/5 = 15.
    // κ_w = 1 − 5/15 = 2/3.
    expect(cohenKappa(gradePairs, { weights: "quadratic", categories: GRADES })).toBeCloseTo(2 / 3, 12);
  });

  it("only the observed labels (A=0, C=1, Reject=2) would give 11/16 instead (HAND)", () => {
    // w: A–C 1, A–Reject 4, C–Reject 1. Σw·o = 2; Σw·e = (1·4 + 4·4 + 1·2 + 1·4 + 4·1 + 1·2) / 5 = 32/5;
    // κ_w = 1 − 2/(32/5) = 11/16. Numbers without categories are placed by rank, as observed.
    const asNumbers = gradePairs.map(([a, b]) => [GRADES.indexOf(a as never), GRADES.indexOf(b as never)] as const);
    expect(cohenKappa(asNumbers, { weights: "quadratic" })).toBeCloseTo(11 / 16, 12);
    expect(cohenKappa(asNumbers, { weights: "quadratic", categories: [0, 1, 2, 3] })).toBeCloseTo(2 / 3, 12);
  });

  it("plain kappa does not depend on unused categories: 7/17 either way (HAND)", () => {
    // p_o = 3/5; p_e = (2·1 + 2·2 + 1·2)/25 = 8/25; κ = (15/25 − 8/25)/(17/25) = 7/17.
    expect(cohenKappa(gradePairs, { categories: GRADES })).toBeCloseTo(7 / 17, 12);
    expect(cohenKappa(gradePairs)).toBeCloseTo(7 / 17, 12);
  });

  it("refuses weighted kappa on text labels without categories (their order is unknown)", () => {
    expect(() => cohenKappa(gradePairs, { weights: "linear" })).toThrow(/pass categories/);
  });
});

describe("cohenKappa: degenerate and bad input", () => {
  it("is NaN when p_e = 1 (both raters gave B every time) and for no pairs, for every weighting (c)", () => {
    const allB: LabelPair[] = Array.from({ length: 12 }, () => ["B", "B"]);
    for (const weights of ["none", "linear", "quadratic"] as const) {
      expect(cohenKappa(allB, { weights, categories: GRADES })).toBeNaN();
      expect(cohenKappa([], { weights, categories: GRADES })).toBeNaN();
    }
    expect(cohenKappa(allB)).toBeNaN();
    expect(cohenKappaInterval(allB, { categories: GRADES })).toMatchObject({ kappa: Number.NaN, low: Number.NaN, high: Number.NaN, n: 12 });
  });

  it("is defined once a single pair disagrees, even with one category per rater", () => {
    // Rater 1 always A, rater 2 always B: p_o = 0, p_e = 0 → κ = 0.
    expect(
      cohenKappa(
        [
          ["A", "B"],
          ["A", "B"],
        ],
        { categories: GRADES },
      ),
    ).toBe(0);
  });

  it("names the offending label, weighting or cell", () => {
    expect(() => cohenKappa([["A", "D"]], { categories: GRADES })).toThrow(/label "D" is not one of the categories "A", "B", "C", "Reject"/);
    expect(() => cohenKappa([["A", "A"]], { categories: ["A", "A", "B"] })).toThrow(/must not repeat/);
    expect(() => cohenKappa([["A", "A"]], { weights: "cubic" as never })).toThrow(/weights must be/);
    expect(() => cohenKappa([["A"]] as never)).toThrow(/pairs\[0\] must be \[first, second\]/);
    expect(() => cohenKappa([[Number.NaN, 1]])).toThrow(/finite number/);
    expect(() => kappaFromTable([[1, 2], [3]])).toThrow(/square/);
    expect(() =>
      kappaFromTable([
        [1, -2],
        [3, 4],
      ]),
    ).toThrow(/cell \[0\]\[1\]/);
  });
});

describe("cohenKappaInterval (Fleiss, Cohen & Everitt 1969 standard error)", () => {
  it("reproduces SAS's ASE and 95 % limits for simple and weighted kappa (SAS a)", () => {
    const simple = kappaIntervalFromTable(SAS_TABLE, "none");
    expect([simple.kappa, simple.standardError, simple.low, simple.high].map((v) => round(v, 4))).toEqual([0.4842, 0.138, 0.2137, 0.7547]);
    const weighted = kappaIntervalFromTable(SAS_TABLE, "linear");
    expect([weighted.kappa, weighted.standardError, weighted.low, weighted.high].map((v) => round(v, 4))).toEqual([0.4701, 0.1457, 0.1845, 0.7558]);
    expect(simple.n).toBe(19);
  });

  it("matches statsmodels on the worked examples, all weightings (SM)", () => {
    const cases: [number[][], "none" | "linear" | "quadratic", number, number][] = [
      [
        [
          [20, 5],
          [10, 15],
        ],
        "none",
        0.1269960629,
        0.1510922905,
      ],
      [
        [
          [20, 20],
          [10, 50],
        ],
        "none",
        0.0950081805,
        0.1616134749,
      ],
      [GWET_TABLE, "none", 0.0459691816, 0.3414028356],
      [GWET_TABLE, "linear", 0.0533880507, 0.3021722174],
      [GWET_TABLE, "quadratic", 0.0657946958, 0.25423071],
      [SAS_TABLE, "quadratic", 0.1922326634, 0.0733916749],
    ];
    for (const [table, weights, standardError, low] of cases) {
      const result = kappaIntervalFromTable(table, weights);
      expect(result.standardError, `${weights} ${JSON.stringify(table)}`).toBeCloseTo(standardError, 9);
      expect(result.low).toBeCloseTo(low, 9);
    }
  });

  it("works from pairs on the full scale and stays within [−1, 1]", () => {
    const result = cohenKappaInterval(pairsOf(GWET_TABLE, GRADES), { weights: "quadratic", categories: GRADES });
    expect(result.standardError).toBeCloseTo(0.0657946958, 9);
    // Perfect agreement: SE 0 → [1, 1]; a near-perfect small table would reach past 1 unclamped.
    expect(
      kappaIntervalFromTable([
        [5, 0],
        [0, 5],
      ]),
    ).toMatchObject({ kappa: 1, standardError: 0, low: 1, high: 1 });
    const nearPerfect = kappaIntervalFromTable([
      [9, 1],
      [0, 10],
    ]);
    expect(nearPerfect.kappa + 1.96 * nearPerfect.standardError).toBeGreaterThan(1);
    expect(nearPerfect.high).toBe(1);
  });
});

describe("gwetAc1", () => {
  it("Gwet (2014) 4 × 4 table → AC1 0.456 (REF a)", () => {
    expect(round(gwetAc1(pairsOf(GWET_TABLE, GRADES), { categories: GRADES }), 3)).toBe(0.456);
  });

  it("stays high where kappa collapses on skewed grades (REF: the paradox AC1 answers; HAND)", () => {
    // 95 (A,A), 2 (A,B), 2 (B,A), 1 (B,B): p_o 0.96; p_e(κ) = 0.97² + 0.03² = 0.9418 → κ = 0.0182/0.0582.
    // AC1 on the 4-grade scale: π_A 0.97, π_B 0.03, p_e = (0.0291 + 0.0291)/3 = 0.0194 → 0.9406/0.9806.
    const pairs = pairsOf(
      [
        [95, 2],
        [2, 1],
      ],
      ["A", "B"],
    );
    expect(cohenKappa(pairs, { categories: GRADES })).toBeCloseTo(0.0182 / 0.0582, 12);
    expect(gwetAc1(pairs, { categories: GRADES })).toBeCloseTo(0.9406 / 0.9806, 12);
  });

  it("uses the full scale: the number of categories changes p_e (HAND)", () => {
    // Same pairs on a 2-category scale: p_e = 0.0582/1 → AC1 = (0.96 − 0.0582)/(1 − 0.0582).
    expect(
      gwetAc1(
        pairsOf(
          [
            [95, 2],
            [2, 1],
          ],
          ["A", "B"],
        ),
        { categories: ["A", "B"] },
      ),
    ).toBeCloseTo(0.9018 / 0.9418, 12);
  });

  it("is 1 for unanimous data (where kappa is undefined), NaN for no pairs, and needs categories", () => {
    const allB: LabelPair[] = Array.from({ length: 5 }, () => ["B", "B"]);
    expect(gwetAc1(allB, { categories: GRADES })).toBe(1);
    expect(gwetAc1([], { categories: GRADES })).toBeNaN();
    expect(() => gwetAc1(allB, undefined as never)).toThrow(/categories are required/);
    expect(() => gwetAc1(allB, { categories: ["B"] })).toThrow(/at least two categories/);
  });
});
