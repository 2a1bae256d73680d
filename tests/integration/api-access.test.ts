import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { holders } from "@/lib/auth/permissions";
import { ROLES, type Role } from "@/lib/auth/roles";
import { api, signIn, type Session } from "../support/http";
import { createUser, TEST_PASSWORD, uniqueEmail, workspaceBySlug } from "../support/db";
import { calibrationFixtureIds } from "../support/calibration-access";
import { certificateFixtureIds } from "../support/certificate-access";
import { evidenceFixtureIds } from "../support/evidence-access";
import { galleryFixtureIds } from "../support/gallery-access";
import { gradingFixtureIds } from "../support/grading-access";
import { lotFixtureIds } from "../support/lot-access";
import { photoFixtureIds } from "../support/photo-access";
import { queueFixtureIds } from "../support/queue-access";
import { recheckFixtureIds } from "../support/recheck-access";
import { regionFixtureIds } from "../support/region-access";
import { suggestionFixtureIds, waitForTrainingsToFinish } from "../support/suggestion-access";
import { ROUTES, type RouteRow } from "./routes";

type Ids = Record<string, string>;
let own: Ids;
let foreign: Ids;
const sessions = {} as Record<Role, Session>;
let foreignLead: Session;

function fill(route: RouteRow, ids: Ids) {
  return route.path.replace(/:([a-zA-Z]+)/g, (_, key: string) => {
    if (!ids[key]) throw new Error(`No fixture id for :${key}`);
    return ids[key];
  });
}

async function fixtureIds(lead: Session): Promise<Ids> {
  const invited = await api<{ person: { id: string } }>(lead, "POST", "/api/people", { email: uniqueEmail("fixture-invite"), name: "Fixture Invitee", roles: ["inspector"] });
  const supplier = await api<{ supplier: { id: string } }>(lead, "POST", "/api/suppliers", { name: `Fixture Supplier ${Date.now()}-${Math.random()}`, contactEmail: "fixture@supplier.example" });
  const emails = await api<{ emails: { id: string }[] }>(lead, "GET", "/api/outbox");
  const people = await api<{ people: { id: string; roles: string[] }[] }>(lead, "GET", "/api/people");
  const someone = people.body.people.find((p) => !p.roles.includes("lead"))!;
  const grading = await gradingFixtureIds(lead);
  const ids: Ids = {
    invitedPersonId: invited.body.person.id,
    personId: someone.id,
    supplierId: supplier.body.supplier.id,
    emailId: emails.body.emails[0].id,
    ...grading,
    ...(await certificateFixtureIds(lead, grading.unitId)),
    ...(await galleryFixtureIds(lead)),
    ...(await calibrationFixtureIds(lead)),
    ...(await queueFixtureIds(lead)),
    ...(await recheckFixtureIds(lead)),
    ...(await photoFixtureIds(lead)),
    ...(await regionFixtureIds(lead)),
    ...(await suggestionFixtureIds(lead)),
    ...(await lotFixtureIds(lead, supplier.body.supplier.id)),
  };
  return { ...ids, ...(await evidenceFixtureIds(lead, { lotId: ids.lotId, supplierId: ids.supplierId })) };
}

beforeAll(async () => {
  // One single-role account per role in the demo workspace, created for this test.
  const vellmoor = await workspaceBySlug("vellmoor");
  for (const role of ROLES) {
    const user = await createUser({ workspaceId: vellmoor.id, roles: [role], email: uniqueEmail(`access-${role}`) });
    sessions[role] = await signIn(user.email, TEST_PASSWORD);
  }
  foreignLead = await signIn("lead@quillfen.example");
  own = await fixtureIds(sessions.lead);
  foreign = await fixtureIds(foreignLead);
});

// The matrix asks for trainings; they must not finish under the next file's feet.
afterAll(() => waitForTrainingsToFinish(), 300_000);

describe.each(ROUTES.map((r) => [`${r.method} ${r.path}`, r] as const))("%s", (_name, route) => {
  const body = () => route.body?.(own);

  if (route.permission === "public") {
    it(`answers anyone (${route.allowedStatus})`, async () => {
      const res = await api(null, route.method, fill(route, own ?? {}), body());
      expect([route.allowedStatus].flat()).toContain(res.status);
    });
    return;
  }

  it("401 with a readable JSON message without a session", async () => {
    const res = await api<{ error: { code: string; message: string } }>(null, route.method, fill(route, own), body());
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe("unauthorized");
    expect(res.body.error.message).toMatch(/sign in/i);
  });

  const allowed = holders(route.permission);
  const denied = ROLES.filter((r) => !allowed.includes(r));

  for (const role of denied) {
    it(`403 for ${role}`, async () => {
      const res = await api<{ error: { code: string; message: string } }>(sessions[role], route.method, fill(route, own), body());
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe("forbidden");
      expect(res.body.error.message).toMatch(/role/);
    });
  }

  for (const role of allowed) {
    it(`${route.allowedStatus} for ${role}`, async () => {
      const res = await api(sessions[role], route.method, fill(route, own), body());
      expect([route.allowedStatus].flat(), JSON.stringify(res.body)).toContain(res.status);
    });
  }

  if (route.path.includes(":")) {
    it("404 for another workspace's id, exactly as for a missing one", async () => {
      const caller = sessions[allowed.includes("lead") ? "lead" : allowed[0]];
      const fromOther = await api<{ error: { code: string; message: string } }>(caller, route.method, fill(route, foreign), body());
      const missingIds = Object.fromEntries(Object.keys(own).map((k) => [k, "00000000-0000-4000-8000-000000000000"]));
      const missing = await api<{ error: { code: string; message: string } }>(caller, route.method, fill(route, missingIds), body());
      expect(fromOther.status).toBe(404);
      expect(missing.status).toBe(404);
      expect(fromOther.body).toEqual(missing.body);
    });
  }
});
