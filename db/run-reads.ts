import { PgTransaction } from "drizzle-orm/pg-core";

/**
 * Runs independent reads: side by side on the pool, one after the other in a transaction, whose one
 * client runs one query at a time (pg 8 deprecates queuing a second query on a busy client and pg 9
 * will refuse it). `on` is what the reads run on; undefined means the pool.
 */
export async function runReads<T extends readonly unknown[]>(on: unknown, reads: { [K in keyof T]: () => PromiseLike<T[K]> }): Promise<T> {
  if (!(on instanceof PgTransaction)) return (await Promise.all(reads.map((read) => read()))) as unknown as T;
  const results: unknown[] = [];
  for (const read of reads) results.push(await read());
  return results as unknown as T;
}
