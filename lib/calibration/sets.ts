import "server-only";
/**
 * The trainer's side of Calibration (`calibration.manage`): assemble a set from published gallery
 * items, assign it with a due date, and read the set with its key, its assignments and every
 * submitted attempt with the items most people get wrong.
 *
 * Decisions:
 * - The key is copied from each gallery item when the set is made (regions with the Surface,
 *   grade, caption), under a share lock on the items, so an edit or a retirement later never
 *   changes a set. Only published items may go in: a draft is not agreed, a retired one no longer
 *   teaches. Every refusal names the items and stores nothing.
 * - Sets may mix part types and views: each item is scored on its own.
 * - Anyone who may take a set (`calibration.take`: inspectors, and leads, who hold every
 *   permission) and is active may be assigned; assigning someone again only moves the due date.
 */
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import {
  getSet,
  insertSet,
  insertSetItems,
  listAssignableUsers,
  listKeyedSetItems,
  listSetAssignments,
  listSets,
  listSubmittedAttempts,
  lockItemsForSet,
  upsertAssignments,
} from "@/db/queries/calibration";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/require-user";
import type { Role } from "@/lib/auth/roles";
import { AppError, notFound } from "@/lib/errors";
import { itemDifficulty } from "./item-difficulty";
import type { AssignSetInput, CreateSetInput } from "./schemas";

type Trainer = Pick<SessionUser, "id" | "workspaceId">;

export const SET_NOT_FOUND = "That calibration set";

const listOf = (positions: number[]) => positions.map((p) => `#${p}`).join(", ");

export async function createSet(trainer: Trainer, input: CreateSetInput): Promise<{ id: string }> {
  const id = await transaction(async (tx) => {
    const found = new Map((await lockItemsForSet(tx, { workspaceId: trainer.workspaceId, itemIds: input.itemIds })).map((row) => [row.id, row]));
    const missing = input.itemIds.flatMap((itemId, i) => (found.has(itemId) ? [] : [i + 1]));
    if (missing.length)
      throw new AppError("bad_request", `Items ${listOf(missing)} of the list are not gallery items of this workspace. Nothing was stored.`, {
        fieldErrors: { itemIds: "name gallery items of this workspace" },
      });
    const unpublished = input.itemIds.flatMap((itemId, i) => (found.get(itemId)!.status === "published" ? [] : [i + 1]));
    if (unpublished.length) {
      throw new AppError("bad_request", `Only published gallery items can be a key; items ${listOf(unpublished)} of the list are drafts or retired. Nothing was stored.`, {
        fieldErrors: { itemIds: "must all be published" },
      });
    }
    const setId = await insertSet(tx, {
      workspaceId: trainer.workspaceId,
      name: input.name,
      minGradeAgreement: input.thresholds.minGradeAgreement,
      minMeanIou: input.thresholds.minMeanIou,
      itemCount: input.itemIds.length,
      createdBy: trainer.id,
    });
    await insertSetItems(
      tx,
      input.itemIds.map((itemId, i) => {
        const item = found.get(itemId)!;
        return {
          workspaceId: trainer.workspaceId,
          setId,
          position: i + 1,
          galleryItemId: item.id,
          photoId: item.photoId,
          partTypeId: item.partTypeId,
          viewKey: item.viewKey,
          keyRegions: item.regions,
          keyGrade: item.grade,
          keyCaption: item.caption,
        };
      }),
    );
    await logActivity(tx, {
      workspaceId: trainer.workspaceId,
      actorId: trainer.id,
      action: "calibration.set_created",
      subjectType: "calibration_set",
      subjectId: setId,
      detail: { items: input.itemIds.length, thresholds: input.thresholds },
    });
    return setId;
  });
  return { id };
}

export async function assignSet(trainer: Trainer, setId: string, input: AssignSetInput): Promise<{ assigned: number }> {
  await transaction(async (tx) => {
    const set = await getSet({ workspaceId: trainer.workspaceId, setId }, tx);
    if (!set) throw notFound(SET_NOT_FOUND);
    const people = new Map((await listAssignableUsers(tx, { workspaceId: trainer.workspaceId, userIds: input.userIds })).map((u) => [u.id, u]));
    const unknown = input.userIds.filter((userId) => !people.has(userId));
    if (unknown.length)
      throw new AppError("bad_request", `${unknown.length === 1 ? "One of the people is" : `${unknown.length} of the people are`} not in this workspace. Nothing was assigned.`, {
        fieldErrors: { userIds: "name people of this workspace" },
      });
    const cannot = input.userIds.map((userId) => people.get(userId)!).filter((u) => !u.active || !can({ roles: u.roles as Role[] }, "calibration.take"));
    if (cannot.length) {
      throw new AppError("bad_request", `${cannot.map((u) => u.name).join(", ")} cannot take calibration sets (only active inspectors and leads can). Nothing was assigned.`, {
        fieldErrors: { userIds: "must be active inspectors or leads" },
      });
    }
    await upsertAssignments(
      tx,
      input.userIds.map((userId) => ({ workspaceId: trainer.workspaceId, setId, userId, dueOn: input.dueOn, assignedBy: trainer.id })),
    );
    await logActivity(tx, {
      workspaceId: trainer.workspaceId,
      actorId: trainer.id,
      action: "calibration.assigned",
      subjectType: "calibration_set",
      subjectId: setId,
      detail: { people: input.userIds.length, dueOn: input.dueOn },
    });
  });
  return { assigned: input.userIds.length };
}

export const listCalibrationSets = (trainer: Pick<SessionUser, "workspaceId">) => listSets({ workspaceId: trainer.workspaceId });

/** The set as the trainer sees it: items with the key, who it is assigned to, every submitted attempt, and which items most people get wrong. */
export async function readSetForTrainer(trainer: Pick<SessionUser, "workspaceId">, setId: string) {
  const key = { workspaceId: trainer.workspaceId, setId };
  const set = await getSet(key);
  if (!set) throw notFound(SET_NOT_FOUND);
  const [items, assignments, attempts] = await Promise.all([listKeyedSetItems(key), listSetAssignments(key), listSubmittedAttempts(key)]);
  const difficulty = itemDifficulty(attempts.flatMap((a) => (a.score ? [{ attemptId: a.id, items: a.score.items.map((i) => ({ ...i, itemId: String(i.position) })) }] : [])));
  return {
    set: { ...set, thresholds: { minGradeAgreement: set.minGradeAgreement, minMeanIou: set.minMeanIou } },
    items,
    assignments,
    attempts: attempts.map((a) => ({
      id: a.id,
      userId: a.userId,
      userName: a.userName,
      submittedAt: a.submittedAt,
      passed: a.passed,
      summary: a.score?.summary ?? null,
      items: a.score?.items.map(({ areas: _areas, ...rest }) => rest) ?? [],
    })),
    mostMissed: difficulty.map((d) => ({ ...d, position: Number(d.itemId) })),
  };
}
