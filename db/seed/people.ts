import type { Database } from "@/db/client";
import { activityLog, suppliers, users, workspaces } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { DEMO_PASSWORD, DEMO_WORKSPACES } from "./demo-data";

/** Workspaces, accounts and suppliers of the demo; returns the ids later seed steps build on. */
export async function seedPeople(database: Database) {
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const result: Record<string, { workspaceId: string; userIds: Record<string, string>; supplierIds: Record<string, string> }> = {};
  await database.transaction(async (tx) => {
    for (const ws of DEMO_WORKSPACES) {
      const [workspace] = await tx.insert(workspaces).values({ name: ws.name, slug: ws.slug }).returning();
      const people = await tx
        .insert(users)
        .values(ws.people.map((p) => ({ ...p, workspaceId: workspace.id, passwordHash })))
        .returning({ id: users.id, email: users.email });
      const sups = await tx
        .insert(suppliers)
        .values(ws.suppliers.map((s) => ({ ...s, workspaceId: workspace.id })))
        .returning({ id: suppliers.id, name: suppliers.name });
      await tx.insert(activityLog).values({ workspaceId: workspace.id, actorId: null, action: "workspace.seeded", subjectType: "workspace", subjectId: workspace.id, detail: { demo: true } });
      result[ws.slug] = {
        workspaceId: workspace.id,
        userIds: Object.fromEntries(people.map((p) => [p.email, p.id])),
        supplierIds: Object.fromEntries(sups.map((s) => [s.name, s.id])),
      };
    }
  });
  return result;
}
