import "server-only";
/**
 * Reading and saving one photo's region set (the Bench's autosave). A save sends the whole set
 * with the version it was based on; in one transaction the server locks the set, compares the
 * versions (a mismatch answers 409 with the current version and regions, so the Bench can merge
 * without losing anything), replaces the rows and bumps the version. Invalid geometry or classes
 * answer 400 with the validation library's sentences and store nothing.
 *
 * Who: inspectors and leads write; every role of the workspace reads. Not yet done: an auditor's
 * blind recheck must not see the first grader's regions — the Recheck screen will need its own
 * read path that withholds them (this GET serves every role for now).
 */
import { transaction, type DbOrTx } from "@/db/client";
import { runReads } from "@/db/run-reads";
import { logActivity } from "@/db/queries/activity";
import { lockUnit } from "@/db/queries/units";
import { getPhotoForRegions, getRegionSetHead, listPhotoRegions, lockRegionSet, writeRegionSet, type PhotoForRegions } from "@/db/queries/regions";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import { parseRegionSet, type RegionSetPayload } from "@/lib/geometry/validate";
import { claimForWork } from "@/lib/queue/claim-for-work";
import { assertUnitEditable, type UnitLeaseState } from "@/lib/units/editability";
import { payloadFromRows, rowsForSave, samePayload } from "./payload";
import type { SaveRegionsInput } from "./schemas";

type Actor = Pick<SessionUser, "id" | "workspaceId" | "roles">;

export type RegionSetView = {
  photoId: string;
  version: number;
  regions: RegionSetPayload;
  updatedAt: string | null;
  updatedByName: string | null;
};

/** Another save came first: the Bench gets the current state to merge with. */
export class RegionVersionConflict extends AppError {
  constructor(
    readonly current: RegionSetView,
    baseVersion: number,
  ) {
    super(
      "conflict",
      `These regions were changed elsewhere${current.updatedByName ? ` by ${current.updatedByName}` : ""} (now version ${current.version}; this edit started from version ${baseVersion}). Nothing was saved; reload or merge, then save again.`,
    );
  }
}

export async function loadPhotoForRegions(actor: Actor, photoId: string): Promise<PhotoForRegions> {
  const row = await getPhotoForRegions({ workspaceId: actor.workspaceId, photoId });
  if (!row) throw notFound("That photo");
  return row;
}

export async function readRegionSet(actor: Actor, photoId: string, tx?: DbOrTx): Promise<RegionSetView> {
  const key = { workspaceId: actor.workspaceId, photoId };
  const [head, rows] = await runReads(tx, [() => getRegionSetHead(key, tx), () => listPhotoRegions(key, tx)]);
  return { photoId, version: head.version, regions: payloadFromRows(rows), updatedAt: head.updatedAt?.toISOString() ?? null, updatedByName: head.updatedByName };
}

function validationError(messages: string[]): AppError {
  const fieldErrors: Record<string, string> = { regions: messages[0] ?? "The region set is not valid." };
  messages.forEach((m, i) => (fieldErrors[`regions.${i}`] = m));
  const shown = messages.slice(0, 3).join(" ");
  const more = messages.length > 3 ? ` (and ${messages.length - 3} more problem${messages.length === 4 ? "" : "s"})` : "";
  return new AppError("bad_request", `The regions were not saved: ${shown}${more} Nothing was stored.`, { fieldErrors });
}

/** The payload, checked against this photo's size and its part type's defect classes (400 with sentences otherwise). */
export function validateRegions(photo: PhotoForRegions, input: unknown): RegionSetPayload {
  if (photo.photo.removedAt) throw new AppError("conflict", "This photo was taken out of the unit; its regions are kept as a record and can no longer change.");
  if (photo.photo.status !== "ready" || !photo.photo.width || !photo.photo.height) {
    throw new AppError("conflict", "This photo is still being processed (or was refused); regions can be marked once it is ready.");
  }
  // zod checks a list's length before its elements, so even a two-million-point shape is refused at once.
  const result = parseRegionSet(input, { width: photo.photo.width, height: photo.photo.height, allowedDefects: photo.partType.defectClasses.map((d) => d.key) });
  if (!result.ok) throw validationError(result.messages);
  return result.value;
}

/**
 * Whether the actor may mark regions on this unit's photos now, and whether marking takes the unit
 * onto their bench: lib/units/editability.ts ("regions": lot open, unit waiting or on a bench, no
 * one else's running lease), thrown as the 403/409 with its sentence. The save checks it under the
 * unit's lock; learned suggestions may check it unlocked, since they store nothing.
 */
export function assertUnitAnnotatable(lotStatus: "open" | "decided", unit: UnitLeaseState, actor: Actor & Partial<Pick<SessionUser, "timeZone">>): { claims: boolean } {
  return assertUnitEditable({ work: "regions", actor, lotStatus, unit, timeZone: actor.timeZone });
}

export async function saveRegionSet(actor: SessionUser, photoId: string, input: SaveRegionsInput): Promise<RegionSetView> {
  const photo = await loadPhotoForRegions(actor, photoId);
  const payload = validateRegions(photo, input.regions);
  const key = { workspaceId: actor.workspaceId, photoId };
  return transaction(async (tx) => {
    // The unit first (the same order as grading), so a grade and a save never deadlock.
    const unit = await lockUnit(tx, { workspaceId: actor.workspaceId, unitId: photo.unit.id });
    if (!unit) throw notFound("That photo");
    const { claims } = assertUnitAnnotatable(unit.lotStatus, unit, actor);
    const set = await lockRegionSet(tx, key);
    if (set.version !== input.baseVersion) {
      const current = await readRegionSet(actor, photoId, tx);
      // A retry of this person's save that did go through (its answer was lost, e.g. in a
      // database outage): the same set, one version on, by them. Answered as saved, not as a conflict.
      if (current.version === input.baseVersion + 1 && set.updatedBy === actor.id && samePayload(current.regions, payload)) return current;
      throw new RegionVersionConflict(current, input.baseVersion);
    }
    // Marking a unit that waits in the queue (or whose lease ran out) takes it onto the marker's bench.
    if (claims) await claimForWork(tx, actor, unit, "regions");
    const version = set.version + 1;
    const previous = await listPhotoRegions(key, tx);
    const { rows, added, changed, removed } = rowsForSave(payload, previous, { authorId: actor.id, version });
    await writeRegionSet(tx, { ...key, rows, version, updatedBy: actor.id });
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "regions.saved",
      subjectType: "photo",
      subjectId: photoId,
      detail: { unitId: photo.unit.id, version, regions: rows.length, added, changed, removed },
    });
    return readRegionSet(actor, photoId, tx);
  });
}
