/**
 * Two-rater agreement on a grade scale: Cohen's kappa (plain, linear- or quadratic-weighted), its
 * 95 % confidence interval, and Gwet's AC1. Sources and checks: docs/references.md, "Agreement
 * between graders"; tests in tests/unit/agreement/.
 *
 * Decisions:
 * - Weighted kappa κ_w = 1 − Σ w·o / Σ w·e with disagreement weights w = |i − j| (linear) or
 *   (i − j)² (quadratic), i and j being positions on the scale; "none" is w = 1 off the diagonal,
 *   which is plain kappa (p_o − p_e) / (1 − p_e). With `categories`, positions are on the full
 *   scale even for grades nobody gave, so A vs C is two steps apart whether or not anyone gave a B.
 * - Degenerate cases give NaN ("undefined", shown as "n/a"), never a made-up number: no pairs, or
 *   chance agreement p_e = 1 (Σ w·e = 0: both raters gave one and the same category every time —
 *   then p_o = 1 too and κ = 0/0). Percent agreement and AC1 still describe such data.
 * - Interval: the large-sample standard error of Fleiss, Cohen & Everitt (1969), the one SAS PROC
 *   FREQ and statsmodels report, with z = 1.959964, clamped to [−1, 1]. Chosen over a bootstrap
 *   because it is deterministic (a scorecard shows the same figures on every load, no seed to
 *   store), costs one pass over the table (scorecards compute it per grader and week), and can be
 *   checked against published output. It is symmetric and optimistic for small n: show n beside it.
 */
import { checkPairs, contingencyTable, margins, resolveScale, type Label, type LabelPair } from "@/lib/agreement/labels";

export type KappaWeights = "none" | "linear" | "quadratic";
export type KappaOptions = { weights?: KappaWeights; categories?: readonly Label[] };
export type KappaInterval = { kappa: number; standardError: number; low: number; high: number; n: number };

/** Two-sided 95 % quantile of the standard normal distribution. */
const Z_95 = 1.959963984540054;

function disagreementWeight(weights: KappaWeights, i: number, j: number): number {
  if (weights === "linear") return Math.abs(i - j);
  if (weights === "quadratic") return (i - j) ** 2;
  return i === j ? 0 : 1;
}

function checkWeights(weights: unknown): asserts weights is KappaWeights {
  if (weights !== "none" && weights !== "linear" && weights !== "quadratic") {
    throw new RangeError(`cohenKappa: weights must be "none", "linear" or "quadratic", got ${String(weights)}.`);
  }
}

function tableOf(pairs: readonly LabelPair[], options: KappaOptions): { table: number[][]; weights: KappaWeights } {
  const weights = options.weights ?? "none";
  checkWeights(weights);
  checkPairs(pairs, "cohenKappa");
  const scale = resolveScale(pairs.flat(), options.categories, weights !== "none", "cohenKappa");
  return { table: contingencyTable(pairs, scale), weights };
}

/** Cohen's kappa of `[first, second]` label pairs (see the file head for the decisions). */
export function cohenKappa(pairs: readonly LabelPair[], options: KappaOptions = {}): number {
  const { table, weights } = tableOf(pairs, options);
  return kappaFromTable(table, weights);
}

/**
 * Kappa of a square table of counts (rows: first rater, columns: second rater, both in scale
 * order), e.g. counts aggregated by the database.
 */
export function kappaFromTable(table: readonly (readonly number[])[], weights: KappaWeights = "none"): number {
  checkWeights(weights);
  const { rows, columns, total } = margins(table, "kappaFromTable");
  if (total === 0) return Number.NaN;
  let observed = 0;
  let expected = 0;
  table.forEach((row, i) =>
    row.forEach((count, j) => {
      const weight = disagreementWeight(weights, i, j);
      observed += weight * count;
      expected += (weight * rows[i] * columns[j]) / total;
    }),
  );
  return expected === 0 ? Number.NaN : 1 - observed / expected;
}

/** Kappa with its 95 % interval and n (see the file head). */
export function cohenKappaInterval(pairs: readonly LabelPair[], options: KappaOptions = {}): KappaInterval {
  const { table, weights } = tableOf(pairs, options);
  return kappaIntervalFromTable(table, weights);
}

/**
 * Fleiss, Cohen & Everitt (1969): with agreement weights v = 1 − w / max(w), cell proportions p,
 * margins p_i. and p_.j, v̄_i = Σ_j p_.j v_ij, v̄_j = Σ_i p_i. v_ij and p_e = Σ v p_i. p_.j,
 * var κ = [Σ p_ij (v_ij − (v̄_i + v̄_j)(1 − κ))² − (κ − p_e (1 − κ))²] / (n (1 − p_e)²).
 */
export function kappaIntervalFromTable(table: readonly (readonly number[])[], weights: KappaWeights = "none"): KappaInterval {
  const kappa = kappaFromTable(table, weights);
  const { rows, columns, total: n } = margins(table, "kappaIntervalFromTable");
  if (Number.isNaN(kappa)) return { kappa, standardError: Number.NaN, low: Number.NaN, high: Number.NaN, n };
  const size = table.length;
  const maxWeight = disagreementWeight(weights, 0, size - 1);
  const agreement = (i: number, j: number) => 1 - disagreementWeight(weights, i, j) / maxWeight;
  const rowShare = rows.map((count) => count / n);
  const columnShare = columns.map((count) => count / n);
  const rowMean = rowShare.map((_, i) => columnShare.reduce((sum, share, j) => sum + share * agreement(i, j), 0));
  const columnMean = columnShare.map((_, j) => rowShare.reduce((sum, share, i) => sum + share * agreement(i, j), 0));
  const chance = rowShare.reduce((sum, share, i) => sum + share * rowMean[i], 0);
  let spread = 0;
  table.forEach((row, i) =>
    row.forEach((count, j) => {
      spread += (count / n) * (agreement(i, j) - (rowMean[i] + columnMean[j]) * (1 - kappa)) ** 2;
    }),
  );
  const variance = (spread - (kappa - chance * (1 - kappa)) ** 2) / (n * (1 - chance) ** 2);
  // Rounding can leave a tiny negative variance at perfect agreement.
  const standardError = Math.sqrt(Math.max(0, variance));
  return {
    kappa,
    standardError,
    low: Math.max(-1, kappa - Z_95 * standardError),
    high: Math.min(1, kappa + Z_95 * standardError),
    n,
  };
}

/**
 * Gwet's AC1 for two raters: (p_a − p_e) / (1 − p_e) with p_e = Σ_k π_k (1 − π_k) / (q − 1),
 * π_k the mean of the two raters' shares of category k and q the number of categories on the
 * (full) scale. p_e <= 1/q, so it is defined whenever there is a pair; NaN for no pairs.
 */
export function gwetAc1(pairs: readonly LabelPair[], options: { categories: readonly Label[] }): number {
  checkPairs(pairs, "gwetAc1");
  if (!options?.categories) throw new RangeError("gwetAc1: categories are required (the number of categories changes the result).");
  const scale = resolveScale(pairs.flat(), options.categories, false, "gwetAc1");
  const size = scale.categories.length;
  if (size < 2) throw new RangeError("gwetAc1: the scale needs at least two categories.");
  const table = contingencyTable(pairs, scale);
  const { rows, columns, total } = margins(table, "gwetAc1");
  if (total === 0) return Number.NaN;
  const observed = table.reduce((sum, row, k) => sum + row[k], 0) / total;
  const chance =
    rows.reduce((sum, rowCount, k) => {
      const share = (rowCount + columns[k]) / (2 * total);
      return sum + share * (1 - share);
    }, 0) /
    (size - 1);
  return (observed - chance) / (1 - chance);
}
