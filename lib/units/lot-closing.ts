import "server-only";
/**
 * What a lot's decision does to its units (the lead's decision and the demo seed's decided lots):
 * graded units become final — "finalise: … or the lot was decided without one [recheck]"
 * (./state-machine.ts) — and units the decision came before (still waiting, or on a bench) leave
 * the queue and any bench for good, as "not graded": nobody needs them now, and left queued they
 * would sit in the queue's index for every later claim to walk past.
 */
import type { Tx } from "@/db/client";
import { setLotUnitsStatus, withdrawLotUnits } from "@/db/queries/unit-status";
import type { UnitStatus } from "@/db/schema/lots";
import { transition } from "./state-machine";

const FINALISED_FROM: UnitStatus[] = ["graded"];
const WITHDRAWN_FROM: UnitStatus[] = ["queued", "on_bench"];

/** Call in the decision's transaction, with the lot locked. Returns the ids of the units of each move. */
export async function closeLotUnits(tx: Tx, { workspaceId, lotId, at }: { workspaceId: string; lotId: string; at: Date }) {
  const finalised = await setLotUnitsStatus(tx, { workspaceId, lotId, from: FINALISED_FROM, to: to(FINALISED_FROM, "finalise"), at });
  const withdrawn = await withdrawLotUnits(tx, { workspaceId, lotId, from: WITHDRAWN_FROM, to: to(WITHDRAWN_FROM, "withdraw"), at });
  return { finalised, withdrawn };
}

/** The one status every `from` moves to on `event` (the state machine refuses any that cannot move). */
function to(from: UnitStatus[], event: "finalise" | "withdraw"): UnitStatus {
  const targets = new Set(from.map((status) => transition(status, event)));
  if (targets.size !== 1) throw new Error(`${event} moves ${from.join(", ")} to different statuses`);
  return [...targets][0];
}
