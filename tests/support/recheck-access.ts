/**
 * Fixture ids for the recheck routes in the access matrix: a graded unit of the lead's workspace
 * with a recheck waiting (graded by an inspector made here, so neither a lead nor an auditor of
 * the matrix is its grader), held by nobody.
 */
import { db } from "@/db/client";
import { firstGradeFacts } from "@/db/queries/rechecks";
import { grades, rechecks } from "@/db/schema";
import { createUser } from "./db";
import { createMeasurableUnit } from "./grading";
import { api, type Session } from "./http";

export async function recheckFixtureIds(lead: Session): Promise<Record<string, string>> {
  const me = await api<{ user: { id: string; workspaceId: string } }>(lead, "GET", "/api/me");
  const { id: leadId, workspaceId } = me.body.user;
  const grader = await createUser({ workspaceId, roles: ["inspector"] });
  const { unit, v1, photo, partType } = await createMeasurableUnit({ workspaceId, userId: grader.id });
  const [grade] = await db()
    .insert(grades)
    .values({
      workspaceId,
      unitId: unit.id,
      kind: "inspection",
      proposedGrade: "A",
      finalGrade: "A",
      rubricVersionId: v1.id,
      measurementIds: [],
      explanation: { lines: [], notes: [] },
      regionsVersions: {},
      gradedBy: grader.id,
    })
    .returning();
  const [recheck] = await db()
    .insert(rechecks)
    .values({
      workspaceId,
      unitId: unit.id,
      gradeId: grade.id,
      firstGraderId: grader.id,
      ...firstGradeFacts(grade.id),
      partTypeId: partType.id,
      rubricVersionId: v1.id,
      reason: "by_hand",
      sentBy: leadId,
    })
    .returning();
  return { recheckId: recheck.id, recheckPhotoId: photo.id };
}
