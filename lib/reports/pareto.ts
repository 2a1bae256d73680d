/**
 * Pareto analysis of defect classes: counts sorted from most to least frequent, with each class's
 * share and the cumulative share. Pure; the supplier scorecard (recharts) and the lot report
 * (pdfkit, through pareto-geometry.ts) draw from the same rows.
 *
 * Decisions:
 * - Order: count descending, then label (locale compare, so accented names sort naturally), then
 *   key — the same input always gives the same order.
 * - Classes with a count of 0 are dropped (a Pareto chart shows what occurred); negative or
 *   fractional counts are refused.
 * - Shares are fractions of the total (0..1); the last cumulative share is exactly 1 (computed
 *   from running integer sums, not by adding rounded shares).
 * - `vitalFew` marks the classes needed to reach the cut-off (80 % by default, the usual 80/20
 *   reading — c): every class up to and including the first whose cumulative share reaches it.
 */
export type ParetoInput = { key: string; label: string; count: number };
export type ParetoRow = ParetoInput & { share: number; cumulative: number; cumulativeShare: number; vitalFew: boolean };

export const DEFAULT_PARETO_CUTOFF = 0.8;

export function paretoRows(input: readonly ParetoInput[], { cutoff = DEFAULT_PARETO_CUTOFF }: { cutoff?: number } = {}): ParetoRow[] {
  if (!(cutoff > 0 && cutoff <= 1)) throw new RangeError("The Pareto cut-off is a share in (0, 1]");
  const merged = new Map<string, ParetoInput>();
  for (const item of input) {
    if (!Number.isInteger(item.count) || item.count < 0) throw new RangeError(`The count of "${item.label}" must be a whole number >= 0, got ${item.count}`);
    const seen = merged.get(item.key);
    merged.set(item.key, seen ? { ...seen, count: seen.count + item.count } : { ...item });
  }
  const sorted = [...merged.values()].filter((item) => item.count > 0).sort((a, b) => b.count - a.count || a.label.localeCompare(b.label) || (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
  const total = sorted.reduce((sum, item) => sum + item.count, 0);
  let running = 0;
  let reached = false;
  return sorted.map((item) => {
    running += item.count;
    const cumulativeShare = running / total;
    const vitalFew = !reached;
    if (cumulativeShare >= cutoff) reached = true;
    return { ...item, share: item.count / total, cumulative: running, cumulativeShare, vitalFew };
  });
}
