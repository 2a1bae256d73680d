/**
 * Landis & Koch (1977) names for ranges of kappa (docs/references.md, "Agreement between
 * graders"): < 0 poor, 0–0.20 slight, 0.21–0.40 fair, 0.41–0.60 moderate, 0.61–0.80 substantial,
 * 0.81–1.00 almost perfect.
 *
 * Boundary rule: the published table is written in two decimals, so the band is that of the value
 * as shown with two decimals (`toFixed(2)`, as the scorecards print it) and each printed upper
 * bound belongs to its band: 0.20 is slight, 0.21 fair; 0.404 shows as 0.40 and is fair, 0.405
 * shows as 0.41 (0.405 is stored as 0.40500000000000002665) and is moderate. A value that shows as
 * "-0.00" is slight, not poor. NaN (undefined kappa) has no band: null.
 */
import type { KappaInterval } from "./kappa";

export const LANDIS_KOCH_BANDS = ["poor", "slight", "fair", "moderate", "substantial", "almost perfect"] as const;
export type LandisKochBand = (typeof LANDIS_KOCH_BANDS)[number];

const UPPER_BOUNDS: [number, LandisKochBand][] = [
  [0.2, "slight"],
  [0.4, "fair"],
  [0.6, "moderate"],
  [0.8, "substantial"],
];

export function landisKochBand(kappa: number): LandisKochBand | null {
  if (Number.isNaN(kappa)) return null;
  const shown = Number(kappa.toFixed(2));
  if (shown < 0) return "poor";
  for (const [upper, band] of UPPER_BOUNDS) if (shown <= upper) return band;
  return "almost perfect";
}

/** A kappa with its interval and the band of its point value, as scorecards and attempts show it. */
export type KappaWithBand = KappaInterval & { band: LandisKochBand | null };
export const withBand = (interval: KappaInterval): KappaWithBand => ({ ...interval, band: landisKochBand(interval.kappa) });
