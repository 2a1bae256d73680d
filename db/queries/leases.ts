import "server-only";
/**
 * The lease statements' shared parts, for every table that hands work out with a lease (units on
 * the Bench, db/queries/unit-status.ts; rechecks, db/queries/rechecks.ts). The columns have the
 * same names and meaning on each: `lease_holder_id`, `lease_expires_at` (an expired lease counts
 * as free), `claimed_at`. Lease times come from the database's clock alone (`now()`), never from
 * Node's, so the claim, the expiry check and every lease granted or renewed agree.
 */
import { sql, type SQL } from "drizzle-orm";

/** The end of a lease that starts now: the database's clock plus `leaseSeconds`. */
export const leaseEnd = (leaseSeconds: number): SQL => sql`now() + make_interval(secs => ${leaseSeconds})`;

/** The SET list that gives `holderId` the lease from now for `leaseSeconds`. */
export const leaseColumns = ({ holderId, leaseSeconds }: { holderId: string; leaseSeconds: number }): SQL =>
  sql`lease_holder_id = ${holderId}, lease_expires_at = ${leaseEnd(leaseSeconds)}, claimed_at = now()`;

/** The SET list that ends a lease. */
export const noLease = sql`lease_holder_id = NULL, lease_expires_at = NULL, claimed_at = NULL`;

/**
 * A claim lost in a crash only puts the work back in its queue, so the claim statements' commits
 * need not wait for the WAL flush: `set_config(…, true)` turns synchronous_commit off for the
 * statement's own transaction. Put it in the first CTE's WHERE as a one-time filter, which runs
 * before that scan whatever it finds, so it is in force at commit.
 */
export const ASYNC_COMMIT = sql`(SELECT set_config('synchronous_commit', 'off', true)) IS NOT NULL`;
