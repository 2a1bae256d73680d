/**
 * Issue 19, step 2: the recheck queue, against the test server and its PostgreSQL.
 * - Two auditors taking the next recheck at the same moment get different rechecks.
 * - An auditor never gets their own grade, nor a unit whose inspection data they opened.
 * - Renewing and releasing are the holder's; a released recheck is free again, without its marks.
 */
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { recheckRegionSets, rechecks } from "@/db/schema";
import { createUser, TEST_PASSWORD, uniqueEmail } from "../support/db";
import { api, signIn } from "../support/http";
import { gradedUnit, RECHECK_DEFAULTS, recheckWorld, type Person, type RecheckWorld } from "../support/recheck";

type Next = { recheck: { id: string }; leaseExpiresAt: string };
type ErrorBody = { error: { code: string; message: string } };
const next = (who: Person) => api<Next>(who, "POST", "/api/rechecks/next");
const ALWAYS = { ...RECHECK_DEFAULTS, rate: 1, raisedRate: 1 };

async function person(world: RecheckWorld, roles: ("inspector" | "auditor" | "lead")[]): Promise<Person> {
  const user = await createUser({ workspaceId: world.workspaceId, roles, email: uniqueEmail("rc-both") });
  return { ...(await signIn(user.email, TEST_PASSWORD)), id: user.id };
}

describe("taking the next recheck", () => {
  let world: RecheckWorld;
  beforeAll(async () => {
    world = await recheckWorld(ALWAYS);
  });

  it("two auditors at once get different rechecks; then nothing is left (204)", async () => {
    const units = [await gradedUnit(world, world.inspector), await gradedUnit(world, world.inspector)];
    const waiting = await db().select().from(rechecks).where(eq(rechecks.workspaceId, world.workspaceId));
    expect(waiting.map((r) => r.unitId).sort()).toEqual(units.map((u) => u.unit.id).sort());
    const [a, b] = await Promise.all([next(world.auditor), next(world.auditor2)]);
    expect([a.status, b.status]).toEqual([200, 200]);
    expect(a.body.recheck.id).not.toBe(b.body.recheck.id);
    expect(new Set([a.body.recheck.id, b.body.recheck.id])).toEqual(new Set(waiting.map((r) => r.id)));
    expect((await next(world.auditor)).status).toBe(204);
    expect((await next(world.lead)).status).toBe(204);
    // Renewing is the holder's; the other auditor is refused.
    expect((await api(world.auditor, "PUT", `/api/rechecks/${a.body.recheck.id}/lease`)).status).toBe(200);
    const refused = await api<ErrorBody>(world.auditor2, "PUT", `/api/rechecks/${a.body.recheck.id}/lease`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/Another auditor has this recheck/);
  });

  it("a released recheck is free again and keeps none of the releaser's marks", async () => {
    const own = await recheckWorld(ALWAYS);
    const { photo } = await gradedUnit(own, own.inspector);
    const taken = await next(own.auditor);
    expect(taken.status).toBe(200);
    const saved = await api(own.auditor, "PUT", `/api/rechecks/${taken.body.recheck.id}/regions`, {
      photoId: photo.id,
      baseVersion: 0,
      regions: { regions: [{ id: "mine", defect: "scratch", shape: { kind: "rect", x: 70, y: 70, width: 10, height: 10 } }], surfaces: [], ruler: null },
    });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    expect((await api(own.auditor, "DELETE", `/api/rechecks/${taken.body.recheck.id}/lease`)).status).toBe(204);
    expect(await db().select().from(recheckRegionSets).where(eq(recheckRegionSets.recheckId, taken.body.recheck.id))).toHaveLength(0);
    const again = await next(own.auditor2);
    expect(again.body.recheck.id).toBe(taken.body.recheck.id);
  });
});

describe("who is never offered a recheck", () => {
  it("an auditor who graded the unit never gets it; another auditor does", async () => {
    const world = await recheckWorld(ALWAYS);
    const both = await person(world, ["inspector", "auditor"]);
    await gradedUnit(world, both);
    expect((await next(both)).status).toBe(204);
    const other = await next(world.auditor);
    expect(other.status).toBe(200);
  });

  it("a person who opened the unit's inspection data never gets it", async () => {
    const world = await recheckWorld(ALWAYS);
    const both = await person(world, ["inspector", "auditor"]);
    const { unit } = await gradedUnit(world, world.inspector);
    expect((await api(both, "GET", `/api/units/${unit.id}/grades`)).status).toBe(200);
    expect((await next(both)).status).toBe(204);
    expect((await next(world.auditor)).status).toBe(200);
  });
});
