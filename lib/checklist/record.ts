import "server-only";
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { upsertChecklistResult } from "@/db/queries/checklist";
import { getUnitDetail, lockUnit } from "@/db/queries/units";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import { claimForWork, workClaimsUnit } from "@/lib/queue/claim-for-work";
import { assertNotLeasedByOther } from "@/lib/queue/queue";
import { STATUS_LABELS } from "@/lib/units/state-machine";
import type { ChecklistRecordInput } from "@/lib/units/schemas";
import { evaluateChecklistItem } from "./evaluate";

/**
 * Records one checklist item's result on a unit (the latest result per item is kept; every change
 * is in the activity log). The verdict of the item is computed here, never taken from the client.
 *
 * Bench rules: a unit waiting in the queue is taken onto the recorder's bench (state machine
 * "claim", with the queue's lease length); a unit on another inspector's bench under a running
 * lease is read-only (lib/queue/queue.ts); a lead may correct results without taking the lease.
 * Graded, rechecked and final units, units of decided lots and placeholders without a serial are closed.
 */
export async function recordChecklistResult(actor: SessionUser, unitId: string, input: ChecklistRecordInput) {
  return transaction(async (tx) => {
    const unit = await lockUnit(tx, { workspaceId: actor.workspaceId, unitId });
    if (!unit) throw notFound("That unit");
    const detail = (await getUnitDetail({ workspaceId: actor.workspaceId, unitId }, tx))!;
    if (detail.lot.status !== "open") throw new AppError("conflict", "This unit's lot is decided; its checklist can no longer change.");
    if (unit.status !== "queued" && unit.status !== "on_bench") throw new AppError("conflict", `This unit is ${STATUS_LABELS[unit.status]}, so its checklist can no longer change.`);
    if (unit.serial === null) throw new AppError("conflict", "Scan or type this unit's serial first, so the results belong to a known part.", { fieldErrors: { serial: "Enter the serial first." } });
    const item = detail.partType.checklist.find((i) => i.id === input.itemId);
    if (!item) throw new AppError("bad_request", `“${input.itemId}” is not an item of the ${detail.partType.name} checklist.`, { fieldErrors: { itemId: "Unknown checklist item." } });
    const evaluation = evaluateChecklistItem(item, input.value);

    const managesLeases = can(actor, "leases.manage");
    if (!managesLeases) assertNotLeasedByOther(unit, actor);
    // Queued, or on a bench whose lease ran out: the recorder takes it. A lead correcting a
    // result leaves a bench whose lease ran out alone.
    if (unit.status === "queued" || (!managesLeases && workClaimsUnit(unit))) await claimForWork(tx, actor, unit, "checklist");

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
