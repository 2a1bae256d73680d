import "server-only";
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { upsertChecklistResult } from "@/db/queries/checklist";
import { getUnitDetail, lockUnit } from "@/db/queries/units";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import { claimForWork } from "@/lib/queue/claim-for-work";
import { assertUnitEditable } from "@/lib/units/editability";
import type { ChecklistRecordInput } from "@/lib/units/schemas";
import { evaluateChecklistItem } from "./evaluate";

/**
 * Records one checklist item's result on a unit (the latest result per item is kept; every change
 * is in the activity log). The verdict of the item is computed here, never taken from the client.
 *
 * Who may record it now is lib/units/editability.ts (a unit waiting in the queue is taken onto the
 * recorder's bench; another inspector's running lease makes it read-only, except for a lead
 * correcting results; graded, rechecked and final units and decided lots are closed). A
 * placeholder without a serial takes no results until the serial is entered.
 */
export async function recordChecklistResult(actor: SessionUser, unitId: string, input: ChecklistRecordInput) {
  return transaction(async (tx) => {
    const unit = await lockUnit(tx, { workspaceId: actor.workspaceId, unitId });
    if (!unit) throw notFound("That unit");
    const detail = (await getUnitDetail({ workspaceId: actor.workspaceId, unitId }, tx))!;
    const { claims } = assertUnitEditable({ work: "checklist", actor, lotStatus: unit.lotStatus, unit, timeZone: actor.timeZone });
    if (unit.serial === null) throw new AppError("conflict", "Scan or type this unit's serial first, so the results belong to a known part.", { fieldErrors: { serial: "Enter the serial first." } });
    const item = detail.partType.checklist.find((i) => i.id === input.itemId);
    if (!item) throw new AppError("bad_request", `“${input.itemId}” is not an item of the ${detail.partType.name} checklist.`, { fieldErrors: { itemId: "Unknown checklist item." } });
    const evaluation = evaluateChecklistItem(item, input.value);

    // Queued, or on a bench whose lease ran out: the recorder takes it (a lead correcting a result
    // leaves a bench whose lease ran out alone; lib/units/editability.ts).
    if (claims) await claimForWork(tx, actor, unit, "checklist");

    const values = {
      value: evaluation.value,
      passed: evaluation.passed,
      failureReason: evaluation.failureReason,
      severityOnFail: item.severityOnFail,
      note: input.note ?? "",
      recordedBy: actor.id,
      recordedAt: new Date(),
    };
    const result = await upsertChecklistResult(tx, { workspaceId: actor.workspaceId, unitId, itemId: item.id, values });
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "checklist.recorded",
      subjectType: "unit",
      subjectId: unitId,
      detail: { itemId: item.id, value: evaluation.value, passed: evaluation.passed, failureReason: evaluation.failureReason, severityOnFail: item.severityOnFail },
    });
    return result;
  });
}
