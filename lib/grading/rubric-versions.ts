import "server-only";
import { transaction } from "@/db/client";
import { isUniqueViolation } from "@/db/errors";
import { logActivity } from "@/db/queries/activity";
import {
  getDraft,
  getGradingPartType,
  getRubricVersion,
  insertRubricVersion,
  listRubricVersions,
  lockPartType,
  markDraftPublished,
  updateDraftRubric,
  type GradingPartTypeRow,
} from "@/db/queries/rubrics";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import { diffRubrics } from "./diff";
import { evaluateRubric } from "./evaluate";
import { gradingContextOf } from "./part-type-context";
import { rubricOrThrow, type DraftSeen } from "./schemas";
import { buildUnitMetrics, type FunctionalFailureCounts } from "./unit-metrics";
import { assertEditable, planDraft } from "./versioning";
import type { PhotoMeasurement } from "@/lib/measure/types";
import { DEFAULT_TIME_ZONE, formatTime } from "@/lib/time/format";

type Actor = Pick<SessionUser, "id" | "workspaceId"> & Partial<Pick<SessionUser, "timeZone">>;

/** The part type of the caller's workspace, or the same 404 as for a missing one. */
export async function requirePartType(actor: Actor, partTypeId: string): Promise<GradingPartTypeRow> {
  const partType = await getGradingPartType({ workspaceId: actor.workspaceId, partTypeId });
  if (!partType) throw notFound("That part type");
  return partType;
}

/** Part type lists, severities and labels for the client (editor dropdowns, labels). */
export function partTypeSummary(partType: GradingPartTypeRow) {
  const context = gradingContextOf(partType);
  return { id: partType.id, slug: partType.slug, name: partType.name, views: partType.views, ...context };
}

export async function listVersions(actor: Actor, partTypeId: string) {
  const partType = await requirePartType(actor, partTypeId);
  const versions = await listRubricVersions({ workspaceId: actor.workspaceId, partTypeId });
  return { partType: partTypeSummary(partType), versions };
}

export async function getDraftOrThrow(actor: Actor, partTypeId: string) {
  const partType = await requirePartType(actor, partTypeId);
  const draft = await getDraft({ workspaceId: actor.workspaceId, partTypeId });
  if (!draft) throw new AppError("not_found", `${partType.name} has no draft rubric. Open one to start editing.`);
  return draft;
}

/** Returns the part type's draft, creating it from the latest version when there is none. */
export async function openDraft(actor: Actor, partTypeId: string): Promise<{ created: boolean; version: number }> {
  const partType = await requirePartType(actor, partTypeId);
  try {
    return await transaction(async (tx) => {
      await lockPartType(tx, { workspaceId: actor.workspaceId, partTypeId });
      const versions = await listRubricVersions({ workspaceId: actor.workspaceId, partTypeId }, tx);
      const plan = planDraft(versions);
      if (plan.kind === "existing") return { created: false, version: plan.version };
      await insertRubricVersion(tx, { workspaceId: actor.workspaceId, partTypeId, version: plan.version, rubric: plan.rubric, basedOnVersion: plan.basedOnVersion, actorId: actor.id });
      await logActivity(tx, {
        workspaceId: actor.workspaceId,
        actorId: actor.id,
        action: "rubric.draft_opened",
        subjectType: "part_type",
        subjectId: partTypeId,
        detail: { version: plan.version, basedOnVersion: plan.basedOnVersion, partType: partType.name },
      });
      return { created: true, version: plan.version };
    });
  } catch (err) {
    if (isUniqueViolation(err)) throw new AppError("conflict", "Someone opened a draft of this rubric at the same moment. Reload to edit it.");
    throw err;
  }
}

/** 409 unless the draft is still the version and revision the caller saw. */
function assertDraftUnchanged(draft: { version: number; revision: number; updatedAt: Date; updatedByName: string | null }, seen: DraftSeen, doing: string, timeZone = DEFAULT_TIME_ZONE) {
  if (draft.version === seen.version && draft.revision === seen.revision) return;
  const by = draft.updatedByName ? ` by ${draft.updatedByName}` : "";
  const what =
    draft.version !== seen.version
      ? `The draft is now version ${draft.version}, not version ${seen.version}.`
      : `Draft version ${draft.version} was saved again${by} at ${formatTime(draft.updatedAt, timeZone)} (edit ${draft.revision}; you had edit ${seen.revision}).`;
  throw new AppError("conflict", `${what} Nothing was ${doing}: reload the draft to see the rules as they are now.`);
}

/** Replaces the draft's rules after validating them against the part type (400, nothing stored); 409 when the draft moved. */
export async function saveDraft(actor: Actor, partTypeId: string, input: unknown, seen: DraftSeen) {
  const partType = await requirePartType(actor, partTypeId);
  const rubric = rubricOrThrow(input, gradingContextOf(partType).lists);
  return transaction(async (tx) => {
    await lockPartType(tx, { workspaceId: actor.workspaceId, partTypeId });
    const draft = await getDraft({ workspaceId: actor.workspaceId, partTypeId }, tx);
    if (!draft) throw new AppError("conflict", `${partType.name} has no draft to save into: it was published or never opened. Open a new draft.`);
    assertEditable(draft);
    assertDraftUnchanged(draft, seen, "saved", actor.timeZone);
    const updated = await updateDraftRubric(tx, { workspaceId: actor.workspaceId, partTypeId, rubric, actorId: actor.id, revision: seen.revision });
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "rubric.draft_saved",
      subjectType: "part_type",
      subjectId: partTypeId,
      detail: { version: draft.version, revision: updated.revision, rules: rubric.rules.length },
    });
    return { version: updated.version, revision: updated.revision, rubric };
  });
}

/** Publishes the draft the lead saw (leads only, checked by the route); the row is frozen from then on. */
export async function publishDraft(actor: Actor, partTypeId: string, seen: DraftSeen) {
  const partType = await requirePartType(actor, partTypeId);
  return transaction(async (tx) => {
    await lockPartType(tx, { workspaceId: actor.workspaceId, partTypeId });
    const draft = await getDraft({ workspaceId: actor.workspaceId, partTypeId }, tx);
    if (!draft) throw new AppError("conflict", `${partType.name} has no draft to publish. Open a draft, edit it, then publish.`);
    assertDraftUnchanged(draft, seen, "published", actor.timeZone);
    // The part type may have changed since the draft was saved: check its lists again.
    rubricOrThrow(draft.rubric, gradingContextOf(partType).lists);
    const published = await markDraftPublished(tx, { workspaceId: actor.workspaceId, partTypeId, actorId: actor.id });
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "rubric.published",
      subjectType: "part_type",
      subjectId: partTypeId,
      detail: { version: published.version, partType: partType.name },
    });
    return { version: published.version };
  });
}

async function versionRubric(actor: Actor, partTypeId: string, which: number | "draft") {
  const row = which === "draft" ? await getDraft({ workspaceId: actor.workspaceId, partTypeId }) : await getRubricVersion({ workspaceId: actor.workspaceId, partTypeId, version: which });
  if (!row) throw new AppError("not_found", which === "draft" ? "This part type has no draft rubric." : `Rubric version ${which} was not found.`);
  return row;
}

/** A readable diff between two versions ("draft" names the current draft). */
export async function diffVersions(actor: Actor, partTypeId: string, from?: number | "draft", to?: number | "draft") {
  const partType = await requirePartType(actor, partTypeId);
  const newest = (await listRubricVersions({ workspaceId: actor.workspaceId, partTypeId }))[0];
  if (!newest && (from === undefined || to === undefined)) throw new AppError("not_found", `${partType.name} has no rubric versions yet.`);
  const after = await versionRubric(actor, partTypeId, to ?? newest.version);
  const before = await versionRubric(actor, partTypeId, from ?? after.basedOnVersion ?? after.version);
  return { from: before.version, to: after.version, diff: diffRubrics(before.rubric, after.rubric, gradingContextOf(partType).labels) };
}

/** Grades sample measurements with a (draft) rubric; stores nothing. */
export async function previewRubric(actor: Actor, partTypeId: string, input: { rubric: unknown; photos: unknown[]; functionalFailures?: FunctionalFailureCounts }) {
  const partType = await requirePartType(actor, partTypeId);
  const context = gradingContextOf(partType);
  const rubric = rubricOrThrow(input.rubric, context.lists);
  const metrics = buildUnitMetrics({ photos: input.photos as PhotoMeasurement[], functionalFailures: input.functionalFailures ?? { critical: 0, major: 0, minor: 0 } });
  return evaluateRubric({ rubric, metrics, defectSeverities: context.severities, labels: context.labels });
}
