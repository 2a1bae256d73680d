/** Fixture ids for the grading routes in the access matrix (tests/integration/routes.ts). */
import { api, type Session } from "./http";
import { createMeasurableUnit, createPartType, insertRubricVersion, workspaceIdOf } from "./grading";

export async function gradingFixtureIds(lead: Session): Promise<Record<string, string>> {
  const owner = await workspaceIdOf(lead.email);
  const { partType, unit } = await createMeasurableUnit(owner, { draft: true });
  const toPublish = await createPartType(owner.workspaceId);
  await insertRubricVersion({ workspaceId: owner.workspaceId, partTypeId: toPublish.id, version: 1, status: "published", actorId: owner.userId });
  await insertRubricVersion({ workspaceId: owner.workspaceId, partTypeId: toPublish.id, version: 2, status: "draft", actorId: owner.userId });
  const measured = await api(lead, "POST", `/api/units/${unit.id}/measure`);
  if (measured.status !== 200) throw new Error(`Fixture measure failed: ${JSON.stringify(measured.body)}`);
  const graded = await api(lead, "POST", `/api/units/${unit.id}/grades`, { decision: "accept" });
  if (graded.status !== 201) throw new Error(`Fixture grade failed: ${JSON.stringify(graded.body)}`);
  return { partTypeId: partType.id, publishPartTypeId: toPublish.id, unitId: unit.id };
}
