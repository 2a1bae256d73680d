import "server-only";
/**
 * Work that changes a unit nobody holds — a checklist result, a saved region set — takes the unit
 * onto the worker's bench with the queue's lease, as Take next would: a unit still waiting in the
 * queue never gathers evidence without an owner, and the queue stops offering it to others.
 * Call inside the transaction, with the unit row locked (db/queries/units.ts lockUnit).
 */
import type { Tx } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { setUnitOnBench } from "@/db/queries/units";
import type { UnitStatus } from "@/db/schema/lots";
import type { SessionUser } from "@/lib/auth/require-user";
import { env } from "@/lib/env";
import { transition } from "@/lib/units/state-machine";

type LockedUnit = { id: string; status: UnitStatus; leaseHolderId: string | null; leaseExpiresAt: Date | null };

export function leaseRunning(unit: LockedUnit, now = new Date()): boolean {
  return unit.status === "on_bench" && unit.leaseExpiresAt !== null && unit.leaseExpiresAt > now;
}

/** Whether the actor's work claims the unit: it is waiting, or on a bench whose lease ran out (the actor's own included). */
export function workClaimsUnit(unit: LockedUnit, now = new Date()): boolean {
  return unit.status === "queued" || (unit.status === "on_bench" && !leaseRunning(unit, now));
}

/** Claims the unit for the actor (release first if an expired lease is still recorded) and logs it. */
export async function claimForWork(tx: Tx, actor: Pick<SessionUser, "id" | "workspaceId">, unit: LockedUnit, via: "checklist" | "regions" | "photos"): Promise<void> {
  const status = transition(unit.status === "queued" ? "queued" : transition(unit.status, "release"), "claim");
  await setUnitOnBench(tx, { workspaceId: actor.workspaceId, unitId: unit.id, status, holderId: actor.id, leaseExpiresAt: new Date(Date.now() + env().QUEUE_LEASE_SECONDS * 1000) });
  await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.id, action: "unit.claimed", subjectType: "unit", subjectId: unit.id, detail: { via, from: unit.leaseHolderId } });
}
