import "server-only";
/**
 * The auditor's own region set on one photo of the unit they recheck: checked like the Bench's
 * (lib/geometry/validate.ts against the photo's size and the part type's classes), stored apart
 * from the first grader's regions (recheck_region_sets), with a version a save names (409 when
 * another save came first). Only the recheck's holder may save, and only before submitting.
 */
import { transaction } from "@/db/client";
import { getBlindUnit, listBlindPhotos, listRecheckRegionSets, saveRecheckRegionSet } from "@/db/queries/rechecks";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import { parseRegionSet, type RegionSetPayload } from "@/lib/geometry/validate";
import type { SaveRegionsInput } from "@/lib/regions/schemas";
import { requireHeldRecheck } from "./queue";

type Actor = Pick<SessionUser, "id" | "workspaceId">;

function validationError(messages: string[]): AppError {
  const shown = messages.slice(0, 3).join(" ");
  const more = messages.length > 3 ? ` (and ${messages.length - 3} more problem${messages.length === 4 ? "" : "s"})` : "";
  return new AppError("bad_request", `The regions were not saved: ${shown}${more} Nothing was stored.`, { fieldErrors: { regions: messages[0] ?? "The region set is not valid." } });
}

export async function saveRecheckRegions(user: Actor, recheckId: string, photoId: string, input: SaveRegionsInput): Promise<{ photoId: string; version: number; regions: RegionSetPayload }> {
  return transaction(async (tx) => {
    const recheck = await requireHeldRecheck(tx, user, recheckId);
    const key = { workspaceId: user.workspaceId, unitId: recheck.unitId };
    const photo = (await listBlindPhotos(key, tx)).find((p) => p.id === photoId);
    if (!photo) throw notFound("That photo of this unit");
    const unit = await getBlindUnit(key, tx);
    if (!unit) throw notFound("That recheck");
    const result = parseRegionSet(input.regions, { width: photo.width!, height: photo.height!, allowedDefects: unit.partType.defectClasses.map((d) => d.key) });
    if (!result.ok) throw validationError(result.messages);
    const version = await saveRecheckRegionSet(tx, { workspaceId: user.workspaceId, recheckId, photoId, payload: result.value, baseVersion: input.baseVersion, userId: user.id });
    if (version === null) {
      const current = (await listRecheckRegionSets({ workspaceId: user.workspaceId, recheckId }, tx)).find((set) => set.photoId === photoId);
      throw new AppError(
        "conflict",
        `Your regions on this photo were saved elsewhere (now version ${current?.version ?? 0}; this edit started from version ${input.baseVersion}). Reload, then save again.`,
      );
    }
    return { photoId, version, regions: result.value };
  });
}
