/**
 * A 95 % interval for a share (e.g. the share of a grader's rechecks that agree): the Wilson
 * score interval (Wilson 1927), without continuity correction,
 *   (p̂ + z²/2n ± z √(p̂(1 − p̂)/n + z²/4n²)) / (1 + z²/n).
 * Chosen over the simple p̂ ± z·√(p̂(1 − p̂)/n) because that one collapses to a zero width at
 * 0 of n or n of n and leaves [0, 1] for small n — exactly the small weekly counts a scorecard
 * shows (Newcombe 1998 compares the methods). NaN bounds for n = 0.
 */
const Z_95 = 1.959963984540054;

export type ShareInterval = { share: number; low: number; high: number; n: number };

export function wilsonInterval(successes: number, n: number): ShareInterval {
  if (!Number.isInteger(n) || n < 0) throw new RangeError(`wilsonInterval: n must be a whole number >= 0, got ${n}.`);
  if (!Number.isInteger(successes) || successes < 0 || successes > n) throw new RangeError(`wilsonInterval: successes must be a whole number from 0 to n (${n}), got ${successes}.`);
  if (n === 0) return { share: Number.NaN, low: Number.NaN, high: Number.NaN, n };
  const share = successes / n;
  const z2 = Z_95 * Z_95;
  const centre = share + z2 / (2 * n);
  const spread = Z_95 * Math.sqrt((share * (1 - share)) / n + z2 / (4 * n * n));
  const scale = 1 + z2 / n;
  // Clamped: at 0 or n successes one bound is 0 or 1 up to rounding.
  return { share, low: Math.max(0, (centre - spread) / scale), high: Math.min(1, (centre + spread) / scale), n };
}
