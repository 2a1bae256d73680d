/**
 * Agreement between graders — the entry point named by the contract in docs/contracts.md
 * ("lib/agreement.ts"), shared by Calibration (a grader against the key) and Recheck (first grade
 * against the blind re-grade). Pure functions, no I/O. Each part states its decisions in its own
 * file head:
 * - lib/agreement/kappa.ts: `cohenKappa` (plain, linear, quadratic; full scale with `categories`;
 *   NaN when p_e = 1 or no pairs), `cohenKappaInterval` (95 %, analytic standard error),
 *   `gwetAc1`, and the same from a table of counts.
 * - lib/agreement/krippendorff.ts: `krippendorffAlpha` (nominal, ordinal, interval; missing values).
 * - lib/agreement/masks.ts: `iou` / `dice` on flat 0/1 masks or span masks (empty vs empty = 1).
 * - lib/agreement/bands.ts: `landisKochBand` (two-decimal boundary rule).
 * - lib/agreement/multi-rater.ts: `gwetAc1Units` (Gwet's AC1 for any number of raters per unit).
 * - lib/agreement/proportion.ts: `wilsonInterval` (95 % interval of a share, e.g. exact agreement).
 * Per-class comparison of two region sets (masks, matched defects): lib/imaging/compare-regions.ts.
 */
export type { Label, LabelPair } from "@/lib/agreement/labels";
export { cohenKappa, cohenKappaInterval, gwetAc1, kappaFromTable, kappaIntervalFromTable, type KappaInterval, type KappaOptions, type KappaWeights } from "@/lib/agreement/kappa";
export { krippendorffAlpha, type AlphaMetric, type AlphaValue } from "@/lib/agreement/krippendorff";
export { dice, diceOf, iou, iouOf, maskOverlap, type FlatMask, type Mask, type MaskOverlap } from "@/lib/agreement/masks";
export { LANDIS_KOCH_BANDS, landisKochBand, withBand, type KappaWithBand, type LandisKochBand } from "@/lib/agreement/bands";
export { gwetAc1Units } from "@/lib/agreement/multi-rater";
export { wilsonInterval, type ShareInterval } from "@/lib/agreement/proportion";
