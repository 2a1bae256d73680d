/**
 * Krippendorff's alpha against outside figures. Marks as in docs/references.md: (a) read in a
 * public source, (b) from memory, (c) common practice or our own decision.
 * REF   docs/references.md, "Agreement between graders": the 3 × 15 example (nominal 0.691358,
 *       interval 0.810845) and Krippendorff (2011)'s binary (0.095) and nominal (0.692) examples (a).
 * K11   Krippendorff (2011), "Computing Krippendorff's Alpha-Reliability", 4 observers × 12 units
 *       with missing values: ordinal 0.815 as asserted by the tests of the Python package
 *       `krippendorff` (tests/test_krippendorff.py, test_ordinal_metric, also with the labels
 *       "very low" … "very high" as an ordered domain) (a); nominal 0.743 and interval 0.849
 *       as printed in the paper (b, from memory; our figures agree to three decimals).
 * COINC An independent computation in this file, following the paper's steps literally: the
 *       values-by-units matrix, then the coincidence matrix o_ck, then
 *       α = 1 − (n − 1) Σ o_ck δ²_ck / Σ n_c n_k δ²_ck. The 3 × 15 example's ordinal value, 0.806721,
 *       is verified this way (no published figure found) and by the ordinal check on K11's data,
 *       which runs through the same code.
 */
import { describe, expect, it } from "vitest";
import { krippendorffAlpha, type AlphaMetric, type AlphaValue } from "@/lib/agreement";
import { mulberry32 } from "@/support/prng";

const parseRow = (text: string) => text.split(" ").map((value) => (value === "." ? null : Number(value)));
const round = (value: number, digits: number) => Number(value.toFixed(digits));

const WIKI_3x15 = [parseRow(". . . . . 3 4 1 2 1 1 3 3 . 3"), parseRow("1 . 2 1 3 3 4 3 . . . . . . ."), parseRow(". . 2 1 3 4 4 . 2 1 1 3 3 . 4")];
const K11_4x12 = [parseRow("1 2 3 3 2 1 4 1 2 . . ."), parseRow("1 2 3 3 2 2 4 1 2 5 . 3"), parseRow(". 3 3 3 2 3 4 2 2 5 1 ."), parseRow("1 2 3 3 2 4 4 1 2 5 1 .")];

/** COINC: alpha by the coincidence matrix, numeric values in ascending order. */
function alphaByCoincidences(data: AlphaValue[][], metric: AlphaMetric): number {
  const values = [...new Set(data.flat().filter((value) => value !== null))].map(Number).sort((x, y) => x - y);
  const size = values.length;
  const o = Array.from({ length: size }, () => new Array<number>(size).fill(0));
  for (let unit = 0; unit < data[0].length; unit++) {
    const inUnit = data
      .map((row) => row[unit])
      .filter((value) => value !== null)
      .map((value) => values.indexOf(Number(value)));
    if (inUnit.length < 2) continue;
    inUnit.forEach((c, i) =>
      inUnit.forEach((k, j) => {
        if (i !== j) o[c][k] += 1 / (inUnit.length - 1);
      }),
    );
  }
  const nc = o.map((row) => row.reduce((sum, x) => sum + x, 0));
  const n = nc.reduce((sum, x) => sum + x, 0);
  const delta2 = (c: number, k: number) => {
    if (metric === "nominal") return c === k ? 0 : 1;
    if (metric === "interval") return (values[c] - values[k]) ** 2;
    let between = 0;
    for (let g = Math.min(c, k); g <= Math.max(c, k); g++) between += nc[g];
    return c === k ? 0 : (between - (nc[c] + nc[k]) / 2) ** 2;
  };
  let observed = 0;
  let expected = 0;
  for (let c = 0; c < size; c++) {
    for (let k = 0; k < size; k++) {
      observed += o[c][k] * delta2(c, k);
      expected += nc[c] * nc[k] * delta2(c, k);
    }
  }
  return 1 - ((n - 1) * observed) / expected;
}

describe("krippendorffAlpha: published examples", () => {
  it("3 coders × 15 units: nominal 0.691358, interval 0.810845 (REF a)", () => {
    expect(round(krippendorffAlpha(WIKI_3x15, { metric: "nominal" }), 6)).toBe(0.691358);
    expect(round(krippendorffAlpha(WIKI_3x15, { metric: "interval" }), 6)).toBe(0.810845);
  });

  it("3 coders × 15 units: ordinal 0.806721 (COINC)", () => {
    const ordinal = krippendorffAlpha(WIKI_3x15, { metric: "ordinal" });
    expect(round(ordinal, 6)).toBe(0.806721);
    expect(ordinal).toBeCloseTo(alphaByCoincidences(WIKI_3x15, "ordinal"), 12);
  });

  it("Krippendorff 2011, 4 observers × 12 units: ordinal 0.815 (K11 a), nominal 0.743 and interval 0.849 (K11 b)", () => {
    expect(round(krippendorffAlpha(K11_4x12, { metric: "ordinal" }), 3)).toBe(0.815);
    expect(round(krippendorffAlpha(K11_4x12, { metric: "nominal" }), 3)).toBe(0.743);
    expect(round(krippendorffAlpha(K11_4x12, { metric: "interval" }), 3)).toBe(0.849);
  });

  it("the same data as ordered text labels give the same ordinal 0.815 (K11 a, labels with a domain)", () => {
    const domain = ["very low", "low", "mid", "high", "very high"];
    const labelled = K11_4x12.map((row) => row.map((value) => (value === null ? null : domain[value - 1])));
    expect(round(krippendorffAlpha(labelled, { metric: "ordinal", categories: domain }), 3)).toBe(0.815);
    // Interval on labels places them 0, 1, 2, … — the same as 1…5, since alpha ignores shifts.
    expect(krippendorffAlpha(labelled, { metric: "interval", categories: domain })).toBeCloseTo(krippendorffAlpha(K11_4x12, { metric: "interval" }), 12);
  });

  it("Krippendorff 2011 binary example → 0.095, nominal example → 0.692 (REF a)", () => {
    const binary = [parseRow("0 1 0 0 0 0 0 0 1 0"), parseRow("1 1 1 0 0 1 0 0 0 0")];
    expect(round(krippendorffAlpha(binary, { metric: "nominal" }), 3)).toBe(0.095);
    const letters = ["a a b b d c c c e d d a".split(" "), "b a b b b c c c e d d d".split(" ")];
    expect(round(krippendorffAlpha(letters, { metric: "nominal" }), 3)).toBe(0.692);
  });

  it("with two values only, every metric gives the same alpha (δ² is one constant; follows from the definition)", () => {
    const binary = [parseRow("0 1 0 0 0 0 0 0 1 0"), parseRow("1 1 1 0 0 1 0 0 0 0")];
    const nominal = krippendorffAlpha(binary, { metric: "nominal" });
    expect(krippendorffAlpha(binary, { metric: "ordinal" })).toBeCloseTo(nominal, 12);
    expect(krippendorffAlpha(binary, { metric: "interval" })).toBeCloseTo(nominal, 12);
  });
});

describe("krippendorffAlpha: against the coincidence-matrix computation (COINC)", () => {
  it("agrees on seeded random grade data with missing values, every metric", () => {
    const random = mulberry32(20261202);
    for (let trial = 0; trial < 25; trial++) {
      const raters = 2 + Math.floor(random() * 4);
      const units = 5 + Math.floor(random() * 40);
      const data = Array.from({ length: raters }, () => Array.from({ length: units }, () => (random() < 0.25 ? null : 1 + Math.floor(random() * 4))));
      for (const metric of ["nominal", "ordinal", "interval"] as const) {
        const expected = alphaByCoincidences(data, metric);
        const actual = krippendorffAlpha(data, { metric });
        if (Number.isNaN(expected)) expect(actual, `trial ${trial} ${metric}`).toBeNaN();
        else expect(actual, `trial ${trial} ${metric}`).toBeCloseTo(expected, 10);
      }
    }
  });
});

describe("krippendorffAlpha: grades, degenerate cases and bad input", () => {
  const GRADES = ["A", "B", "C", "Reject"];

  it("grades with categories equal their positions 0–3 as numbers", () => {
    const grades = [
      ["A", "B", null, "C", "Reject", "A"],
      ["A", "C", "B", "C", "C", null],
      [null, "B", "B", "Reject", "Reject", "A"],
    ];
    const numbers = grades.map((row) => row.map((grade) => (grade === null ? null : GRADES.indexOf(grade))));
    for (const metric of ["nominal", "ordinal", "interval"] as const) {
      expect(krippendorffAlpha(grades, { metric, categories: GRADES })).toBeCloseTo(krippendorffAlpha(numbers, { metric }), 12);
    }
  });

  it("is NaN with no variation or no pairable unit (c)", () => {
    expect(
      krippendorffAlpha(
        [
          ["B", "B", null],
          ["B", "B", "B"],
        ],
        { metric: "nominal" },
      ),
    ).toBeNaN();
    expect(
      krippendorffAlpha(
        [
          [1, null],
          [null, 2],
        ],
        { metric: "interval" },
      ),
    ).toBeNaN();
    expect(krippendorffAlpha([], { metric: "nominal" })).toBeNaN();
  });

  it("is 1 for perfect agreement with variation", () => {
    expect(
      krippendorffAlpha(
        [
          ["A", "C", "B"],
          ["A", "C", "B"],
          [null, "C", "B"],
        ],
        { metric: "ordinal", categories: GRADES },
      ),
    ).toBe(1);
  });

  it("refuses ragged rows, unknown labels, unordered text for ordinal and text for interval", () => {
    expect(() => krippendorffAlpha([[1, 2], [1]], { metric: "nominal" })).toThrow(/rater 1 has 1 entries, expected 2/);
    expect(() =>
      krippendorffAlpha(
        [
          ["A", "E"],
          ["A", "B"],
        ],
        { metric: "ordinal", categories: GRADES },
      ),
    ).toThrow(/"E" is not one of the categories/);
    expect(() =>
      krippendorffAlpha(
        [
          ["A", "B"],
          ["A", "B"],
        ],
        { metric: "ordinal" },
      ),
    ).toThrow(/pass categories/);
    expect(() =>
      krippendorffAlpha(
        [
          ["A", "B"],
          ["A", "B"],
        ],
        { metric: "interval" },
      ),
    ).toThrow(/interval metric needs numbers/);
    expect(() => krippendorffAlpha([[1, 2]], { metric: "ratio" as never })).toThrow(/metric must be/);
  });

  it("weights: a unit of weight w gives the alpha of its column repeated w times (K11, REF data; every metric)", () => {
    for (const data of [K11_4x12, WIKI_3x15]) {
      const weights = data[0].map((_, unit) => (unit % 3) + 1);
      const repeated = data.map((row) => row.flatMap((value, unit) => Array.from({ length: weights[unit] }, () => value)));
      for (const metric of ["nominal", "ordinal", "interval"] as const) {
        const weighted = krippendorffAlpha(data, { metric, weights });
        expect(weighted).toBeCloseTo(krippendorffAlpha(repeated, { metric }), 12);
        expect(Math.abs(weighted - krippendorffAlpha(data, { metric }))).toBeGreaterThan(1e-6);
      }
    }
    // Weights of 1 change nothing: K11's ordinal 0.815 (K11 a).
    expect(round(krippendorffAlpha(K11_4x12, { metric: "ordinal", weights: new Array(12).fill(1) }), 3)).toBe(0.815);
    expect(() => krippendorffAlpha(K11_4x12, { metric: "ordinal", weights: [1, 2] })).toThrow(/one entry per unit \(12\)/);
    expect(() =>
      krippendorffAlpha(
        [
          [1, 2],
          [1, 2],
        ],
        { metric: "nominal", weights: [1, -1] },
      ),
    ).toThrow(/whole number >= 0/);
  });
});
