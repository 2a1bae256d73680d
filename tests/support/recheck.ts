/**
 * A workspace of its own for recheck tests (its settings and draws touch nobody else's): a lead,
 * two inspectors, two auditors, and units graded through the real API (measure, then accept).
 */
import { expect } from "vitest";
import { createUser, createWorkspace, TEST_PASSWORD, uniqueEmail } from "./db";
import { createMeasurableUnit, type FixtureRegion } from "./grading";
import { api, signIn, type Session } from "./http";
import type { Role } from "@/lib/auth/roles";

export type Person = Session & { id: string };
export type RecheckWorld = { workspaceId: string; lead: Person; inspector: Person; inspector2: Person; auditor: Person; auditor2: Person };

export async function recheckWorld(settings?: Record<string, unknown>): Promise<RecheckWorld> {
  const workspace = await createWorkspace();
  const make = async (roles: Role[], prefix: string): Promise<Person> => {
    const user = await createUser({ workspaceId: workspace.id, roles, email: uniqueEmail(prefix) });
    return { ...(await signIn(user.email, TEST_PASSWORD)), id: user.id };
  };
  const [lead, inspector, inspector2, auditor, auditor2] = await Promise.all([
    make(["lead"], "rc-lead"),
    make(["inspector"], "rc-insp"),
    make(["inspector"], "rc-insp2"),
    make(["auditor"], "rc-aud"),
    make(["auditor"], "rc-aud2"),
  ]);
  const world = { workspaceId: workspace.id, lead, inspector, inspector2, auditor, auditor2 };
  if (settings) {
    const res = await api(lead, "PUT", "/api/workspace/recheck-settings", settings);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
  }
  return world;
}

export const RECHECK_DEFAULTS = {
  rate: 0.05,
  raisedRate: 0.2,
  minimumPerGrader: 1,
  iouThreshold: 0.5,
  meaningfulShare: 0.0005,
  meaningfulPx: 100,
  driftAgreement: 0.8,
  driftWeeks: 4,
  driftMinRechecks: 5,
};

/**
 * A unit graded by `grader` through the API (measured, proposal accepted). The rows around it
 * (rubric, photo, regions) are the lead's: the grader's name then appears only where the grade's
 * does, which is what the blindness test looks for.
 */
export async function gradedUnit(world: RecheckWorld, grader: Person, options: { regions?: FixtureRegion[] } = {}) {
  const made = await createMeasurableUnit({ workspaceId: world.workspaceId, userId: world.lead.id }, options);
  const measured = await api(grader, "POST", `/api/units/${made.unit.id}/measure`);
  expect(measured.status, JSON.stringify(measured.body)).toBe(200);
  const graded = await api<{ grade: { id: string; finalGrade: string } }>(grader, "POST", `/api/units/${made.unit.id}/grades`, { decision: "accept" });
  expect(graded.status, JSON.stringify(graded.body)).toBe(201);
  return { ...made, grade: graded.body.grade };
}
