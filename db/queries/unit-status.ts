import "server-only";
/**
 * The one place that writes a unit's status and lease (status, lease_holder_id, lease_expires_at,
 * claimed_at, graded_at). Which status comes next is the state machine's decision
 * (lib/units/state-machine.ts): callers in lib pass the status to store, these functions only
 * store it. Lock the unit first (lockUnit in ./units.ts) where the caller decides on its row.
 *
 * Lease times come from the database's clock alone (`now()`), never from Node's: the claim, the
 * expiry check and every lease granted or renewed then agree, however far the web servers' clocks
 * drift. Inside a transaction `now()` is the transaction's start.
 */
import { and, eq, inArray, sql, type SQL } from "drizzle-orm";
import { executePrepared, type DbOrTx } from "@/db/client";
import { units } from "@/db/schema";
import type { UnitStatus } from "@/db/schema/lots";
import type { QueueFilters } from "@/lib/queue/schemas";
import { ASYNC_COMMIT, leaseColumns, leaseEnd } from "./leases";
import { ON_BENCH_LITERAL, queuedInTakeNextOrder } from "./queue";

type UnitKey = { workspaceId: string; unitId: string };

/** The SET list of a lease grant: `holderId` holds the unit from now for `leaseSeconds`. */
const leaseGrant = ({ status, holderId, leaseSeconds }: { status: UnitStatus; holderId: string; leaseSeconds: number }): SQL =>
  sql`status = ${status}, ${leaseColumns({ holderId, leaseSeconds })}, updated_at = now()`;

/**
 * Expired leases of the workspace go back to the queue (as `status`) and are logged, in one
 * statement (set-based, however many ran out at once). SKIP LOCKED: claimers never wait on each
 * other here either. A prepared statement on the hot path (see ./queue.ts).
 */
export async function returnExpiredLeases({ workspaceId, status }: { workspaceId: string; status: UnitStatus }) {
  await executePrepared(sql`
    WITH expired AS (
      SELECT id, lease_holder_id FROM units
      WHERE workspace_id = ${workspaceId} AND status = ${ON_BENCH_LITERAL} AND lease_expires_at < now() AND ${ASYNC_COMMIT}
      FOR UPDATE SKIP LOCKED
    ), returned AS (
      UPDATE units u SET status = ${status}, lease_holder_id = NULL, lease_expires_at = NULL, claimed_at = NULL, updated_at = now()
      FROM expired WHERE u.id = expired.id
      RETURNING u.id, expired.lease_holder_id
    )
    INSERT INTO activity_log (workspace_id, actor_id, action, subject_type, subject_id, detail)
    SELECT ${workspaceId}::uuid, NULL, 'unit.lease_expired', 'unit', returned.id::text, jsonb_build_object('holder', returned.lease_holder_id)
    FROM returned`);
}

export type ClaimedUnit = { id: string; lotId: string; serial: string | null; sampleIndex: number; partTypeId: string; leaseExpiresAt: Date };

/**
 * One claim attempt: the most urgent queued unit matching the filters, locked with SKIP LOCKED,
 * given `holderId`'s lease (as `status`) and logged — one statement, atomic on its own. Null when
 * no free row was found (the caller decides whether to look again). A prepared statement.
 */
export async function claimNextQueued({
  workspaceId,
  holderId,
  filters,
  status,
  leaseSeconds,
}: {
  workspaceId: string;
  holderId: string;
  filters: QueueFilters;
  status: UnitStatus;
  leaseSeconds: number;
}): Promise<ClaimedUnit | null> {
  const { rows } = await executePrepared<{ id: string; lot_id: string; serial: string | null; sample_index: number; part_type_id: string; lease_expires_at: Date }>(sql`
    WITH next AS (${queuedInTakeNextOrder(workspaceId, filters, sql`AND ${ASYNC_COMMIT}`)}
      FOR UPDATE OF u SKIP LOCKED
    ), claimed AS (
      UPDATE units u SET ${leaseGrant({ status, holderId, leaseSeconds })}
      FROM next WHERE u.id = next.id
      RETURNING u.id, u.lot_id, u.serial, u.sample_index, u.part_type_id, u.lease_expires_at
    ), claim_log AS (
      INSERT INTO activity_log (workspace_id, actor_id, action, subject_type, subject_id, detail)
      SELECT ${workspaceId}::uuid, ${holderId}::uuid, 'unit.claimed', 'unit', claimed.id::text, '{}'::jsonb
      FROM claimed
    )
    SELECT * FROM claimed`);
  const row = rows[0];
  if (!row) return null;
  return { id: row.id, lotId: row.lot_id, serial: row.serial, sampleIndex: row.sample_index, partTypeId: row.part_type_id, leaseExpiresAt: new Date(row.lease_expires_at) };
}

/** Puts one unit on `holderId`'s bench (as `status`) with a fresh lease; returns when it ends. */
export async function grantLease(tx: DbOrTx, { workspaceId, unitId, holderId, status, leaseSeconds }: UnitKey & { holderId: string; status: UnitStatus; leaseSeconds: number }) {
  const { rows } = await tx.execute<{ lease_expires_at: string | Date }>(sql`
    UPDATE units SET ${leaseGrant({ status, holderId, leaseSeconds })}
    WHERE workspace_id = ${workspaceId} AND id = ${unitId}
    RETURNING lease_expires_at`);
  return { leaseExpiresAt: new Date(rows[0].lease_expires_at) };
}

/** Extends the running holder's lease to `leaseSeconds` from now; returns when it ends. */
export async function renewLease(tx: DbOrTx, { workspaceId, unitId, leaseSeconds }: UnitKey & { leaseSeconds: number }) {
  const [row] = await tx
    .update(units)
    .set({ leaseExpiresAt: leaseEnd(leaseSeconds), updatedAt: sql`now()` })
    .where(and(eq(units.workspaceId, workspaceId), eq(units.id, unitId)))
    .returning({ leaseExpiresAt: units.leaseExpiresAt });
  return { leaseExpiresAt: row.leaseExpiresAt! };
}

/** Ends the unit's lease and stores `status` (put back in the queue). */
export async function endLease(tx: DbOrTx, { workspaceId, unitId, status }: UnitKey & { status: UnitStatus }) {
  await tx
    .update(units)
    .set({ status, leaseHolderId: null, leaseExpiresAt: null, claimedAt: null, updatedAt: sql`now()` })
    .where(and(eq(units.workspaceId, workspaceId), eq(units.id, unitId)));
}

/**
 * The unit leaves the bench graded (`status`): its lease ends, the grading time is stored, and
 * the claim time stays (set now if it was graded without being claimed) for the throughput figures.
 */
export async function markGraded(tx: DbOrTx, { workspaceId, unitId, status }: UnitKey & { status: UnitStatus }) {
  await tx
    .update(units)
    .set({ status, leaseHolderId: null, leaseExpiresAt: null, claimedAt: sql`coalesce(${units.claimedAt}, now())`, gradedAt: sql`now()`, updatedAt: sql`now()` })
    .where(and(eq(units.workspaceId, workspaceId), eq(units.id, unitId)));
}

type LotMove = { workspaceId: string; lotId: string; from: UnitStatus[]; to: UnitStatus; at: Date };

/** A decided lot's units in `from` become `to` (graded → final); their claim and grading times stay. */
export async function setLotUnitsStatus(tx: DbOrTx, { workspaceId, lotId, from, to, at }: LotMove) {
  return tx
    .update(units)
    .set({ status: to, updatedAt: at })
    .where(and(eq(units.workspaceId, workspaceId), eq(units.lotId, lotId), inArray(units.status, from)))
    .returning({ id: units.id });
}

/** A decided lot's units in `from` leave the queue and any bench for good, as `to`, their leases ended. */
export async function withdrawLotUnits(tx: DbOrTx, { workspaceId, lotId, from, to, at }: LotMove) {
  return tx
    .update(units)
    .set({ status: to, leaseHolderId: null, leaseExpiresAt: null, claimedAt: null, updatedAt: at })
    .where(and(eq(units.workspaceId, workspaceId), eq(units.lotId, lotId), inArray(units.status, from)))
    .returning({ id: units.id });
}
