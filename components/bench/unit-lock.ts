/**
 * The Bench's reading of lib/units/editability.ts: whether the signed-in person may change this
 * unit now (its regions, checklist, serial, photos, grade), and if not, the sentence the server
 * would answer with — so panels open read-only instead of failing on the first save, and the
 * read-only banner says why once. The server still decides (by the database's clock); here a
 * running lease is read from the browser's clock. Pure.
 */
import type { Role } from "@/lib/auth/roles";
import { leaseRunningAt, unitEditability, type UnitEditability, type UnitWork } from "@/lib/units/editability";
import type { UnitView } from "@/lib/units/dto";

/** Who looks at the Bench; `timeZone` is the workspace's (times are shown in it). */
export type BenchPerson = { id: string; roles: readonly Role[]; timeZone?: string };

export function benchEditability(view: UnitView, me: BenchPerson, work: UnitWork, now = new Date()): UnitEditability {
  const unit = { ...view.unit, leaseHolderName: view.leaseHolderName, leaseRunning: leaseRunningAt(view.unit, now) };
  return unitEditability({ work, actor: me, lotStatus: view.lot.status, unit, timeZone: me.timeZone });
}

/** Why this person cannot do `work` on the unit now, or null when they can. */
export function unitLock(view: UnitView, me: BenchPerson, work: UnitWork, now = new Date()): string | null {
  const result = benchEditability(view, me, work, now);
  return result.editable ? null : result.reason;
}

export type BenchNotice = { tone: "held" | "closed" | "view-only"; text: string };

/**
 * The one read-only banner of the Bench: why this person cannot mark the unit now, said once (the
 * header and panels do not repeat it). A lead on someone else's running lease may still correct
 * checklist results, and the banner says so.
 */
export function benchNotice(view: UnitView, me: BenchPerson, now = new Date()): BenchNotice | null {
  const regions = benchEditability(view, me, "regions", now);
  if (regions.editable) return null;
  if (regions.cause === "permission") return { tone: "view-only", text: regions.reason };
  if (regions.cause === "held") {
    const checklistOpen = benchEditability(view, me, "checklist", now).editable;
    return { tone: "held", text: checklistOpen ? `${regions.reason} As a lead you may still correct checklist results.` : regions.reason };
  }
  return { tone: "closed", text: regions.reason };
}
