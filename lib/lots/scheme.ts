import "server-only";
import { transaction, type DbOrTx } from "@/db/client";
import { runReads } from "@/db/run-reads";
import { logActivity } from "@/db/queries/activity";
import { getScheme, listDecidedLots, upsertScheme } from "@/db/queries/lots";
import { getPartType } from "@/db/queries/part-types";
import { getSupplier } from "@/db/queries/suppliers";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import { nextInspectionState, type SwitchingState } from "@/lib/sampling/switching";
import type { SchemeUpdateInput } from "./schemas";
import { switchingInputFor } from "./switching-history";

export type SchemeSettings = { reducedAllowed: boolean; steadyProduction: boolean; resumedAfterLotIds: string[] };
export const DEFAULT_SCHEME: SchemeSettings = { reducedAllowed: false, steadyProduction: true, resumedAfterLotIds: [] };

type Pair = { workspaceId: string; supplierId: string; partTypeId: string };

/** Both must exist in the workspace; another workspace's ids answer exactly like missing ones. */
export async function assertPair(pair: Pair, tx?: DbOrTx) {
  const supplier = await getSupplier({ workspaceId: pair.workspaceId, supplierId: pair.supplierId }, tx);
  if (!supplier) throw notFound("That supplier");
  const partType = await getPartType({ workspaceId: pair.workspaceId, partTypeId: pair.partTypeId }, tx);
  if (!partType) throw notFound("That part type");
  return { supplier, partType };
}

/** Where the switching rules stand for the next lot of a supplier + part type, and why. */
export async function switchingStateFor(pair: Pair, tx?: DbOrTx): Promise<{ state: SwitchingState; settings: SchemeSettings; decidedLots: number }> {
  const [decided, scheme] = await runReads(tx, [() => listDecidedLots(pair, tx), () => getScheme(pair, tx)]);
  const settings: SchemeSettings = scheme ? { reducedAllowed: scheme.reducedAllowed, steadyProduction: scheme.steadyProduction, resumedAfterLotIds: scheme.resumedAfterLotIds } : DEFAULT_SCHEME;
  return { state: nextInspectionState(switchingInputFor(decided, settings)), settings, decidedLots: decided.length };
}

/** The lead's approvals: reduced inspection allowed, production steady, corrective action recorded. */
export async function updateScheme(actor: SessionUser, input: SchemeUpdateInput) {
  const pair = { workspaceId: actor.workspaceId, supplierId: input.supplierId, partTypeId: input.partTypeId };
  return transaction(async (tx) => {
    await assertPair(pair, tx);
    const current = await switchingStateFor(pair, tx);
    const settings = { ...current.settings };
    if (input.reducedAllowed !== undefined) settings.reducedAllowed = input.reducedAllowed;
    if (input.steadyProduction !== undefined) settings.steadyProduction = input.steadyProduction;
    if (input.recordCorrectiveAction) {
      if (!current.state.discontinued) throw new AppError("conflict", "Inspection is not discontinued for this supplier and part type, so there is no corrective action to record.");
      const decided = await listDecidedLots(pair, tx);
      settings.resumedAfterLotIds = [...settings.resumedAfterLotIds, decided[decided.length - 1].id];
    }
    const values = { ...settings, updatedBy: actor.id, updatedAt: new Date() };
    await upsertScheme(tx, pair, values);
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "inspection_scheme.updated",
      subjectType: "supplier",
      subjectId: input.supplierId,
      detail: { partTypeId: input.partTypeId, ...settings },
    });
    return switchingStateFor(pair, tx);
  });
}
