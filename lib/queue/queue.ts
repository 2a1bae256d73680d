import "server-only";
/**
 * The lease's life: Take next, the Bench's heartbeat, putting a unit back, a lead's reassignment
 * and the end of the lease when an inspection grade is recorded. The decisions are made here (who
 * may, which status follows, through the state machine); the statements are in
 * db/queries/unit-status.ts, the one writer of a unit's status and lease, on the database's clock.
 */
import { transaction, type Tx } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { anythingWaiting } from "@/db/queries/queue";
import { claimNextQueued, endLease, grantLease, markGraded, renewLease as renewLeaseRow, returnExpiredLeases, type ClaimedUnit } from "@/db/queries/unit-status";
import { lockUnit, type LockedUnit } from "@/db/queries/units";
import { getUserInWorkspace } from "@/db/queries/users";
import { can } from "@/lib/auth/permissions";
import { isRole } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/require-user";
import { env } from "@/lib/env";
import { AppError, notFound } from "@/lib/errors";
import { assertUnitEditable } from "@/lib/units/editability";
import { transition } from "@/lib/units/state-machine";
import type { QueueFilters } from "./schemas";

// Statuses come from the state machine, so the queue can't drift from it.
const ON_BENCH = transition("queued", "claim");
const QUEUED = transition(ON_BENCH, "release");

export type { ClaimedUnit };

/**
 * One claim attempt: expired leases returned first (their own statement, so the claim's snapshot
 * sees those units as waiting and takes them in priority order), then the most urgent queued
 * unit locked with SKIP LOCKED, given the caller's lease and logged — one statement, atomic on
 * its own. Two round trips in all, no explicit transaction.
 */
async function claimOnce(user: SessionUser, filters: QueueFilters): Promise<ClaimedUnit | null> {
  await returnExpiredLeases({ workspaceId: user.workspaceId, status: QUEUED });
  return claimNextQueued({ workspaceId: user.workspaceId, holderId: user.id, filters, status: ON_BENCH, leaseSeconds: env().QUEUE_LEASE_SECONDS });
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
  return claimWithRetry(
    () => claimOnce(user, filters),
    () => anythingWaiting({ workspaceId: user.workspaceId, filters }),
  );
}

/**
 * Take next's loop, for every queue that hands work out with a lease (units here, rechecks in
 * lib/recheck/queue.ts): one SKIP LOCKED claim attempt; when it comes back empty while something
 * is still waiting (rows other claimers are busy with), look again after a short pause.
 */
export async function claimWithRetry<T>(claimOnce: () => Promise<T | null>, anythingWaiting: () => Promise<boolean>): Promise<T | null> {
  for (let attempt = 0; attempt < 50; attempt++) {
    const claimed = await claimOnce();
    if (claimed) return claimed;
    if (!(await anythingWaiting())) return null;
    await new Promise((r) => setTimeout(r, 2 + Math.random() * 8));
  }
  throw new AppError("unavailable", "The queue is very busy right now; press Take next again.");
}

/** The unit locked for a lease change; 404 when it is not in the caller's workspace. */
async function lockForLease(tx: Tx, user: Pick<SessionUser, "workspaceId">, unitId: string): Promise<LockedUnit> {
  const unit = await lockUnit(tx, { workspaceId: user.workspaceId, unitId });
  if (!unit) throw notFound("That unit");
  return unit;
}

/** The Bench's heartbeat: extends the caller's lease. A lease that ran out but that nobody took over is renewed too. */
export async function renewLease({ user, unitId }: { user: SessionUser; unitId: string }) {
  return transaction(async (tx) => {
    const unit = await lockForLease(tx, user, unitId);
    if (unit.status !== ON_BENCH || unit.leaseHolderId !== user.id) {
      const who = unit.status === ON_BENCH && unit.leaseHolderName && unit.leaseRunning ? ` ${unit.leaseHolderName} has it on their bench now.` : "";
      throw new AppError("conflict", `You no longer hold this unit.${who} Take it from the queue again if it is free.`);
    }
    return renewLeaseRow(tx, { workspaceId: user.workspaceId, unitId, leaseSeconds: env().QUEUE_LEASE_SECONDS });
  });
}

/** Puts a unit back in the queue. Inspectors may release only their own; leads any. */
export async function releaseUnit({ user, unitId }: { user: SessionUser; unitId: string }) {
  await transaction(async (tx) => {
    const unit = await lockForLease(tx, user, unitId);
    const managesLeases = can(user, "leases.manage");
    if (unit.status === ON_BENCH && unit.leaseHolderId !== user.id && !managesLeases) {
      throw new AppError("forbidden", `This unit is on ${unit.leaseHolderName ?? "another inspector"}'s bench; only they or a lead can put it back.`);
    }
    await endLease(tx, { workspaceId: user.workspaceId, unitId, status: transition(unit.status, "release") });
    await logActivity(tx, { workspaceId: user.workspaceId, actorId: user.id, action: "unit.released", subjectType: "unit", subjectId: unitId, detail: { from: unit.leaseHolderId } });
  });
}

/** A lead hands a unit (waiting or on someone's bench) to a named inspector with a fresh lease. */
export async function reassignUnit({ user, unitId, toUserId }: { user: SessionUser; unitId: string; toUserId: string }) {
  await transaction(async (tx) => {
    const unit = await lockForLease(tx, user, unitId);
    const person = await getUserInWorkspace({ workspaceId: user.workspaceId, userId: toUserId }, tx);
    if (!person?.active || !can({ roles: person.roles.filter(isRole) }, "queue.work")) {
      throw new AppError("bad_request", "Choose an active inspector of this workspace.", { fieldErrors: { userId: "Not an active inspector here." } });
    }
    if (unit.status !== ON_BENCH) transition(unit.status, "claim");
    await grantLease(tx, { workspaceId: user.workspaceId, unitId, holderId: toUserId, status: ON_BENCH, leaseSeconds: env().QUEUE_LEASE_SECONDS });
    await logActivity(tx, { workspaceId: user.workspaceId, actorId: user.id, action: "unit.reassigned", subjectType: "unit", subjectId: unitId, detail: { from: unit.leaseHolderId, to: toUserId } });
  });
}

/**
 * After an inspection grade is recorded (same transaction, `unit` locked): the unit leaves the
 * bench as graded and its lease ends. Grading a waiting unit straight from its lot takes it onto
 * the grader's bench first; a correction of an already graded unit leaves it graded.
 */
export async function finishInspection(tx: Tx, user: Pick<SessionUser, "id" | "workspaceId" | "roles"> & Partial<Pick<SessionUser, "timeZone">>, unit: LockedUnit) {
  if (unit.status === "graded") return;
  assertUnitEditable({ work: "grade", actor: user, lotStatus: unit.lotStatus, unit, timeZone: user.timeZone });
  const onBench = unit.status === QUEUED ? transition(unit.status, "claim") : unit.status;
  await markGraded(tx, { workspaceId: user.workspaceId, unitId: unit.id, status: transition(onBench, "submit_grade") });
}
