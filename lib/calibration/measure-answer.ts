import "server-only";
/**
 * The taker's own numbers while taking a set, as on the Bench: the regions saved for one item
 * measured like one photo of a unit (the Bench's measuring, in a compute thread) and what the part
 * type's current published rubric proposes for them. Computed on request, never stored.
 *
 * Blind: only the taker's own saved regions go in, and the photo is named by its place in the set
 * (the measurement echoes the name it is given), so the answer carries nothing of the key.
 */
import { listBlindSetItems } from "@/db/queries/calibration";
import { getGradingPartType, getLatestPublished } from "@/db/queries/rubrics";
import type { SessionUser } from "@/lib/auth/require-user";
import { COMPUTE_START_ALLOWANCE_MS, runInThread } from "@/lib/compute/pool";
import { AppError, notFound } from "@/lib/errors";
import type { GradeResult } from "@/lib/grading/evaluate";
import { MEASURE_INLINE_BUDGET_MS } from "@/lib/grading/schemas";
import type { PhotoMeasurement } from "@/lib/measure/types";
import { ownAttempt } from "./attempts";

export type AnswerMeasurement = {
  measurement: PhotoMeasurement;
  notes: string[];
  /** What the current published rubric proposes for these numbers, or null when none is published. */
  rubric: { version: number; proposal: GradeResult } | null;
  /** When the measured answer was saved (null: nothing saved yet, an empty answer was measured). */
  savedAt: string | null;
};

const NO_RULES = { rules: [], notes: [] };

export async function measureAnswer(taker: Pick<SessionUser, "id" | "workspaceId">, attemptId: string, position: number): Promise<AnswerMeasurement> {
  const attempt = await ownAttempt(taker, attemptId);
  const item = (await listBlindSetItems({ workspaceId: taker.workspaceId, setId: attempt.setId })).find((i) => i.position === position);
  if (!item) throw notFound("That item of the set");
  if (!item.width || !item.height) throw new AppError("conflict", "This item's photo is not available; tell your trainer.");
  const [partType, published] = await Promise.all([
    getGradingPartType({ workspaceId: taker.workspaceId, partTypeId: item.partTypeId }),
    getLatestPublished({ workspaceId: taker.workspaceId, partTypeId: item.partTypeId }),
  ]);
  if (!partType) throw notFound("That item of the set");
  const answer = attempt.answers[String(position)];
  const regions = answer?.regions ?? { regions: [], surfaces: [], ruler: null };
  const budgetMs = MEASURE_INLINE_BUDGET_MS;
  const outcome = await runInThread(
    "measure-unit",
    {
      partType,
      rubric: published?.rubric ?? NO_RULES,
      photos: [
        {
          photoId: `item-${position}`,
          viewKey: item.viewKey,
          width: item.width,
          height: item.height,
          regionsVersion: 0,
          defects: regions.regions,
          surfaces: regions.surfaces.map((s) => s.shape),
          rulers: regions.ruler ? [regions.ruler] : [],
        },
      ],
      functionalFailures: { critical: 0, major: 0, minor: 0 },
      budgetMs,
    },
    { timeoutMs: budgetMs + COMPUTE_START_ALLOWANCE_MS },
  );
  const [photo] = outcome.photos;
  return { measurement: photo.measurement, notes: photo.notes, rubric: published ? { version: published.version, proposal: outcome.unit.proposal } : null, savedAt: answer?.savedAt ?? null };
}
