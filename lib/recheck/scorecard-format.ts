/**
 * How the scorecards print their figures (screen and CSV alike). Undefined figures (no rechecks
 * in a week, one grade only) are NaN in the cores and null once they crossed JSON: both print
 * "n/a", never a made-up 0.
 */
import type { KappaWithBand, ShareInterval } from "@/lib/agreement";

const defined = (value: number | null | undefined): value is number => typeof value === "number" && Number.isFinite(value);

/** Share 0..1 as "83 %" (whole per cent: the intervals are wider than a decimal). */
export const formatPercent = (share: number | null | undefined) => (defined(share) ? `${Math.round(share * 100)} %` : "n/a");

/** "83 % (70–91 %)": a share with its Wilson 95 % interval. */
export const formatShareInterval = (value: ShareInterval) => (defined(value.share) ? `${formatPercent(value.share)} (${Math.round(value.low * 100)}–${Math.round(value.high * 100)} %)` : "n/a");

/** Kappa to two decimals; a minus sign, not a hyphen. */
export const formatKappa = (kappa: number | null | undefined) => (defined(kappa) ? kappa.toFixed(2).replace("-", "−") : "n/a");

/** "0.62 (0.41 to 0.83)": kappa with its 95 % interval. */
export const formatKappaInterval = (value: KappaWithBand) => (defined(value.kappa) ? `${formatKappa(value.kappa)} (${formatKappa(value.low)} to ${formatKappa(value.high)})` : "n/a");

/** Landis & Koch's name for a kappa, capitalised for a table cell. */
export const bandLabel = (value: Pick<KappaWithBand, "band">) => (value.band ? value.band[0].toUpperCase() + value.band.slice(1) : "n/a");
