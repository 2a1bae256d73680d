/**
 * Gwet's AC1 for any number of raters per unit, with missing ratings (Gwet 2008; the form of
 * Gwet's Handbook of Inter-Rater Reliability, 2014, and of his irrCAC package's `gwet.ac1.raw`).
 * `units` holds, per unit, the labels it was given (one per rater who rated it; raters need not be
 * the same people from unit to unit). With r_i ratings on unit i, r_ik of them in category k,
 * q categories on the full scale and n units with at least one rating:
 *   p_a = mean over units with r_i >= 2 of Σ_k r_ik (r_ik − 1) / (r_i (r_i − 1))
 *   π_k = (1/n) Σ_i r_ik / r_i,   p_e = Σ_k π_k (1 − π_k) / (q − 1),   AC1 = (p_a − p_e) / (1 − p_e).
 * With two ratings on every unit this is exactly the two-rater `gwetAc1` (kappa.ts). NaN when no
 * unit has two ratings. Units with a single rating still count in π_k, as in the published form.
 * `weights` (optional, one whole number ≥ 0 per unit): unit i counts as weights[i] identical units.
 */
import { checkedWeights } from "@/lib/agreement/krippendorff";
import { resolveScale, type Label } from "@/lib/agreement/labels";

export function gwetAc1Units(units: readonly (readonly Label[])[], options: { categories: readonly Label[]; weights?: readonly number[] }): number {
  if (!Array.isArray(units) || units.some((unit) => !Array.isArray(unit))) throw new TypeError("gwetAc1Units: units must be one array of labels per unit.");
  if (!options?.categories) throw new RangeError("gwetAc1Units: categories are required (the number of categories changes the result).");
  const weightOf = checkedWeights(options.weights, units.length, "gwetAc1Units");
  const scale = resolveScale(units.flat(), options.categories, false, "gwetAc1Units");
  const size = scale.categories.length;
  if (size < 2) throw new RangeError("gwetAc1Units: the scale needs at least two categories.");
  const shares = new Array<number>(size).fill(0);
  let rated = 0;
  let pairable = 0;
  let agreement = 0;
  const counts = new Array<number>(size);
  for (const [index, unit] of units.entries()) {
    const weight = weightOf(index);
    if (unit.length === 0 || weight === 0) continue;
    counts.fill(0);
    for (const label of unit) counts[scale.indexOf(label)]++;
    rated += weight;
    for (let k = 0; k < size; k++) shares[k] += (weight * counts[k]) / unit.length;
    if (unit.length >= 2) {
      pairable += weight;
      let same = 0;
      for (const count of counts) same += count * (count - 1);
      agreement += (weight * same) / (unit.length * (unit.length - 1));
    }
  }
  if (pairable === 0) return Number.NaN;
  const observed = agreement / pairable;
  const chance = shares.reduce((sum, total) => sum + (total / rated) * (1 - total / rated), 0) / (size - 1);
  return (observed - chance) / (1 - chance);
}
