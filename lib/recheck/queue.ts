import "server-only";
/**
 * The recheck queue: auditors (and leads) take the next recheck with a lease, as inspectors take
 * units — the same claim loop (`claimWithRetry`, lib/queue/queue.ts), the same lease statements
 * on the database's clock (db/queries/leases.ts), the same SKIP LOCKED claim, so two auditors at
 * once never get the same recheck and nobody waits on anybody.
 *
 * Who may take which (the claim's WHERE, db/queries/rechecks.ts):
 * - never one's own grade (the first grader of the rechecked grade);
 * - never a unit one has opened (its Bench, regions, measurement or grades: unit_openings), since
 *   such a person may have seen the first grade through another role;
 * - the oldest waiting first; a recheck whose lease ran out is free again.
 */
import { transaction, type Tx } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { anyRecheckWaiting, claimNextRecheckRow, deleteRecheckRegionSets, endRecheckLease, lockRecheck, renewRecheckLease, type ClaimedRecheck, type LockedRecheck } from "@/db/queries/rechecks";
import type { SessionUser } from "@/lib/auth/require-user";
import { env } from "@/lib/env";
import { AppError, notFound } from "@/lib/errors";
import { claimWithRetry } from "@/lib/queue/queue";

type Actor = Pick<SessionUser, "id" | "workspaceId">;

export type { ClaimedRecheck };

/** Take next for rechecks: the oldest waiting recheck the caller may take, or null (nothing waiting for them). */
export function takeNextRecheck(user: Actor): Promise<ClaimedRecheck | null> {
  return claimWithRetry(
    () => claimNextRecheckRow({ workspaceId: user.workspaceId, auditorId: user.id, leaseSeconds: env().QUEUE_LEASE_SECONDS }),
    () => anyRecheckWaiting({ workspaceId: user.workspaceId, auditorId: user.id }),
  );
}

async function lockOrNotFound(tx: Tx, user: Actor, recheckId: string): Promise<LockedRecheck> {
  const recheck = await lockRecheck(tx, { workspaceId: user.workspaceId, recheckId });
  if (!recheck) throw notFound("That recheck");
  return recheck;
}

/**
 * The recheck locked for work by its holder: waiting, and held by the caller. A lease that ran
 * out but that nobody took over still counts as theirs (as on the Bench).
 */
export async function requireHeldRecheck(tx: Tx, user: Actor, recheckId: string): Promise<LockedRecheck> {
  const recheck = await lockOrNotFound(tx, user, recheckId);
  if (recheck.status !== "waiting") throw new AppError("conflict", "This recheck has been submitted already; it can no longer be changed.");
  if (recheck.leaseHolderId !== user.id) {
    throw new AppError("conflict", recheck.leaseHolderId && recheck.leaseRunning ? "Another auditor has this recheck now." : "You do not hold this recheck. Take it from the recheck queue first.");
  }
  return recheck;
}

/** The heartbeat of the recheck screen: extends the caller's lease. */
export async function renewRecheck(user: Actor, recheckId: string) {
  return transaction(async (tx) => {
    await requireHeldRecheck(tx, user, recheckId);
    return renewRecheckLease(tx, { workspaceId: user.workspaceId, recheckId, leaseSeconds: env().QUEUE_LEASE_SECONDS });
  });
}

/**
 * Puts a recheck back in the queue. The holder's regions go with them: whoever takes it next
 * starts blind, not from another auditor's marks (the claim also clears any a lapsed holder left).
 */
export async function releaseRecheck(user: Actor, recheckId: string) {
  await transaction(async (tx) => {
    await requireHeldRecheck(tx, user, recheckId);
    await endRecheckLease(tx, { workspaceId: user.workspaceId, recheckId });
    await deleteRecheckRegionSets(tx, { workspaceId: user.workspaceId, recheckId });
    await logActivity(tx, { workspaceId: user.workspaceId, actorId: user.id, action: "recheck.released", subjectType: "recheck", subjectId: recheckId, detail: {} });
  });
}
