import "server-only";
/**
 * Adds starter part types to a workspace (at sign-up, or later from an empty Part types screen):
 * each with its views, zones, defect classes and functional checklist, and its example rubric as
 * a **draft** version 1, marked in its notes as an example to adapt. A draft grades nothing: a
 * lead reviews the thresholds against the company's contracts and publishes it. Starters whose
 * slug or name the workspace already has are skipped, so adding them twice adds nothing.
 */
import type { DbOrTx } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { insertPartType, listPartTypesNamed } from "@/db/queries/part-types";
import { insertRubricVersion } from "@/db/queries/rubrics";
import { EXAMPLE_RUBRICS } from "@/lib/grading/example-rubrics";
import { gradingContextOf } from "@/lib/grading/part-type-context";
import { parseRubric } from "@/lib/grading/rubric-schema";
import { PART_TYPE_CATALOGUE } from "./starter-catalogue";

export const STARTER_SLUGS = PART_TYPE_CATALOGUE.map((p) => p.slug);
export type StarterSlug = (typeof STARTER_SLUGS)[number];

/** What the sign-up form and the Part types screen list. */
export const STARTER_CHOICES = PART_TYPE_CATALOGUE.map((p) => ({ slug: p.slug, name: p.name, category: p.category, views: p.views.length, checklist: p.checklist.length }));

export async function addStarterPartTypes(tx: DbOrTx, input: { workspaceId: string; actorId: string; slugs: readonly string[] }) {
  const wanted = PART_TYPE_CATALOGUE.filter((p) => input.slugs.includes(p.slug));
  if (wanted.length === 0) return [];
  const existing = await listPartTypesNamed(tx, { workspaceId: input.workspaceId, slugs: wanted.map((p) => p.slug), names: wanted.map((p) => p.name) });
  const taken = new Set(existing.flatMap((e) => [e.slug, e.name.toLowerCase()]));
  const created: { id: string; slug: string; name: string }[] = [];
  for (const starter of wanted) {
    if (taken.has(starter.slug) || taken.has(starter.name.toLowerCase())) continue;
    // The demo's model family is invented: a company names its own.
    const row = await insertPartType(tx, { ...starter, modelFamily: "", workspaceId: input.workspaceId });
    // The example must fit its part type; a mismatch is a bug in the catalogue, so fail loudly.
    const parsed = parseRubric(EXAMPLE_RUBRICS[starter.slug], gradingContextOf(row).lists);
    if (!parsed.ok) throw new Error(`The example rubric for "${starter.slug}" does not fit its starter part type: ${parsed.errors.join(" ")}`);
    await insertRubricVersion(tx, { workspaceId: input.workspaceId, partTypeId: row.id, version: 1, rubric: parsed.rubric, basedOnVersion: null, actorId: input.actorId, status: "draft" });
    created.push({ id: row.id, slug: row.slug, name: row.name });
  }
  if (created.length > 0) {
    await logActivity(tx, {
      workspaceId: input.workspaceId,
      actorId: input.actorId,
      action: "part_types.starters_added",
      subjectType: "workspace",
      subjectId: input.workspaceId,
      detail: { slugs: created.map((c) => c.slug), rubrics: "draft examples" },
    });
  }
  return created;
}
