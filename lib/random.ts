/**
 * Seeded pseudo-random generators, uniform in [0, 1). One home for both, so training, the seed's
 * renders, test fixtures and benchmark scenes reproduce from their seed. Each caller keeps the
 * generator it was written with: switching one would change stored renders and measured figures.
 */

/** mulberry32 (32-bit state, good spread for its size): learned-suggestion training, tests, benches. */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** xorshift32 (Marsaglia 2003; a zero seed becomes 1): the seed's photo renders and photo fixtures. */
export function xorshift32(seed: number): () => number {
  let state = seed >>> 0 || 1;
  return () => {
    state ^= state << 13;
    state >>>= 0;
    state ^= state >>> 17;
    state ^= state << 5;
    state >>>= 0;
    return state / 0x1_0000_0000;
  };
}
