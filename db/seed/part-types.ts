import type { Database } from "@/db/client";
import { activityLog, partTypes } from "@/db/schema";
import { PART_TYPE_CATALOGUE } from "@/lib/part-types/starter-catalogue";
import type { seedPeople } from "./people";

type People = Awaited<ReturnType<typeof seedPeople>>;
export type SeededPartTypes = Record<string, Record<string, string>>;

/** The eight invented part types in every demo workspace; returns workspace slug → part slug → id. */
export async function seedPartTypes(database: Database, people: People): Promise<SeededPartTypes> {
  const result: SeededPartTypes = {};
  await database.transaction(async (tx) => {
    for (const [workspaceSlug, ws] of Object.entries(people)) {
      const rows = await tx
        .insert(partTypes)
        .values(PART_TYPE_CATALOGUE.map((p) => ({ ...p, workspaceId: ws.workspaceId })))
        .returning({ id: partTypes.id, slug: partTypes.slug });
      await tx
        .insert(activityLog)
        .values({ workspaceId: ws.workspaceId, actorId: null, action: "part_types.seeded", subjectType: "workspace", subjectId: ws.workspaceId, detail: { demo: true, count: rows.length } });
      result[workspaceSlug] = Object.fromEntries(rows.map((r) => [r.slug, r.id]));
    }
  });
  return result;
}
