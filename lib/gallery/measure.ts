import "server-only";
/**
 * The measured numbers of a gallery item and what the part type's current published rubric says
 * of it: the item's own regions measured like one photo of a unit (measureCoverage through the
 * Bench's measuring, in a compute thread), graded with no checklist failures — a gallery item is a
 * cosmetic example. Computed on request and never stored: the item's regions and the published
 * rubric may both change, and the page must show today's answer.
 *
 * Without a published rubric the numbers are still measured; `rubric` is then null.
 */
import { getGalleryItem } from "@/db/queries/gallery";
import { getLatestPublished } from "@/db/queries/rubrics";
import type { SessionUser } from "@/lib/auth/require-user";
import { COMPUTE_START_ALLOWANCE_MS, runInThread } from "@/lib/compute/pool";
import { notFound } from "@/lib/errors";
import type { GradeResult } from "@/lib/grading/evaluate";
import { MEASURE_INLINE_BUDGET_MS } from "@/lib/grading/schemas";
import type { PhotoMeasurement } from "@/lib/measure/types";
import { canOpenItem } from "./access";
import { ITEM_NOT_FOUND } from "./items";

export type GalleryMeasurement = {
  measurement: PhotoMeasurement;
  notes: string[];
  /** The current published rubric's verdict on these numbers, or null when none is published. */
  rubric: { version: number; proposal: GradeResult } | null;
  /** The item's revision these numbers belong to. */
  revision: number;
};

const NO_RULES = { rules: [], notes: [] };

export async function measureGalleryItem(reader: Pick<SessionUser, "id" | "workspaceId" | "roles">, itemId: string): Promise<GalleryMeasurement | null> {
  const item = await getGalleryItem({ workspaceId: reader.workspaceId, itemId, readerId: reader.id });
  if (!item || !canOpenItem(reader.roles, item)) throw notFound(ITEM_NOT_FOUND);
  if (item.photo.status !== "ready" || !item.photo.width || !item.photo.height) return null;
  const published = await getLatestPublished({ workspaceId: reader.workspaceId, partTypeId: item.partTypeId });
  const budgetMs = MEASURE_INLINE_BUDGET_MS;
  const outcome = await runInThread(
    "measure-unit",
    {
      partType: item.partType,
      rubric: published?.rubric ?? NO_RULES,
      photos: [
        {
          photoId: item.photo.id,
          viewKey: item.viewKey,
          width: item.photo.width,
          height: item.photo.height,
          regionsVersion: item.revision,
          defects: item.regions.regions,
          surfaces: item.regions.surfaces.map((s) => s.shape),
          rulers: item.regions.ruler ? [item.regions.ruler] : [],
        },
      ],
      functionalFailures: { critical: 0, major: 0, minor: 0 },
      budgetMs,
    },
    { timeoutMs: budgetMs + COMPUTE_START_ALLOWANCE_MS },
  );
  const [photo] = outcome.photos;
  return {
    measurement: photo.measurement,
    notes: photo.notes,
    rubric: published ? { version: published.version, proposal: outcome.unit.proposal } : null,
    revision: item.revision,
  };
}
