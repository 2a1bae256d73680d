import "server-only";
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { getLot, insertLot, lockLot, recordLotDecision } from "@/db/queries/lots";
import type { LotDecisionCounts } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import { SamplingInputError } from "@/lib/sampling/iso2859";
import { closeLotUnits } from "@/lib/units/lot-closing";
import { buildLotPlan } from "./plan";
import { DEFECT_SEVERITIES } from "@/lib/part-types/severity";
import { oneLotProgress, progressInput } from "./progress";
import { assertPair, switchingStateFor } from "./scheme";
import { DISPOSITION_LABELS, DISPOSITIONS_FOR_VERDICT, MAX_UNITS_PER_LOT, type DispositionInput, type LotCreateInput } from "./schemas";

/**
 * Receives a lot: the switching rules (from this supplier + part type's decided lots) give the
 * inspection severity, and the ISO 2859-1 plans for it are stored with the lot, so later table or
 * rule changes never rewrite what this lot was judged on.
 */
export async function createLot(actor: SessionUser, input: LotCreateInput) {
  const pair = { workspaceId: actor.workspaceId, supplierId: input.supplierId, partTypeId: input.partTypeId };
  return transaction(async (tx) => {
    const { supplier, partType } = await assertPair(pair, tx);
    if (!supplier.active)
      throw new AppError("conflict", `${supplier.name} is marked inactive; reactivate the supplier before receiving a lot.`, { fieldErrors: { supplierId: "This supplier is inactive." } });
    if (!partType.active)
      throw new AppError("conflict", `${partType.name} is retired; reactivate the part type before receiving a lot.`, { fieldErrors: { partTypeId: "This part type is retired." } });
    const { state } = await switchingStateFor(pair, tx);
    if (state.discontinued) {
      throw new AppError("conflict", `Inspection of ${partType.name} from ${supplier.name} is discontinued: ${state.reason} A lead records the supplier's corrective action before the next lot.`);
    }
    let plan;
    try {
      plan = buildLotPlan({
        lotSize: input.quantity,
        level: input.inspectionLevel,
        aqls: { critical: input.aqlCritical, major: input.aqlMajor, minor: input.aqlMinor },
        severity: state.severity,
        inspectAll: partType.inspectAll,
        switchingReason: state.reason,
        switchingProgress: state.progress,
      });
    } catch (err) {
      if (err instanceof SamplingInputError) throw new AppError("bad_request", `The sampling plan cannot be made: ${err.message}.`);
      throw err;
    }
    if (plan.sampleSize > MAX_UNITS_PER_LOT) {
      throw new AppError(
        "bad_request",
        `This lot would need ${plan.sampleSize.toLocaleString("en-GB")} units inspected (${partType.name} is inspected 100 %); at most ${MAX_UNITS_PER_LOT.toLocaleString("en-GB")} fit one lot. Split the delivery.`,
        {
          fieldErrors: { quantity: `At most ${MAX_UNITS_PER_LOT.toLocaleString("en-GB")} for a part type inspected 100 %.` },
        },
      );
    }
    const row = await insertLot(tx, {
      workspaceId: actor.workspaceId,
      supplierId: input.supplierId,
      partTypeId: input.partTypeId,
      purchaseRef: input.purchaseRef,
      modelFamily: input.modelFamily || partType.modelFamily,
      quantity: input.quantity,
      receivedOn: input.receivedOn,
      dueOn: input.dueOn,
      inspectionLevel: input.inspectionLevel,
      aqlCritical: input.aqlCritical,
      aqlMajor: input.aqlMajor,
      aqlMinor: input.aqlMinor,
      inspectionSeverity: state.severity,
      promisedGrade: input.promisedGrade ?? supplier.promisedGrade ?? partType.promisedGrade,
      plan,
      createdBy: actor.id,
    });
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "lot.created",
      subjectType: "lot",
      subjectId: row.id,
      detail: { purchaseRef: row.purchaseRef, quantity: row.quantity, promisedGrade: row.promisedGrade, severity: state.severity, sampleSize: plan.sampleSize, switchingReason: state.reason },
    });
    return row;
  });
}

/**
 * The lead's decision: the verdict is the running verdict (it must have been reached), stored with
 * the counts it rests on; the disposition must suit it. Graded units become final.
 */
export async function decideLot(actor: SessionUser, lotId: string, input: DispositionInput) {
  return transaction(async (tx) => {
    const locked = await lockLot(tx, { workspaceId: actor.workspaceId, lotId });
    if (!locked) throw notFound("That lot");
    if (locked.status === "decided") throw new AppError("conflict", `This lot was already decided (${locked.verdict}, ${DISPOSITION_LABELS[locked.disposition!].toLowerCase()}).`);
    const lot = (await getLot({ workspaceId: actor.workspaceId, lotId }, tx))!;
    const { verdict } = await oneLotProgress(actor.workspaceId, progressInput({ lot: locked, checklistItemIds: lot.checklistItemIds }), tx);
    if (verdict.verdict === "pending") throw new AppError("conflict", `There is no verdict yet. ${verdict.summary}`);
    const allowed = DISPOSITIONS_FOR_VERDICT[verdict.verdict];
    if (!allowed.includes(input.disposition)) {
      const message = `A lot with the verdict “${verdict.verdict}” can go ${allowed.map((d) => DISPOSITION_LABELS[d].toLowerCase()).join(", ")}; not ${DISPOSITION_LABELS[input.disposition].toLowerCase()}.`;
      throw new AppError("bad_request", message, { fieldErrors: { disposition: message } });
    }
    const decisionCounts = Object.fromEntries(
      DEFECT_SEVERITIES.map((s) => [s, { found: verdict.classes[s].found, inspected: verdict.classes[s].inspected, sampleSize: verdict.classes[s].sampleSize }]),
    ) as LotDecisionCounts;
    const now = new Date();
    const row = await recordLotDecision(tx, {
      workspaceId: actor.workspaceId,
      lotId,
      decision: { verdict: verdict.verdict, disposition: input.disposition, dispositionReason: input.reason, decisionCounts, decidedBy: actor.id, decidedAt: now },
    });
    const { withdrawn } = await closeLotUnits(tx, { workspaceId: actor.workspaceId, lotId, at: now });
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "lot.decided",
      subjectType: "lot",
      subjectId: lotId,
      detail: { verdict: verdict.verdict, disposition: input.disposition, reason: input.reason, counts: decisionCounts, summary: verdict.summary, notGraded: withdrawn.length },
    });
    return row;
  });
}
