import { inArray, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db, pool } from "@/db/client";
import { units } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/require-user";
import { claimNextUnit } from "@/lib/queue/queue";
import { createUser, createWorkspace } from "../support/db";
import { createLotWithUnits, createPartTypeAndSupplier } from "../support/lot-fixtures";

// Direct calls into lib/queue against the real PostgreSQL: this is about the database's locking.
const UNITS = 10_000;
const CLAIMERS = 50;

let inspectors: SessionUser[];
let lotId: string;

beforeAll(async () => {
  const ws = await createWorkspace();
  const lead = await createUser({ workspaceId: ws.id, roles: ["lead"] });
  inspectors = [];
  for (let i = 0; i < CLAIMERS; i++) {
    const u = await createUser({ workspaceId: ws.id, roles: ["inspector"], password: null });
    inspectors.push({ id: u.id, workspaceId: ws.id, workspaceName: ws.name, timeZone: "UTC", email: u.email, name: u.name, roles: ["inspector"] });
  }
  const { partType, supplier } = await createPartTypeAndSupplier(ws.id);
  lotId = (await createLotWithUnits({ workspaceId: ws.id, createdBy: lead.id, count: UNITS, partTypeId: partType.id, supplierId: supplier.id })).id;
}, 120_000);

describe(`${CLAIMERS} concurrent claimers over ${UNITS} queued units`, () => {
  it("claim every unit exactly once, lose none, and then get nothing", async () => {
    const claimedBy = new Map<string, string[]>();
    let emptyAnswers = 0;
    await Promise.all(
      inspectors.map(async (inspector) => {
        for (;;) {
          const unit = await claimNextUnit({ user: inspector, filters: { lotId } });
          if (!unit) {
            emptyAnswers++;
            return;
          }
          claimedBy.set(unit.id, [...(claimedBy.get(unit.id) ?? []), inspector.id]);
        }
      }),
    );
    const duplicates = [...claimedBy.values()].filter((who) => who.length > 1);
    expect(duplicates).toEqual([]);
    expect(claimedBy.size).toBe(UNITS);
    expect(emptyAnswers).toBe(CLAIMERS);
    const { rows } = await db().execute<{ status: string; n: number; holders: number }>(
      sql`SELECT status, count(*)::int AS n, count(DISTINCT lease_holder_id)::int AS holders FROM units WHERE lot_id = ${lotId} GROUP BY status`,
    );
    expect(rows).toEqual([{ status: "on_bench", n: UNITS, holders: CLAIMERS }]);
  }, 300_000);

  it("an expired lease makes its unit claimable again, to exactly one claimer", async () => {
    const expired = (
      await db()
        .select({ id: units.id })
        .from(units)
        .where(sql`${units.lotId} = ${lotId}`)
        .limit(25)
    ).map((r) => r.id);
    await db()
      .update(units)
      .set({ leaseExpiresAt: sql`now() - interval '1 second'` })
      .where(inArray(units.id, expired));
    const results = await Promise.all(inspectors.map((inspector) => claimNextUnit({ user: inspector, filters: { lotId } })));
    const got = results.filter((r) => r !== null).map((r) => r!.id);
    expect(got.sort()).toEqual([...expired].sort());
    expect(new Set(got).size).toBe(expired.length);
    // Everyone else got nothing: the other 9 975 leases are still running.
    expect(results.filter((r) => r === null)).toHaveLength(CLAIMERS - expired.length);
  }, 120_000);

  it("a unit whose lease ran out keeps its place: it is taken before a less urgent waiting unit", async () => {
    const [inspector] = inspectors;
    const { partType, supplier } = await createPartTypeAndSupplier(inspector.workspaceId);
    const urgent = await createLotWithUnits({ workspaceId: inspector.workspaceId, createdBy: inspector.id, count: 1, dueOn: "2026-12-03", partTypeId: partType.id, supplierId: supplier.id });
    const later = await createLotWithUnits({ workspaceId: inspector.workspaceId, createdBy: inspector.id, count: 1, dueOn: "2026-12-09", partTypeId: partType.id, supplierId: supplier.id });
    const filters = { partTypeId: partType.id };
    const first = await claimNextUnit({ user: inspector, filters });
    expect(first?.lotId).toBe(urgent.id);
    await db()
      .update(units)
      .set({ leaseExpiresAt: sql`now() - interval '1 second'` })
      .where(inArray(units.id, [first!.id]));
    const again = await claimNextUnit({ user: inspectors[1], filters });
    expect(again?.id).toBe(first!.id); // not the waiting unit of the lot due later
    expect((await claimNextUnit({ user: inspectors[2], filters }))?.lotId).toBe(later.id);
  });

  // Take next answers "nothing" only when nothing is waiting. A unit that another transaction
  // holds locked is skipped by the claim, but it is still waiting: the claim must look again,
  // whether the unit is queued or its lease has run out (two different probes in anythingWaiting).
  it.each([
    ["queued", sql`status = 'queued'`],
    ["with an expired lease", sql`status = 'on_bench', lease_holder_id = NULL, claimed_at = now() - interval '30 minutes', lease_expires_at = now() - interval '1 minute'`],
  ])("a waiting unit %s that another transaction holds locked is still handed out once the lock goes", async (_label, state) => {
    const [inspector] = inspectors;
    const { partType, supplier } = await createPartTypeAndSupplier(inspector.workspaceId);
    const lot = await createLotWithUnits({ workspaceId: inspector.workspaceId, createdBy: inspector.id, count: 1, partTypeId: partType.id, supplierId: supplier.id });
    await db().execute(sql`UPDATE units SET ${state} WHERE lot_id = ${lot.id}`);
    const holder = await pool().connect();
    try {
      await holder.query("BEGIN");
      await holder.query("SELECT id FROM units WHERE lot_id = $1 FOR UPDATE", [lot.id]);
      const claim = claimNextUnit({ user: inspectors[3], filters: { lotId: lot.id } });
      await new Promise((r) => setTimeout(r, 100));
      await holder.query("ROLLBACK");
      const unit = await claim;
      expect(unit?.lotId).toBe(lot.id);
    } finally {
      holder.release();
    }
  });
});
