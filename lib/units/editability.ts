/**
 * Whether a person may change a unit now, and if not, the one sentence that says why: the server
 * throws it as the 403/409 message (`assertUnitEditable`), the Bench shows it as its read-only
 * banner and on disabled controls (`unitEditability`). One rule set for both sides, so the Bench
 * opens read-only exactly when a save would be refused. Pure and free of server imports.
 *
 * The rules, in the order they are checked:
 * 1. Permission: the work's permission (lib/auth/permissions.ts) — 403.
 * 2. The lot is open: a decided lot's units are part of the record — 409.
 * 3. The unit waits in the queue or is on a bench; graded, rechecked, final and withdrawn units'
 *    evidence is fixed (a lead's override of a grade is lib/grading/grade-rules.ts) — 409.
 * 4. Nobody else holds a running lease: the unit is read-only for everybody but the holder — 409.
 *    Two exceptions: whoever may manage leases (a lead) may still correct the checklist and the
 *    serial on someone else's bench (one field at a time, no conflict to merge), but not regions,
 *    photos or a grade (two people marking one photo only make conflicts; a lead takes the unit
 *    over with Reassign); and adding photos is not held by a lease (an upload only adds).
 * Then, for work that is allowed: whether it takes the unit onto the worker's bench (`claims`,
 * see lib/queue/claim-for-work.ts) — a waiting unit always; a bench whose lease ran out, unless a
 * lead is correcting the checklist. Serials and uploads never claim; an inspection grade moves the
 * unit on and ends its lease instead (lib/queue/queue.ts finishInspection).
 *
 * "Running" is decided by the caller: the server passes lockUnit's `leaseRunning` (the database's
 * clock); the Bench passes `leaseRunningAt(unit, now)` (the browser's clock; the server decides).
 */
import { can, describeHolders, type Permission } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import type { Role } from "@/lib/auth/roles";
import { DEFAULT_TIME_ZONE, formatTime } from "@/lib/time/format";
import type { UnitStatus } from "@/db/schema/lots";
import { STATUS_LABELS } from "@/lib/units/state-machine";

export type UnitWork = "checklist" | "serial" | "regions" | "photos" | "upload" | "grade";

type WorkRule = {
  permission: Permission;
  /** "Marking regions needs …" */
  doing: string;
  /** "… so its regions are part of the record …" */
  what: string;
  /** How a closed unit's sentence ends. */
  closed: string;
  /** A lease manager (a lead) may do it on someone else's running lease. */
  leaseManagerPasses: boolean;
  /** Held by someone else's running lease at all. */
  heldByLease: boolean;
  claims: "when-free" | "never";
};

const RECORD = "part of the record and can no longer change";
const RULES: Record<UnitWork, WorkRule> = {
  checklist: { permission: "units.record", doing: "Recording checklist results", what: "its checklist is", closed: RECORD, leaseManagerPasses: true, heldByLease: true, claims: "when-free" },
  serial: { permission: "units.record", doing: "Setting the serial", what: "its serial is", closed: RECORD, leaseManagerPasses: true, heldByLease: true, claims: "never" },
  regions: { permission: "regions.edit", doing: "Marking regions", what: "its regions are", closed: RECORD, leaseManagerPasses: false, heldByLease: true, claims: "when-free" },
  photos: { permission: "photos.capture", doing: "Changing photos", what: "its photos are", closed: RECORD, leaseManagerPasses: false, heldByLease: true, claims: "when-free" },
  upload: {
    permission: "photos.capture",
    doing: "Adding photos",
    what: "its photos are",
    closed: "part of the record and no more can be added",
    leaseManagerPasses: false,
    heldByLease: false,
    claims: "never",
  },
  grade: { permission: "grades.record", doing: "Grading", what: "its grade is", closed: RECORD, leaseManagerPasses: false, heldByLease: true, claims: "never" },
};

/** What the rules read of a unit: the server's locked row or the Bench's view of it. */
export type UnitLeaseState = {
  status: UnitStatus;
  leaseHolderId: string | null;
  leaseHolderName: string | null;
  leaseExpiresAt: Date | string | null;
  /** On a bench under a lease that has not run out (by the database's clock on the server). */
  leaseRunning: boolean;
};

export type EditabilityInput = {
  work: UnitWork;
  actor: { id: string; roles: readonly Role[] };
  lotStatus: "open" | "decided";
  unit: UnitLeaseState;
  /** The workspace's time zone, for the lease's end in the sentence. */
  timeZone?: string;
};

export type UnitEditability =
  { editable: true; claims: boolean } | { editable: false; code: "forbidden" | "conflict"; cause: "permission" | "lot" | "status" | "held"; reason: string; holderName?: string };

const OPEN_STATUSES: readonly UnitStatus[] = ["queued", "on_bench"];

/** The Bench's reading of a running lease, from its view of the unit (ISO text or Date). */
export function leaseRunningAt(unit: { status: UnitStatus; leaseExpiresAt: Date | string | null }, now = new Date()): boolean {
  return unit.status === "on_bench" && unit.leaseExpiresAt !== null && new Date(unit.leaseExpiresAt).getTime() > now.getTime();
}

/** Someone other than the actor holds a running lease on the unit. */
export function heldByOther(unit: UnitLeaseState, actorId: string): boolean {
  return unit.status === "on_bench" && unit.leaseRunning && unit.leaseHolderId !== null && unit.leaseHolderId !== actorId;
}

export function heldSentence(unit: UnitLeaseState, timeZone = DEFAULT_TIME_ZONE): string {
  const holder = unit.leaseHolderName ?? "Another inspector";
  const until = unit.leaseExpiresAt ? ` (lease until ${formatTime(unit.leaseExpiresAt, timeZone)})` : "";
  return `${holder} has this unit on their bench${until}, so it is read-only for you.`;
}

export function unitEditability({ work, actor, lotStatus, unit, timeZone }: EditabilityInput): UnitEditability {
  const rule = RULES[work];
  if (!can(actor, rule.permission)) {
    return { editable: false, code: "forbidden", cause: "permission", reason: `${rule.doing} needs the ${describeHolders(rule.permission)} role, which your account does not have.` };
  }
  if (lotStatus !== "open") return { editable: false, code: "conflict", cause: "lot", reason: `This unit's lot is decided; ${rule.what} ${rule.closed}.` };
  if (!OPEN_STATUSES.includes(unit.status)) return { editable: false, code: "conflict", cause: "status", reason: `This unit is ${STATUS_LABELS[unit.status]}, so ${rule.what} ${rule.closed}.` };
  const managesLeases = can(actor, "leases.manage");
  if (rule.heldByLease && heldByOther(unit, actor.id) && !(rule.leaseManagerPasses && managesLeases)) {
    return { editable: false, code: "conflict", cause: "held", reason: heldSentence(unit, timeZone), holderName: unit.leaseHolderName ?? "Another inspector" };
  }
  const free = unit.status === "queued" || !unit.leaseRunning;
  // A lead correcting a result leaves a bench whose lease ran out alone; a waiting unit is taken.
  const claims = rule.claims === "when-free" && free && (unit.status === "queued" || !(rule.leaseManagerPasses && managesLeases));
  return { editable: true, claims };
}

/** The server's form: throws the refusal as an AppError (403 or 409), or says whether the work claims the unit. */
export function assertUnitEditable(input: EditabilityInput): { claims: boolean } {
  const result = unitEditability(input);
  if (!result.editable) throw new AppError(result.code, result.reason);
  return { claims: result.claims };
}
