/**
 * Fixture ids for the Calibration routes in the access matrix (tests/integration/routes.ts): five
 * published items, a set of them assigned to the lead (leads hold `calibration.take` too) and the
 * lead's attempt, started. Another taker meets that attempt as a missing one (404).
 */
import { createAssignedSet, createCalibrationItems } from "./calibration";
import { workspaceIdOf } from "./grading";
import { api, type Session } from "./http";

export async function calibrationFixtureIds(lead: Session): Promise<Record<string, string>> {
  const { owner, published } = await createCalibrationItems(lead);
  const { setId } = await createAssignedSet(
    lead,
    published.map((p) => p.id),
    (await workspaceIdOf(lead.email)).userId,
  );
  const mine = await api<{ assignments: { id: string; setName: string }[] }>(lead, "GET", "/api/calibration/assignments");
  const listed = await api<{ sets: { id: string; name: string }[] }>(lead, "GET", "/api/calibration/sets");
  const name = listed.body.sets.find((s) => s.id === setId)!.name;
  const assignmentId = mine.body.assignments.find((a) => a.setName === name)!.id;
  const opened = await api<{ attemptId: string }>(lead, "POST", `/api/calibration/assignments/${assignmentId}/attempt`);
  if (opened.status !== 200) throw new Error(`Fixture attempt failed: ${JSON.stringify(opened.body)}`);
  return {
    calibrationSetId: setId,
    calibrationAssignmentId: assignmentId,
    calibrationAttemptId: opened.body.attemptId,
    calibrationItemIds: published.map((p) => p.id).join(","),
    calibrationTakerId: owner.userId,
  };
}
