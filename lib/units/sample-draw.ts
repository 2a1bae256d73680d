/**
 * The random draw of a lot's sample from its list of serials. Reproducible: the same list (in the
 * same order) and the same seed always give the same sample in the same order, so the draw can be
 * checked later. The order matters too: each defect class is judged on the first n units of the
 * sample (lib/lots/verdict.ts), and the first n of a random order are themselves a random sample.
 *
 * Method: a partial Fisher–Yates shuffle (Durstenfeld's version; Knuth, TAOCP vol. 2, §3.4.2,
 * Algorithm P, from memory (b)) driven by XSadd with rejection sampling, so every ordered sample
 * of the requested size is equally likely.
 */
import { XSadd } from "./xsadd";

/** Stored with the lot, so a later change of method cannot silently change an old draw. */
export const DRAW_ALGORITHM = "xsadd-partial-fisher-yates-v1";

/** Seeds are stored as decimal text of a 32-bit unsigned integer. */
export function parseSeed(seed: string): number {
  if (!/^\d{1,10}$/.test(seed) || Number(seed) > 0xffffffff) throw new RangeError("A draw seed is a whole number from 0 to 4294967295.");
  return Number(seed);
}

/** `sampleSize` items of `pool` in draw order. */
export function drawSample<T>(pool: readonly T[], sampleSize: number, seed: string): T[] {
  if (!Number.isInteger(sampleSize) || sampleSize < 0) throw new RangeError("The sample size must be a whole number of at least 0.");
  if (sampleSize > pool.length) throw new RangeError(`Cannot draw ${sampleSize} from a list of ${pool.length}.`);
  const random = new XSadd(parseSeed(seed));
  const items = [...pool];
  for (let i = 0; i < sampleSize; i++) {
    const j = i + random.nextBelow(items.length - i);
    [items[i], items[j]] = [items[j], items[i]];
  }
  return items.slice(0, sampleSize);
}
