/**
 * The demo's calibration set: six published gallery examples (db/seed/gallery.ts, whose key
 * regions are the planted defects), assigned to two demo inspectors. One took it carefully and
 * passed (the planted regions and the examples' grades); the other graded everything A without
 * marking anything and failed. Made through the app's own steps (lib/calibration). Invented data,
 * demo only.
 */
import { and, asc, eq, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { listKeyedSetItems } from "@/db/queries/calibration";
import { galleryItems, users, workspaces } from "@/db/schema";
import { listMyAssignments, openAttempt, saveItemAnswer, submitAttempt } from "@/lib/calibration/attempts";
import { DEFAULT_CALIBRATION_THRESHOLDS } from "@/lib/calibration/schemas";
import { assignSet, createSet } from "@/lib/calibration/sets";

const SET_NAME = "Demo calibration: cameras and housings";
const ITEMS = 6;

const withRole = (workspaceId: string, role: string) =>
  db()
    .select({ id: users.id, workspaceId: users.workspaceId })
    .from(users)
    .where(and(eq(users.workspaceId, workspaceId), eq(users.active, true), sql`${role} = ANY(${users.roles})`))
    .orderBy(sql`cardinality(${users.roles})`, asc(users.email));

export async function seedCalibration({ workspaceSlug = "vellmoor" }: { workspaceSlug?: string } = {}): Promise<{ sets: number; attempts: number }> {
  const [ws] = await db().select({ id: workspaces.id }).from(workspaces).where(eq(workspaces.slug, workspaceSlug));
  if (!ws) return { sets: 0, attempts: 0 };
  const [trainer] = await withRole(ws.id, "trainer");
  const inspectors = (await withRole(ws.id, "inspector")).slice(0, 2);
  const items = await db()
    .select({ id: galleryItems.id })
    .from(galleryItems)
    .where(and(eq(galleryItems.workspaceId, ws.id), eq(galleryItems.status, "published")))
    .orderBy(asc(galleryItems.createdAt), asc(galleryItems.id))
    .limit(ITEMS);
  if (!trainer || inspectors.length < 2 || items.length < ITEMS) return { sets: 0, attempts: 0 };

  const set = await createSet(trainer, { name: SET_NAME, itemIds: items.map((i) => i.id), thresholds: DEFAULT_CALIBRATION_THRESHOLDS });
  const due = new Date(Date.now() + 14 * 86_400_000).toISOString().slice(0, 10);
  await assignSet(trainer, set.id, { userIds: inspectors.map((i) => i.id), dueOn: due });
  const keyed = await listKeyedSetItems({ workspaceId: ws.id, setId: set.id });

  for (const [index, inspector] of inspectors.entries()) {
    const careful = index === 0;
    const assignment = (await listMyAssignments(inspector)).find((a) => a.setName === SET_NAME)!;
    const { attemptId } = await openAttempt(inspector, assignment.id);
    for (const item of keyed) {
      const regions = careful ? { ...item.keyRegions, surfaces: [] } : { regions: [], surfaces: [], ruler: null };
      await saveItemAnswer(inspector, attemptId, item.position, { grade: careful ? item.keyGrade : "A", regions });
    }
    await submitAttempt(inspector, attemptId, { scoreInline: true });
  }
  console.log(`Demo calibration: "${SET_NAME}" (${ITEMS} items) assigned to two inspectors, one passing and one failing attempt.`);
  return { sets: 1, attempts: inspectors.length };
}
