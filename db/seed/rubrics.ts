/**
 * Example rubrics as published version 1 of every seeded part type whose slug has one
 * (lib/grading/example-rubrics.ts — invented examples to adapt, and marked as such in their
 * notes). Runs after the part types are seeded; part types that already have a rubric version
 * are left alone, so running it twice adds nothing.
 */
import { and, eq, sql } from "drizzle-orm";
import type { Database } from "@/db/client";
import { activityLog, partTypes, rubricVersions, users } from "@/db/schema";
import { EXAMPLE_PART_TYPE_SLUGS, type ExamplePartTypeSlug } from "@/lib/grading/example-part-types";
import { EXAMPLE_RUBRICS } from "@/lib/grading/example-rubrics";
import { gradingContextOf } from "@/lib/grading/part-type-context";
import { parseRubric } from "@/lib/grading/rubric-schema";

const isExampleSlug = (slug: string): slug is ExamplePartTypeSlug => (EXAMPLE_PART_TYPE_SLUGS as readonly string[]).includes(slug);

export async function seedRubrics(database: Database) {
  const seeded: { workspaceId: string; slug: string; rubricVersionId: string }[] = [];
  await database.transaction(async (tx) => {
    const rows = await tx
      .select({ id: partTypes.id, workspaceId: partTypes.workspaceId, slug: partTypes.slug, name: partTypes.name, views: partTypes.views, defectClasses: partTypes.defectClasses })
      .from(partTypes)
      .where(sql`NOT EXISTS (SELECT 1 FROM ${rubricVersions} WHERE ${rubricVersions.partTypeId} = ${partTypes.id})`);
    for (const partType of rows) {
      if (!isExampleSlug(partType.slug)) continue;
      // The example must fit the seeded part type; a mismatch is a bug in the seed, so fail loudly.
      const parsed = parseRubric(EXAMPLE_RUBRICS[partType.slug], gradingContextOf(partType).lists);
      if (!parsed.ok) throw new Error(`The example rubric for "${partType.slug}" does not fit the seeded part type: ${parsed.errors.join(" ")}`);
      const [lead] = await tx
        .select({ id: users.id })
        .from(users)
        .where(and(eq(users.workspaceId, partType.workspaceId), sql`'lead' = ANY(${users.roles})`))
        .orderBy(users.createdAt)
        .limit(1);
      const [row] = await tx
        .insert(rubricVersions)
        .values({
          workspaceId: partType.workspaceId,
          partTypeId: partType.id,
          version: 1,
          status: "published",
          rubric: parsed.rubric,
          createdBy: lead?.id ?? null,
          updatedBy: lead?.id ?? null,
          publishedBy: lead?.id ?? null,
          publishedAt: new Date(),
        })
        .returning({ id: rubricVersions.id });
      await tx.insert(activityLog).values({
        workspaceId: partType.workspaceId,
        actorId: null,
        action: "rubric.seeded",
        subjectType: "part_type",
        subjectId: partType.id,
        detail: { version: 1, example: true, partType: partType.name },
      });
      seeded.push({ workspaceId: partType.workspaceId, slug: partType.slug, rubricVersionId: row.id });
    }
  });
  return seeded;
}
