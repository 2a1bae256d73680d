import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { ROLES, type Role } from "@/lib/auth/roles";
import { api, signIn, type Session } from "../support/http";
import { createUser, TEST_PASSWORD, uniqueEmail, workspaceBySlug } from "../support/db";
import { galleryFixtureIds } from "../support/gallery-access";
import { gradingFixtureIds } from "../support/grading-access";
import { lotFixtureIds } from "../support/lot-access";
import { photoFixtureIds } from "../support/photo-access";
import { queueFixtureIds } from "../support/queue-access";
import { regionFixtureIds } from "../support/region-access";
import { NOT_IN_TABLE, ROUTES, type RouteAccess } from "./routes";

/** Every route.ts under app/api with the HTTP methods it exports, as "/api/x/[id]" paths. */
function discoverRoutes(): { path: string; method: string }[] {
  const root = path.resolve("app/api");
  const found: { path: string; method: string }[] = [];
  const walk = (dir: string) => {
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else if (entry.name === "route.ts") {
        const source = fs.readFileSync(full, "utf8");
        const routePath = "/api/" + path.relative(root, dir).split(path.sep).join("/");
        const methods = new Set([...source.matchAll(/export (?:const|async function) (GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => m[1]));
        for (const m of source.matchAll(/export \{([^}]+)\}/g)) for (const name of m[1].matchAll(/as (GET|POST|PUT|PATCH|DELETE)/g)) methods.add(name[1]);
        for (const method of methods) found.push({ path: routePath.replace(/\/$/, ""), method });
      }
    }
  };
  walk(root);
  return found;
}

// A query string is not part of the route (GET /api/inspection-schemes?supplierId=…).
const asTemplate = (p: string) => p.split("?")[0].replace(/:[a-zA-Z]+/g, "[id]");

type Ids = Record<string, string>;
let own: Ids;
let foreign: Ids;
const sessions = {} as Record<Role, Session>;
let foreignLead: Session;

function fill(route: RouteAccess, ids: Ids) {
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
  return { invitedPersonId: invited.body.person.id, personId: someone.id, supplierId: supplier.body.supplier.id, emailId: emails.body.emails[0].id, ...(await gradingFixtureIds(lead)), ...(await galleryFixtureIds(lead)), ...(await queueFixtureIds(lead)), ...(await photoFixtureIds(lead)), ...(await regionFixtureIds(lead)), ...(await lotFixtureIds(lead, supplier.body.supplier.id)) };
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

describe("the route table", () => {
  it("lists every route handler and method in app/api", () => {
    const listed = new Set(ROUTES.map((r) => `${r.method} ${asTemplate(r.path)}`));
    const missing = discoverRoutes()
      .filter((r) => !NOT_IN_TABLE.includes(r.path))
      .map((r) => `${r.method} ${r.path}`)
      .filter((key) => !listed.has(key));
    expect(missing).toEqual([]);
  });
});

describe.each(ROUTES.map((r) => [`${r.method} ${r.path}`, r] as const))("%s", (_name, route) => {
  const body = () => route.body?.(own);

  if (route.access === "public") {
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

  const allowed = route.access === "signed-in" ? [...ROLES] : ROLES.filter((r) => r === "lead" || (route.access as Role[]).includes(r));
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
