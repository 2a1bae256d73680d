/**
 * Whether the signed-in person may change a unit's regions now, and if not, the sentence the Bench
 * shows. Mirrors the server's rules (lib/regions/regions.ts) so the canvas opens read-only instead
 * of failing on the first save; the server still decides. Unlike the checklist, a lead is not
 * exempt from another inspector's running lease: two people marking one photo at once would only
 * produce conflicts — a lead takes the unit over with Reassign instead. Pure.
 */
import { DEFAULT_TIME_ZONE, formatTime } from "@/lib/time/format";
import { STATUS_LABELS } from "@/lib/units/state-machine";
import type { UnitView } from "@/lib/units/dto";

/** Who looks at the Bench; `timeZone` is the workspace's (times are shown in it). */
export type BenchPerson = { id: string; isLead: boolean; canRecord: boolean; timeZone?: string };

export function leaseRunning(unit: UnitView["unit"], now = new Date()): boolean {
  return unit.status === "on_bench" && unit.leaseExpiresAt !== null && new Date(unit.leaseExpiresAt) > now;
}

/** Someone else holds a running lease: their name, else null. */
export function otherHolder(view: UnitView, me: BenchPerson, now = new Date()): string | null {
  if (!leaseRunning(view.unit, now) || view.unit.leaseHolderId === me.id) return null;
  return view.leaseHolderName ?? "Another inspector";
}

export function annotateLock(view: UnitView, me: BenchPerson, now = new Date()): string | null {
  if (!me.canRecord) return "Marking regions needs the inspector role.";
  if (view.lot.status !== "open") return "The lot is decided; this unit's regions are part of the record.";
  if (view.unit.status !== "queued" && view.unit.status !== "on_bench") return `This unit is ${STATUS_LABELS[view.unit.status]}; its regions are part of the record and can no longer change.`;
  const holder = otherHolder(view, me, now);
  if (holder) {
    const until = formatTime(view.unit.leaseExpiresAt!, me.timeZone ?? DEFAULT_TIME_ZONE);
    return `${holder} has this unit on their bench (lease until ${until}), so it is read-only for you.`;
  }
  return null;
}

export type BenchNotice = { tone: "held" | "closed" | "view-only"; text: string };

/**
 * The one read-only banner of the Bench: why this person cannot change the unit now, said once
 * (the header and panels no longer repeat it). A lead on someone else's running lease may still
 * correct checklist results, and the banner says so.
 */
export function benchNotice(view: UnitView, me: BenchPerson, now = new Date()): BenchNotice | null {
  const lock = annotateLock(view, me, now);
  if (!lock) return null;
  if (!me.canRecord) return { tone: "view-only", text: lock };
  if (otherHolder(view, me, now)) return { tone: "held", text: me.isLead ? `${lock} As a lead you may still correct checklist results.` : lock };
  return { tone: "closed", text: lock };
}
