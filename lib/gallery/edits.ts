import "server-only";
/**
 * Changing the Gallery (editors only; the route handlers check the role): promote a graded unit's
 * photo into a draft, edit an item, publish it, retire it. Each change runs in one transaction that
 * locks the item, compares the revision the edit started from (409 with the current item when
 * someone saved since), writes, and logs the activity.
 *
 * Decisions:
 * - Promoting copies the photo's current regions (the item's own copy from then on) and the unit's
 *   current grade with the rubric version it was graded under; the unit is never touched. Only a
 *   unit with a grade (graded, in recheck or final) can be promoted: the gallery shows judged work.
 *   A photo already shown by a draft or published item is not promoted twice (409 naming it).
 * - Changing an item's grade records the rubric version published *now* as the one it was judged
 *   under (null when the part type has none published).
 * - Regions are validated as on the Bench (size, classes, shapes) plus the gallery's smaller budget.
 */
import { transaction, type DbOrTx } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { findActiveItemForPhoto, getUnitPhotoForPromotion, lockPhotoForItems, insertGalleryItem, lockGalleryItem, updateGalleryItem, type GalleryItemPatch } from "@/db/queries/gallery";
import { listPhotoRegions } from "@/db/queries/regions";
import { getGradingPartType, getLatestPublished } from "@/db/queries/rubrics";
import type { GalleryItemRow } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import { parseRegionSet, type RegionSetPayload } from "@/lib/geometry/validate";
import { getPhoto } from "@/db/queries/photos";
import { payloadFromRows } from "@/lib/regions/payload";
import { STATUS_LABELS } from "@/lib/units/state-machine";
import type { GalleryItemDto } from "./dto";
import { ITEM_NOT_FOUND, readGalleryItem } from "./items";
import { defectClassesOf, kindFromRegions, publishProblems, regionBudgetProblem, transitionProblem, type GalleryAction } from "./rules";
import type { EditItemInput, PromoteInput, TransitionInput } from "./schemas";

type Editor = Pick<SessionUser, "id" | "workspaceId" | "roles">;

/** Someone saved the item since this edit started: the current item comes with the 409. */
export class GalleryRevisionConflict extends AppError {
  constructor(
    readonly current: GalleryItemDto,
    sent: number,
  ) {
    super("conflict", `This item was changed meanwhile (now revision ${current.revision}; this edit started from revision ${sent}). Nothing was saved; reload it and make the change again.`);
  }
}

const GRADED_STATUSES = ["graded", "in_recheck", "final"] as const;

export async function promotePhoto(editor: Editor, input: PromoteInput): Promise<GalleryItemDto> {
  const key = { workspaceId: editor.workspaceId, photoId: input.photoId };
  const source = await getUnitPhotoForPromotion(key);
  if (!source) throw notFound("That photo");
  const { photo, unit, partType, currentGrade } = source;
  if (photo.removedAt) throw new AppError("conflict", "This photo was taken out of its unit; it is kept only as a record and cannot become a gallery item.");
  if (photo.status !== "ready") throw new AppError("conflict", "This photo is not ready (still processing, or refused); promote it once it is ready.");
  if (!(GRADED_STATUSES as readonly string[]).includes(unit.status) || !currentGrade) {
    throw new AppError("conflict", `Only a graded unit's photo can be added to the gallery; this unit is ${STATUS_LABELS[unit.status]}. Grade it first.`);
  }
  const regions = payloadFromRows(await listPhotoRegions(key));
  const itemId = await transaction(async (tx) => {
    await lockPhotoForItems(tx, key);
    const existing = await findActiveItemForPhoto(key, tx);
    if (existing) throw new AppError("conflict", `This photo is already in the gallery (a ${existing.status} item); open that item instead.`, { fieldErrors: { photoId: existing.id } });
    const id = await insertGalleryItem(tx, {
      workspaceId: editor.workspaceId,
      partTypeId: partType.id,
      viewKey: photo.viewKey,
      kind: kindFromRegions(regions),
      photoId: photo.id,
      sourceUnitId: unit.id,
      regions,
      defectClasses: defectClassesOf(regions),
      grade: currentGrade.finalGrade,
      rubricVersionId: currentGrade.rubricVersionId,
      createdBy: editor.id,
    });
    await logActivity(tx, {
      workspaceId: editor.workspaceId,
      actorId: editor.id,
      action: "gallery.promoted",
      subjectType: "gallery_item",
      subjectId: id,
      detail: { photoId: photo.id, unitId: unit.id, grade: currentGrade.finalGrade, regions: regions.regions.length },
    });
    return id;
  });
  return readGalleryItem(editor, itemId);
}

/** The item locked for this transaction, the revision compared and the action allowed in its status. */
async function lockForChange(tx: DbOrTx, editor: Editor, itemId: string, revision: number, action: GalleryAction): Promise<GalleryItemRow> {
  const item = await lockGalleryItem(tx, { workspaceId: editor.workspaceId, itemId });
  if (!item) throw notFound(ITEM_NOT_FOUND);
  if (item.revision !== revision) throw new GalleryRevisionConflict(await readGalleryItem(editor, itemId), revision);
  const problem = transitionProblem(item.status, action);
  if (problem) throw new AppError("conflict", problem);
  return item;
}

function regionsError(messages: string[]): AppError {
  const shown = messages.slice(0, 3).join(" ");
  const more = messages.length > 3 ? ` (and ${messages.length - 3} more)` : "";
  return new AppError("bad_request", `The regions were not saved: ${shown}${more} Nothing was stored.`, { fieldErrors: { regions: messages[0] ?? "are not valid" } });
}

/** The edited regions, checked against the item's photo and part type as the Bench checks a save. */
async function validateItemRegions(editor: Editor, item: GalleryItemRow, input: unknown, tx: DbOrTx): Promise<RegionSetPayload> {
  const photo = await getPhotoSize(editor, item, tx);
  const partType = await getGradingPartType({ workspaceId: editor.workspaceId, partTypeId: item.partTypeId }, tx);
  const result = parseRegionSet(input, { width: photo.width, height: photo.height, allowedDefects: partType!.defectClasses.map((d) => d.key) });
  if (!result.ok) throw regionsError(result.messages);
  const budget = regionBudgetProblem(result.value);
  if (budget) throw regionsError([budget]);
  return result.value;
}

async function getPhotoSize(editor: Editor, item: GalleryItemRow, tx: DbOrTx): Promise<{ width: number; height: number }> {
  const photo = await getPhoto({ workspaceId: editor.workspaceId, photoId: item.photoId }, tx);
  if (!photo || photo.status !== "ready" || !photo.width || !photo.height) throw new AppError("conflict", "This item's photo is not ready yet; mark regions once it is.");
  return { width: photo.width, height: photo.height };
}

export async function editItem(editor: Editor, itemId: string, input: EditItemInput): Promise<GalleryItemDto> {
  await transaction(async (tx) => {
    const item = await lockForChange(tx, editor, itemId, input.revision, "edit");
    const patch: GalleryItemPatch = {};
    if (input.caption !== undefined) patch.caption = input.caption;
    if (input.kind !== undefined) patch.kind = input.kind;
    if (input.regions !== undefined) {
      patch.regions = await validateItemRegions(editor, item, input.regions, tx);
      patch.defectClasses = defectClassesOf(patch.regions);
    }
    if (input.grade !== undefined && input.grade !== item.grade) {
      patch.grade = input.grade;
      patch.rubricVersionId = (await getLatestPublished({ workspaceId: editor.workspaceId, partTypeId: item.partTypeId }, tx))?.id ?? null;
    }
    await updateGalleryItem(tx, { workspaceId: editor.workspaceId, itemId, actorId: editor.id, patch });
    const changed = Object.keys(patch).filter((k) => k !== "defectClasses" && k !== "rubricVersionId");
    await logActivity(tx, {
      workspaceId: editor.workspaceId,
      actorId: editor.id,
      action: "gallery.edited",
      subjectType: "gallery_item",
      subjectId: itemId,
      detail: { changed, revision: input.revision + 1 },
    });
  });
  return readGalleryItem(editor, itemId);
}

export async function publishItem(editor: Editor, itemId: string, input: TransitionInput): Promise<GalleryItemDto> {
  await transaction(async (tx) => {
    const item = await lockForChange(tx, editor, itemId, input.revision, "publish");
    const photo = await getPhoto({ workspaceId: editor.workspaceId, photoId: item.photoId }, tx);
    const problems = publishProblems({ kind: item.kind, grade: item.grade, caption: item.caption, regions: item.regions, photoReady: photo?.status === "ready" });
    if (problems.length) throw new AppError("conflict", `Not published yet: ${problems.join(" ")}`);
    await updateGalleryItem(tx, { workspaceId: editor.workspaceId, itemId, actorId: editor.id, patch: { status: "published", publishedBy: editor.id, publishedAt: new Date() } });
    await logActivity(tx, {
      workspaceId: editor.workspaceId,
      actorId: editor.id,
      action: "gallery.published",
      subjectType: "gallery_item",
      subjectId: itemId,
      detail: { grade: item.grade, kind: item.kind },
    });
  });
  return readGalleryItem(editor, itemId);
}

export async function retireItem(editor: Editor, itemId: string, input: TransitionInput): Promise<GalleryItemDto> {
  await transaction(async (tx) => {
    const item = await lockForChange(tx, editor, itemId, input.revision, "retire");
    await updateGalleryItem(tx, { workspaceId: editor.workspaceId, itemId, actorId: editor.id, patch: { status: "retired", retiredAt: new Date() } });
    await logActivity(tx, { workspaceId: editor.workspaceId, actorId: editor.id, action: "gallery.retired", subjectType: "gallery_item", subjectId: itemId, detail: { from: item.status } });
  });
  return readGalleryItem(editor, itemId);
}
