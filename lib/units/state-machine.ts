/**
 * The one state machine every unit moves through. Route handlers and jobs never set a unit's
 * status directly: they ask `transition()` and store what it returns, so an impossible move is
 * refused the same way everywhere (409 with a sentence).
 */
import type { UnitStatus } from "@/db/schema/lots";
import { AppError } from "@/lib/errors";

export type UnitEvent =
  /** An inspector takes the unit onto the bench (a lease starts). */
  | "claim"
  /** The inspector (or a lead) puts it back, or the lease ran out. */
  | "release"
  /** The inspector submits a grade. */
  | "submit_grade"
  /** The unit is drawn for a blind recheck. */
  | "start_recheck"
  /** Recheck or adjudication finished, or the lot was decided without one. */
  | "finalise"
  /** A lead reopens a graded unit for correction. */
  | "reopen"
  /** The lot was decided before this unit was inspected: it leaves the queue (or the bench) for good. */
  | "withdraw";

const TRANSITIONS: Record<UnitEvent, Partial<Record<UnitStatus, UnitStatus>>> = {
  claim: { queued: "on_bench" },
  release: { on_bench: "queued" },
  submit_grade: { on_bench: "graded" },
  start_recheck: { graded: "in_recheck" },
  finalise: { graded: "final", in_recheck: "final" },
  reopen: { graded: "queued" },
  withdraw: { queued: "not_graded", on_bench: "not_graded" },
};

export const STATUS_LABELS: Record<UnitStatus, string> = {
  queued: "waiting in the queue",
  on_bench: "on a bench",
  graded: "graded",
  in_recheck: "in recheck",
  final: "final",
  not_graded: "not graded (the lot was decided first)",
};

const EVENT_LABELS: Record<UnitEvent, string> = {
  claim: "taken onto the bench",
  release: "put back in the queue",
  submit_grade: "graded",
  start_recheck: "sent to recheck",
  finalise: "made final",
  reopen: "reopened",
  withdraw: "withdrawn from the queue",
};

export function canTransition(from: UnitStatus, event: UnitEvent): boolean {
  return TRANSITIONS[event][from] !== undefined;
}

/** The status after `event`, or a 409 AppError explaining why the unit cannot move. */
export function transition(from: UnitStatus, event: UnitEvent): UnitStatus {
  const to = TRANSITIONS[event][from];
  if (!to) {
    throw new AppError("conflict", `This unit is ${STATUS_LABELS[from]}, so it cannot be ${EVENT_LABELS[event]}.`);
  }
  return to;
}

/** Events that can happen from a status (for buttons and for tests). */
export function eventsFrom(from: UnitStatus): UnitEvent[] {
  return (Object.keys(TRANSITIONS) as UnitEvent[]).filter((e) => canTransition(from, e));
}
