import "server-only";
import { sql, type SQL } from "drizzle-orm";
import { db, executePrepared, type Tx } from "@/db/client";
import type { UnitStatus } from "@/db/schema/lots";
import { logActivity } from "@/db/queries/activity";
import { hasAnyRole } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/require-user";
import { env } from "@/lib/env";
import { AppError, notFound } from "@/lib/errors";
import { transition } from "@/lib/units/state-machine";
import type { QueueFilters } from "./schemas";
import { formatTime } from "@/lib/time/format";

// Statuses come from the state machine, so the SQL below can't drift from it.
const ON_BENCH = transition("queued", "claim");
const QUEUED = transition(ON_BENCH, "release");

/**
 * A status as an SQL literal, for the WHERE clauses of the queue's statements (here and in
 * list.ts): executePrepared plans them without parameter values, and a partial index
 * (`WHERE status = 'queued'`) only applies when the query names the status itself. Only the state
 * machine's own constants come here.
 */
const statusLiteral = (status: UnitStatus) => sql.raw(`'${status}'`);
export const QUEUED_LITERAL = statusLiteral(QUEUED);
export const ON_BENCH_LITERAL = statusLiteral(ON_BENCH);

export type ClaimedUnit = { id: string; lotId: string; serial: string | null; sampleIndex: number; partTypeId: string; leaseExpiresAt: Date };

export function filterSql(filters: QueueFilters): SQL {
  const parts: SQL[] = [];
  if (filters.partTypeId) parts.push(sql`AND u.part_type_id = ${filters.partTypeId}`);
  if (filters.supplierId) parts.push(sql`AND u.supplier_id = ${filters.supplierId}`);
  if (filters.lotId) parts.push(sql`AND u.lot_id = ${filters.lotId}`);
  return sql.join(parts, sql` `);
}

/**
 * Queued units of open lots that match the filters, in Take next order: the claim's candidates.
 * With the ORDER BY (and a LIMIT) the planner walks units_queue_idx or the filter's index
 * (units_queued_by_lot_idx, units_open_by_part_type_idx, …) and stops at the first open row.
 */
function queuedInTakeNextOrder(workspaceId: string, filters: QueueFilters, extraCondition: SQL = sql``): SQL {
  return sql`
      SELECT u.id FROM units u
      WHERE u.workspace_id = ${workspaceId}
        AND u.status = ${QUEUED_LITERAL}
        AND EXISTS (SELECT 1 FROM lots l WHERE l.id = u.lot_id AND l.status = 'open')
        ${extraCondition}
        ${filterSql(filters)}
      ORDER BY u.lot_due_on, u.lot_received_on, u.lot_created_at, u.lot_id, u.sample_index, u.id
      LIMIT 1`;
}

/**
 * True when a unit is waiting (read without locks, so rows other claimers are busy with count too):
 * a queued unit, or a unit whose lease has run out. Asked as two probes, each on its own index.
 * One EXISTS over "queued OR expired" let the planner pick a sequential scan, betting on finding
 * a row early, while most units of a big workspace are graded: 70–170 ms at 125 000 units for
 * the answer "nothing waiting" (an EXISTS would also drop the ORDER BY that steers the first probe).
 */
async function anythingWaiting(workspaceId: string, filters: QueueFilters): Promise<boolean> {
  const { rows } = await executePrepared<{ waiting: boolean }>(sql`
    SELECT (${queuedInTakeNextOrder(workspaceId, filters)}) IS NOT NULL
      OR EXISTS (
        SELECT 1 FROM units u
        WHERE u.workspace_id = ${workspaceId} AND u.status = ${ON_BENCH_LITERAL} AND u.lease_expires_at < now()
          AND EXISTS (SELECT 1 FROM lots l WHERE l.id = u.lot_id AND l.status = 'open')
          ${filterSql(filters)}
      ) AS waiting`);
  return rows[0]?.waiting ?? false;
}

/**
 * A claim lost in a crash only puts the unit back in the queue, so these statements' commits need
 * not wait for the WAL flush: `set_config(…, true)` turns synchronous_commit off for the
 * statement's own transaction. It sits in the first CTE's WHERE as a one-time filter, which runs
 * before that scan whatever it finds, so it is in force at commit.
 */
const ASYNC_COMMIT = sql`(SELECT set_config('synchronous_commit', 'off', true)) IS NOT NULL`;

/**
 * Expired leases go back to the queue and are logged, in one statement (set-based, however many
 * ran out at once). The claim itself does this, so no clean-up job is needed to be correct.
 * SKIP LOCKED: claimers never wait on each other here either.
 */
async function returnExpiredLeases(workspaceId: string) {
  await executePrepared(sql`
    WITH expired AS (
      SELECT id, lease_holder_id FROM units
      WHERE workspace_id = ${workspaceId} AND status = ${ON_BENCH_LITERAL} AND lease_expires_at < now() AND ${ASYNC_COMMIT}
      FOR UPDATE SKIP LOCKED
    ), returned AS (
      UPDATE units u SET status = ${QUEUED}, lease_holder_id = NULL, lease_expires_at = NULL, claimed_at = NULL, updated_at = now()
      FROM expired WHERE u.id = expired.id
      RETURNING u.id, expired.lease_holder_id
    )
    INSERT INTO activity_log (workspace_id, actor_id, action, subject_type, subject_id, detail)
    SELECT ${workspaceId}::uuid, NULL, 'unit.lease_expired', 'unit', returned.id::text, jsonb_build_object('holder', returned.lease_holder_id)
    FROM returned`);
}

/**
 * One claim attempt: expired leases returned first (their own statement, so the claim's snapshot
 * sees those units as waiting and takes them in priority order), then the most urgent queued
 * unit locked with SKIP LOCKED, given the caller's lease and logged — one statement, atomic on
 * its own. Two round trips in all, no explicit transaction.
 */
async function claimOnce(user: SessionUser, filters: QueueFilters): Promise<ClaimedUnit | null> {
  const leaseSeconds = env().QUEUE_LEASE_SECONDS;
  await returnExpiredLeases(user.workspaceId);
  const { rows } = await executePrepared<{ id: string; lot_id: string; serial: string | null; sample_index: number; part_type_id: string; lease_expires_at: Date }>(sql`
    WITH next AS (${queuedInTakeNextOrder(user.workspaceId, filters, sql`AND ${ASYNC_COMMIT}`)}
      FOR UPDATE OF u SKIP LOCKED
    ), claimed AS (
      UPDATE units u
      SET status = ${ON_BENCH}, lease_holder_id = ${user.id}, lease_expires_at = now() + make_interval(secs => ${leaseSeconds}),
          claimed_at = now(), updated_at = now()
      FROM next WHERE u.id = next.id
      RETURNING u.id, u.lot_id, u.serial, u.sample_index, u.part_type_id, u.lease_expires_at
    ), claim_log AS (
      INSERT INTO activity_log (workspace_id, actor_id, action, subject_type, subject_id, detail)
      SELECT ${user.workspaceId}::uuid, ${user.id}::uuid, 'unit.claimed', 'unit', claimed.id::text, '{}'::jsonb
      FROM claimed
    )
    SELECT * FROM claimed`);
  const row = rows[0];
  if (!row) return null;
  return { id: row.id, lotId: row.lot_id, serial: row.serial, sampleIndex: row.sample_index, partTypeId: row.part_type_id, leaseExpiresAt: new Date(row.lease_expires_at) };
}

/**
 * Take next: claims the most urgent waiting unit for the caller.
 * FOR UPDATE SKIP LOCKED lets concurrent callers pass over a row another transaction is
 * claiming, so no two callers ever get the same unit and nobody waits on anybody; the scan walks
 * an index in Take next order (queuedInTakeNextOrder) and stops at the first free row. Skipping
 * can make a claim come back empty while the only waiting rows are being handled by others (a
 * claim that will fail, or a lease being returned): then it looks again, so "nothing" (204)
 * means nothing is waiting.
 */
export async function claimNextUnit({ user, filters }: { user: SessionUser; filters: QueueFilters }): Promise<ClaimedUnit | null> {
  for (let attempt = 0; attempt < 50; attempt++) {
    const claimed = await claimOnce(user, filters);
    if (claimed) return claimed;
    if (!(await anythingWaiting(user.workspaceId, filters))) return null;
    await new Promise((r) => setTimeout(r, 2 + Math.random() * 8));
  }
  throw new AppError("unavailable", "The queue is very busy right now; press Take next again.");
}

type LeaseRow = { id: string; status: UnitStatus; lease_holder_id: string | null; lease_expires_at: Date | null; holder_name: string | null };

async function lockUnit(tx: Tx, user: Pick<SessionUser, "workspaceId">, unitId: string): Promise<LeaseRow> {
  const { rows } = await tx.execute<LeaseRow>(sql`
    SELECT u.id, u.status, u.lease_holder_id, u.lease_expires_at, h.name AS holder_name
    FROM units u LEFT JOIN users h ON h.id = u.lease_holder_id
    WHERE u.id = ${unitId} AND u.workspace_id = ${user.workspaceId}
    FOR UPDATE OF u`);
  if (!rows[0]) throw notFound("That unit");
  return rows[0];
}

const leaseActive = (r: Pick<LeaseRow, "lease_expires_at">) => r.lease_expires_at !== null && new Date(r.lease_expires_at).getTime() > Date.now();

/** The Bench's heartbeat: extends the caller's lease. A lease that ran out but that nobody took over is renewed too. */
export async function renewLease({ user, unitId }: { user: SessionUser; unitId: string }) {
  return db().transaction(async (tx) => {
    const unit = await lockUnit(tx, user, unitId);
    if (unit.status !== ON_BENCH || unit.lease_holder_id !== user.id) {
      const who = unit.status === ON_BENCH && unit.holder_name && leaseActive(unit) ? ` ${unit.holder_name} has it on their bench now.` : "";
      throw new AppError("conflict", `You no longer hold this unit.${who} Take it from the queue again if it is free.`);
    }
    const { rows } = await tx.execute<{ lease_expires_at: Date }>(sql`
      UPDATE units SET lease_expires_at = now() + make_interval(secs => ${env().QUEUE_LEASE_SECONDS}), updated_at = now()
      WHERE id = ${unitId} AND workspace_id = ${user.workspaceId} RETURNING lease_expires_at`);
    return { leaseExpiresAt: new Date(rows[0].lease_expires_at) };
  });
}

/** Puts a unit back in the queue. Inspectors may release only their own; leads any. */
export async function releaseUnit({ user, unitId }: { user: SessionUser; unitId: string }) {
  await db().transaction(async (tx) => {
    const unit = await lockUnit(tx, user, unitId);
    const isLead = hasAnyRole(user.roles, "lead");
    if (unit.status === ON_BENCH && unit.lease_holder_id !== user.id && !isLead) {
      throw new AppError("forbidden", `This unit is on ${unit.holder_name ?? "another inspector"}'s bench; only they or a lead can put it back.`);
    }
    const next = transition(unit.status, "release");
    await tx.execute(sql`
      UPDATE units SET status = ${next}, lease_holder_id = NULL, lease_expires_at = NULL, claimed_at = NULL, updated_at = now()
      WHERE id = ${unitId} AND workspace_id = ${user.workspaceId}`);
    await logActivity(tx, { workspaceId: user.workspaceId, actorId: user.id, action: "unit.released", subjectType: "unit", subjectId: unitId, detail: { from: unit.lease_holder_id } });
  });
}

/** A lead hands a unit (waiting or on someone's bench) to a named inspector with a fresh lease. */
export async function reassignUnit({ user, unitId, toUserId }: { user: SessionUser; unitId: string; toUserId: string }) {
  await db().transaction(async (tx) => {
    const unit = await lockUnit(tx, user, unitId);
    const { rows: people } = await tx.execute<{ id: string; name: string }>(sql`
      SELECT id, name FROM users WHERE id = ${toUserId} AND workspace_id = ${user.workspaceId} AND active
        AND ('inspector' = ANY(roles) OR 'lead' = ANY(roles))`);
    if (!people[0]) throw new AppError("bad_request", "Choose an active inspector of this workspace.", { fieldErrors: { userId: "Not an active inspector here." } });
    if (unit.status !== ON_BENCH) transition(unit.status, "claim");
    await tx.execute(sql`
      UPDATE units SET status = ${ON_BENCH}, lease_holder_id = ${toUserId}, lease_expires_at = now() + make_interval(secs => ${env().QUEUE_LEASE_SECONDS}),
        claimed_at = now(), updated_at = now()
      WHERE id = ${unitId} AND workspace_id = ${user.workspaceId}`);
    await logActivity(tx, { workspaceId: user.workspaceId, actorId: user.id, action: "unit.reassigned", subjectType: "unit", subjectId: unitId, detail: { from: unit.lease_holder_id, to: toUserId } });
  });
}

/**
 * After an inspection grade is recorded (same transaction): the unit leaves the bench as graded
 * and its lease ends. Grading a waiting unit straight from its lot takes it onto the grader's
 * bench first; a correction of an already graded unit leaves it graded.
 */
export async function finishInspection(tx: Tx, user: Pick<SessionUser, "id" | "workspaceId">, unitId: string) {
  const unit = await lockUnit(tx, user, unitId);
  if (unit.status === ON_BENCH && unit.lease_holder_id !== user.id && leaseActive(unit)) {
    throw new AppError("conflict", `${unit.holder_name ?? "Another inspector"} has this unit on their bench, so it is read-only for you.`);
  }
  if (unit.status === "graded") return;
  const onBench = unit.status === QUEUED ? transition(unit.status, "claim") : unit.status;
  const graded = transition(onBench, "submit_grade");
  await tx.execute(sql`
    UPDATE units SET status = ${graded}, lease_holder_id = NULL, lease_expires_at = NULL,
      claimed_at = coalesce(claimed_at, now()), graded_at = now(), updated_at = now()
    WHERE id = ${unitId} AND workspace_id = ${user.workspaceId}`);
}

/**
 * Work on a unit (checklist, photos, regions, grade) is refused while another person's lease on
 * it is running: the unit is read-only for everybody else.
 */
export function assertNotLeasedByOther(unit: { status: string; leaseHolderId: string | null; leaseExpiresAt: Date | null }, user: SessionUser, holderName?: string | null) {
  if (unit.status === ON_BENCH && unit.leaseHolderId && unit.leaseHolderId !== user.id && unit.leaseExpiresAt && unit.leaseExpiresAt.getTime() > Date.now()) {
    const until = formatTime(unit.leaseExpiresAt, user.timeZone);
    throw new AppError("conflict", `${holderName ?? "Another inspector"} has this unit on their bench (lease until ${until}), so it is read-only for you.`);
  }
}
