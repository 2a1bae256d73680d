/**
 * `items.map(work)` with at most `limit` calls of `work` in flight, results in the items' order.
 * For CPU-heavy native work (sharp decodes on libuv's threads) where running everything at once
 * would only queue up memory, and running one at a time leaves cores idle.
 *
 * A failure stops further items from starting; the promise rejects with the first error once the
 * calls already running have settled (so nothing keeps working after the caller has moved on).
 */
export async function mapBounded<T, R>(items: readonly T[], limit: number, work: (item: T, index: number) => Promise<R>): Promise<R[]> {
  if (!Number.isInteger(limit) || limit < 1) throw new RangeError(`mapBounded: limit must be a positive integer, got ${limit}`);
  const results = new Array<R>(items.length);
  let next = 0;
  let failure: { error: unknown } | null = null;
  const lane = async () => {
    while (!failure && next < items.length) {
      const index = next++;
      try {
        results[index] = await work(items[index], index);
      } catch (error) {
        failure ??= { error };
      }
    }
  };
  await Promise.all(Array.from({ length: Math.min(limit, items.length) }, lane));
  if (failure) throw (failure as { error: unknown }).error;
  return results;
}
