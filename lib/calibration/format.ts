/** How Calibration screens write its figures (shares as whole percentages, IoU and kappa to two places, undefined as "n/a"). */
export const percent = (share: number): string => (Number.isFinite(share) ? `${Math.round(share * 100)} %` : "n/a");

export const twoPlaces = (value: number | null | undefined): string => (value === null || value === undefined || !Number.isFinite(value) ? "n/a" : value.toFixed(2));

/** The calendar date (UTC, YYYY-MM-DD) `days` days from `from`: the due date a new assignment form proposes. */
export const dateInDays = (days: number, from: Date = new Date()): string => new Date(from.getTime() + days * 86_400_000).toISOString().slice(0, 10);
