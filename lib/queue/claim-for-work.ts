import "server-only";
/**
 * Work that changes a unit nobody holds — a checklist result, a saved region set — takes the unit
 * onto the worker's bench with the queue's lease, as Take next would: a unit still waiting in the
 * queue never gathers evidence without an owner, and the queue stops offering it to others.
 * Call inside the transaction, with the unit row locked (db/queries/units.ts lockUnit), when
 * lib/units/editability.ts says the work `claims` the unit.
 */
import type { Tx } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { grantLease } from "@/db/queries/unit-status";
import type { LockedUnit } from "@/db/queries/units";
import type { SessionUser } from "@/lib/auth/require-user";
import { env } from "@/lib/env";
import { transition } from "@/lib/units/state-machine";

type UnitLease = Pick<LockedUnit, "id" | "status" | "leaseHolderId" | "leaseRunning">;

/** Claims the unit for the actor (release first if an expired lease is still recorded) and logs it. */
export async function claimForWork(tx: Tx, actor: Pick<SessionUser, "id" | "workspaceId">, unit: UnitLease, via: "checklist" | "regions" | "photos"): Promise<void> {
  const status = transition(unit.status === "queued" ? "queued" : transition(unit.status, "release"), "claim");
  await grantLease(tx, { workspaceId: actor.workspaceId, unitId: unit.id, holderId: actor.id, status, leaseSeconds: env().QUEUE_LEASE_SECONDS });
  await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.id, action: "unit.claimed", subjectType: "unit", subjectId: unit.id, detail: { via, from: unit.leaseHolderId } });
}
