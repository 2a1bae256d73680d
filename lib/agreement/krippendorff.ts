/**
 * Krippendorff's alpha for any number of raters with missing ratings: α = 1 − D_o / D_e, after
 * Krippendorff (2011), "Computing Krippendorff's Alpha-Reliability" (docs/references.md,
 * "Agreement between graders"). `data` has one row per rater and one entry per unit; `null` (or
 * undefined) where that rater gave no value.
 *
 * - Only "pairable" values count: those of units with at least two values. With n pairable values
 *   in all, n_c of them equal to c, and m_u values in unit u,
 *   D_o = (1/n) Σ_u Σ_{ordered pairs i ≠ j in u} δ²(x_i, x_j) / (m_u − 1) and
 *   D_e = Σ_c Σ_k n_c n_k δ²(c, k) / (n (n − 1)) — the coincidence-matrix form written per unit.
 * - Metrics: nominal δ² = [c ≠ k]; interval δ² = (c − k)² on the numbers themselves, or on the
 *   positions 0, 1, 2, … of labels in `categories` (equal spacing); ordinal
 *   δ² = (Σ_{g from c to k} n_g − (n_c + n_k)/2)², which needs the order: numbers ascending, or
 *   `categories`. Categories nobody used have n_g = 0 and change nothing.
 * - NaN (undefined) when fewer than two pairable values exist or D_e = 0 (every pairable value is
 *   the same: the data show no variation to agree about).
 * - `weights` (optional, one whole number ≥ 0 per unit): unit u counts as weights[u] identical
 *   units — the same alpha as repeating its column that many times, without building the
 *   repeated data (the scorecards pass counted grade sets, lib/recheck/scorecards-read.ts).
 */
import { resolveScale, type Label } from "@/lib/agreement/labels";

export type AlphaMetric = "nominal" | "ordinal" | "interval";
export type AlphaValue = Label | null | undefined;

export function krippendorffAlpha(data: readonly (readonly AlphaValue[])[], options: { metric: AlphaMetric; categories?: readonly Label[]; weights?: readonly number[] }): number {
  const { metric, categories, weights } = options ?? {};
  if (metric !== "nominal" && metric !== "ordinal" && metric !== "interval") {
    throw new RangeError(`krippendorffAlpha: metric must be "nominal", "ordinal" or "interval", got ${String(metric)}.`);
  }
  if (!Array.isArray(data) || data.some((row) => !Array.isArray(row))) throw new TypeError("krippendorffAlpha: data must be one array of values per rater.");
  const unitCount = data[0]?.length ?? 0;
  data.forEach((row, rater) => {
    if (row.length !== unitCount) throw new RangeError(`krippendorffAlpha: rater ${rater} has ${row.length} entries, expected ${unitCount} (one per unit; null where missing).`);
  });
  const weightOf = checkedWeights(weights, unitCount, "krippendorffAlpha");

  const present = (value: AlphaValue): value is Label => value !== null && value !== undefined;
  const scale = resolveScale(
    data.flatMap((row) => row.filter(present)),
    categories,
    metric === "ordinal" || (metric === "interval" && categories !== undefined),
    "krippendorffAlpha",
  );
  if (metric === "interval" && categories === undefined && scale.categories.some((value) => typeof value !== "number")) {
    throw new RangeError("krippendorffAlpha: the interval metric needs numbers, or categories to place text labels on an equally spaced scale.");
  }

  // Pairable units as lists of scale positions; value counts n_c over pairable values.
  const units: { values: number[]; weight: number }[] = [];
  for (let unit = 0; unit < unitCount; unit++) {
    const values = data
      .map((row) => row[unit])
      .filter(present)
      .map(scale.indexOf);
    if (values.length >= 2) units.push({ values, weight: weightOf(unit) });
  }
  const counts = new Array<number>(scale.categories.length).fill(0);
  for (const { values, weight } of units) for (const position of values) counts[position] += weight;
  const n = counts.reduce((sum, count) => sum + count, 0);
  if (n < 2) return Number.NaN;

  const distance = distanceFunction(metric, scale.categories, counts, categories !== undefined);
  let observed = 0;
  for (const { values, weight } of units) {
    let unitSum = 0;
    for (let i = 0; i < values.length; i++) for (let j = 0; j < values.length; j++) if (i !== j) unitSum += distance(values[i], values[j]);
    observed += (weight * unitSum) / (values.length - 1);
  }
  observed /= n;
  let expected = 0;
  for (let c = 0; c < counts.length; c++) {
    if (counts[c] === 0) continue;
    for (let k = 0; k < counts.length; k++) if (counts[k] > 0) expected += counts[c] * counts[k] * distance(c, k);
  }
  expected /= n * (n - 1);
  return expected === 0 ? Number.NaN : 1 - observed / expected;
}

/** δ²(c, k) between two scale positions. */
function distanceFunction(metric: AlphaMetric, scale: Label[], counts: number[], spacedByPosition: boolean): (c: number, k: number) => number {
  if (metric === "nominal") return (c, k) => (c === k ? 0 : 1);
  if (metric === "interval") {
    const value = spacedByPosition ? (position: number) => position : (position: number) => scale[position] as number;
    return (c, k) => (value(c) - value(k)) ** 2;
  }
  // Ordinal: cumulative counts in scale order, so Σ_{g=c..k} n_g is a difference of two sums.
  const before = [0];
  for (const count of counts) before.push(before[before.length - 1] + count);
  return (c, k) => {
    const [low, high] = c <= k ? [c, k] : [k, c];
    if (low === high) return 0;
    return (before[high + 1] - before[low] - (counts[low] + counts[high]) / 2) ** 2;
  };
}

/** Each unit's weight (1 without weights); refuses a list of the wrong length or a weight that is not a whole number ≥ 0. */
export function checkedWeights(weights: readonly number[] | undefined, unitCount: number, where: string): (unit: number) => number {
  if (weights === undefined) return () => 1;
  if (!Array.isArray(weights) || weights.length !== unitCount)
    throw new RangeError(`${where}: weights must have one entry per unit (${unitCount}), got ${Array.isArray(weights) ? weights.length : typeof weights}.`);
  weights.forEach((weight, unit) => {
    if (!Number.isInteger(weight) || weight < 0) throw new RangeError(`${where}: the weight of unit ${unit} must be a whole number >= 0, got ${weight}.`);
  });
  return (unit) => weights[unit];
}
