import "server-only";
/**
 * "Who has seen this unit's inspection work": every API read of a unit's regions, measurements,
 * grades or details notes the reader (one row per unit and person, the last time moved on). A
 * person who also holds the inspector or lead role could have read the first grade that way;
 * the recheck queue never offers them that unit, and a recheck submitted after such an opening is
 * marked not blind (lib/recheck/queue.ts, submit.ts). Not the Bench page's server render: Next
 * prefetches it for every unit link on a lot page, which would mark units nobody opened; the
 * Bench's panels read these APIs as soon as it is on screen. Recorded for everybody, whatever their
 * roles today: roles change, and the record must already be there when they do.
 */
import { recordUnitOpening } from "@/db/queries/rechecks";
import type { SessionUser } from "@/lib/auth/require-user";

/** Call after the read succeeded (the unit is known to be in the reader's workspace). */
export async function noteInspectionOpened(user: Pick<SessionUser, "id" | "workspaceId">, unitId: string) {
  await recordUnitOpening({ workspaceId: user.workspaceId, unitId, userId: user.id });
}
