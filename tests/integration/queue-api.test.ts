import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { lots, units } from "@/db/schema";
import { api, trySignIn, type Session } from "../support/http";
import { createUser, createWorkspace, TEST_PASSWORD } from "../support/db";
import { createLotWithUnits, createPartTypeAndSupplier } from "../support/lot-fixtures";

let a: Session, b: Session, lead: Session, auditor: Session;
let aId: string, bId: string;
let early: { id: string }, late: { id: string };
let partTypeId: string, otherPartTypeId: string;

async function session(email: string) {
  const { session } = await trySignIn(email, TEST_PASSWORD);
  if (!session) throw new Error(`sign-in failed for ${email}`);
  return session;
}

beforeAll(async () => {
  const ws = await createWorkspace();
  const [ua, ub, ul, uaud] = [
    await createUser({ workspaceId: ws.id, roles: ["inspector"] }),
    await createUser({ workspaceId: ws.id, roles: ["inspector"] }),
    await createUser({ workspaceId: ws.id, roles: ["lead"] }),
    await createUser({ workspaceId: ws.id, roles: ["auditor"] }),
  ];
  [aId, bId] = [ua.id, ub.id];
  [a, b, lead, auditor] = [await session(ua.email), await session(ub.email), await session(ul.email), await session(uaud.email)];
  const first = await createPartTypeAndSupplier(ws.id);
  const second = await createPartTypeAndSupplier(ws.id);
  partTypeId = first.partType.id;
  otherPartTypeId = second.partType.id;
  // The later-due lot is created first: ordering must follow the due date, not creation.
  late = await createLotWithUnits({ workspaceId: ws.id, createdBy: ul.id, count: 3, dueOn: "2026-12-30", partTypeId, supplierId: first.supplier.id });
  early = await createLotWithUnits({ workspaceId: ws.id, createdBy: ul.id, count: 2, dueOn: "2026-12-10", partTypeId: otherPartTypeId, supplierId: second.supplier.id });
});

type Claim = { unit: { id: string; lotId: string; sampleIndex: number }; leaseExpiresAt: string };

describe("Take next", () => {
  it("gives the earliest-due lot's units first, in sample order, with a lease", async () => {
    const first = await api<Claim>(a, "POST", "/api/queue/next");
    expect(first.status).toBe(200);
    expect(first.body.unit).toMatchObject({ lotId: early.id, sampleIndex: 1 });
    expect(new Date(first.body.leaseExpiresAt).getTime()).toBeGreaterThan(Date.now() + 60_000);
    const second = await api<Claim>(b, "POST", "/api/queue/next", {});
    expect(second.body.unit).toMatchObject({ lotId: early.id, sampleIndex: 2 });
  });

  it("applies filters, and answers 204 when nothing matching is waiting", async () => {
    expect((await api(a, "POST", "/api/queue/next", { partTypeId: otherPartTypeId })).status).toBe(204);
    const filtered = await api<Claim>(a, "POST", "/api/queue/next", { partTypeId });
    expect(filtered.body.unit.lotId).toBe(late.id);
  });

  it("the list shows who has which unit since when, and pages by cursor", async () => {
    const page1 = await api<{ units: { id: string; holder: { id: string; name: string; since: string } | null }[]; nextCursor: string }>(lead, "GET", "/api/queue?limit=2");
    expect(page1.status).toBe(200);
    expect(page1.body.units).toHaveLength(2);
    expect(page1.body.units.map((u) => u.holder?.id)).toEqual([aId, bId]);
    const page2 = await api<{ units: { id: string }[]; nextCursor: string | null }>(lead, "GET", `/api/queue?limit=2&cursor=${page1.body.nextCursor}`);
    const page3 = await api<{ units: { id: string }[]; nextCursor: string | null }>(lead, "GET", `/api/queue?limit=2&cursor=${page2.body.nextCursor}`);
    const all = [...page1.body.units, ...page2.body.units, ...page3.body.units].map((u) => u.id);
    expect(new Set(all).size).toBe(5);
    expect(page3.body.nextCursor).toBeNull();
  });

  it("pages back with `before`: Previous gives the same units as the page that led there", async () => {
    type Page = { units: { id: string }[]; nextCursor: string | null; prevCursor: string | null };
    const ids = (p: { body: Page }) => p.body.units.map((u) => u.id);
    const page1 = await api<Page>(lead, "GET", "/api/queue?limit=2");
    expect(page1.body.prevCursor).toBeNull();
    const page2 = await api<Page>(lead, "GET", `/api/queue?limit=2&cursor=${page1.body.nextCursor}`);
    const page3 = await api<Page>(lead, "GET", `/api/queue?limit=2&cursor=${page2.body.nextCursor}`);
    expect(ids(page3)).toHaveLength(1);
    // From page 3 back to page 2, then to page 1: the same units in the same order, and the
    // cursors say what lies on either side.
    const back2 = await api<Page>(lead, "GET", `/api/queue?limit=2&before=${page3.body.prevCursor}`);
    expect(back2.status).toBe(200);
    expect(ids(back2)).toEqual(ids(page2));
    expect(back2.body.prevCursor).not.toBeNull();
    expect(back2.body.nextCursor).toBe(page2.body.nextCursor);
    const back1 = await api<Page>(lead, "GET", `/api/queue?limit=2&before=${back2.body.prevCursor}`);
    expect(ids(back1)).toEqual(ids(page1));
    expect(back1.body.prevCursor).toBeNull();
    expect(back1.body.nextCursor).toBe(page1.body.nextCursor);
    expect((await api(lead, "GET", `/api/queue?limit=2&cursor=${page1.body.nextCursor}&before=${page1.body.nextCursor}`)).status).toBe(400);
    expect((await api(lead, "GET", "/api/queue?before=garbage")).status).toBe(400);
  });

  it("a list filtered by part type shows that type's units on a bench and waiting, in order, by cursor", async () => {
    type Page = { units: { lotId: string; sampleIndex: number; status: string; holder: { id: string } | null }[]; nextCursor: string | null };
    const page1 = await api<Page>(lead, "GET", `/api/queue?limit=2&partTypeId=${partTypeId}`);
    expect(page1.body.units.map((u) => [u.lotId, u.sampleIndex, u.status, u.holder?.id ?? null])).toEqual([
      [late.id, 1, "on_bench", aId],
      [late.id, 2, "waiting", null],
    ]);
    const page2 = await api<Page>(lead, "GET", `/api/queue?limit=2&partTypeId=${partTypeId}&cursor=${page1.body.nextCursor}`);
    expect(page2.body.units.map((u) => [u.lotId, u.sampleIndex])).toEqual([[late.id, 3]]);
    expect(page2.body.nextCursor).toBeNull();
    const other = await api<Page>(lead, "GET", `/api/queue?partTypeId=${otherPartTypeId}`);
    expect(other.body.units.map((u) => [u.sampleIndex, u.holder?.id])).toEqual([
      [1, aId],
      [2, bId],
    ]);
  });

  it("stats count waiting and on-bench units per part type", async () => {
    const stats = await api<{ waiting: number; onBench: number; byPartType: { partTypeId: string; waiting: number; onBench: number }[] }>(a, "GET", "/api/queue/stats");
    expect(stats.body).toMatchObject({ waiting: 2, onBench: 3 });
    expect(stats.body.byPartType.find((p) => p.partTypeId === otherPartTypeId)).toMatchObject({ waiting: 0, onBench: 2 });
  });
});

describe("queue stats", () => {
  it("count the open queue (an expired lease is waiting, a decided lot is not) and recent grades", async () => {
    const ws = await createWorkspace();
    const leadUser = await createUser({ workspaceId: ws.id, roles: ["lead"] });
    const inspector = await createUser({ workspaceId: ws.id, roles: ["inspector"] });
    const { partType, supplier } = await createPartTypeAndSupplier(ws.id);
    const open = await createLotWithUnits({ workspaceId: ws.id, createdBy: leadUser.id, count: 6, partTypeId: partType.id, supplierId: supplier.id });
    const decided = await createLotWithUnits({ workspaceId: ws.id, createdBy: leadUser.id, count: 2, partTypeId: partType.id, supplierId: supplier.id });
    await db().update(lots).set({ status: "decided" }).where(eq(lots.id, decided.id));
    const unit = (sampleIndex: number) => sql`lot_id = ${open.id} AND sample_index = ${sampleIndex}`;
    // 1 stays queued. 2 is on a bench, 3 on a bench whose lease ran out (so waiting again).
    await db().execute(sql`UPDATE units SET status = 'on_bench', lease_holder_id = ${inspector.id}, claimed_at = now(), lease_expires_at = now() + interval '10 minutes' WHERE ${unit(2)}`);
    await db().execute(
      sql`UPDATE units SET status = 'on_bench', lease_holder_id = ${inspector.id}, claimed_at = now() - interval '30 minutes', lease_expires_at = now() - interval '1 minute' WHERE ${unit(3)}`,
    );
    // Graded now after 10 minutes on the bench, two days ago after 30, and 40 days ago after 5.
    await db().execute(sql`UPDATE units SET status = 'graded', claimed_at = now() - interval '10 minutes', graded_at = now() WHERE ${unit(4)}`);
    await db().execute(sql`UPDATE units SET status = 'graded', claimed_at = now() - interval '2 days 30 minutes', graded_at = now() - interval '2 days' WHERE ${unit(5)}`);
    await db().execute(sql`UPDATE units SET status = 'graded', claimed_at = now() - interval '40 days 5 minutes', graded_at = now() - interval '40 days' WHERE ${unit(6)}`);
    const stats = await api<{ waiting: number; onBench: number; gradedToday: number; byPartType: { partTypeId: string; medianMinutes: number | null }[] }>(
      await session(inspector.email),
      "GET",
      "/api/queue/stats",
    );
    expect(stats.status).toBe(200);
    // The decided lot's two queued units are not counted; the 40-day-old grade is outside the month.
    expect(stats.body).toMatchObject({ waiting: 2, onBench: 1, gradedToday: 1 });
    // Median of 10 and 30 minutes = 20: for an even count, percentile_cont(0.5) interpolates
    // between the two middle values (PostgreSQL manual, "Ordered-Set Aggregate Functions").
    expect(stats.body.byPartType).toEqual([expect.objectContaining({ partTypeId: partType.id, medianMinutes: 20 })]);
  });
});

describe("leases", () => {
  it("the holder renews; another inspector cannot renew or release it", async () => {
    const [held] = await db().select().from(units).where(eq(units.leaseHolderId, aId)).limit(1);
    const renew = await api<{ leaseExpiresAt: string }>(a, "PUT", `/api/units/${held.id}/lease`);
    expect(renew.status).toBe(200);
    const stolenRenew = await api<{ error: { message: string } }>(b, "PUT", `/api/units/${held.id}/lease`);
    expect(stolenRenew.status).toBe(409);
    const stolenRelease = await api<{ error: { message: string } }>(b, "DELETE", `/api/units/${held.id}/lease`);
    expect(stolenRelease.status).toBe(403);
    expect(stolenRelease.body.error.message).toMatch(/only they or a lead/);
    const [after] = await db().select().from(units).where(eq(units.id, held.id));
    expect(after.leaseHolderId).toBe(aId);
    expect(after.status).toBe("on_bench");
  });

  it("releasing puts the unit back, and it is offered again", async () => {
    const [held] = await db().select().from(units).where(eq(units.leaseHolderId, bId)).limit(1);
    expect((await api(b, "DELETE", `/api/units/${held.id}/lease`)).status).toBe(200);
    const [after] = await db().select().from(units).where(eq(units.id, held.id));
    expect(after).toMatchObject({ status: "queued", leaseHolderId: null });
    const again = await api<Claim>(a, "POST", "/api/queue/next");
    expect(again.body.unit.id).toBe(held.id);
  });

  it("a lead can reassign and release anyone's unit", async () => {
    const [held] = await db().select().from(units).where(eq(units.leaseHolderId, aId)).limit(1);
    expect((await api(lead, "POST", `/api/units/${held.id}/lease/reassign`, { userId: bId })).status).toBe(200);
    expect((await db().select().from(units).where(eq(units.id, held.id)))[0].leaseHolderId).toBe(bId);
    expect((await api(lead, "DELETE", `/api/units/${held.id}/lease`)).status).toBe(200);
    expect((await db().select().from(units).where(eq(units.id, held.id)))[0].status).toBe("queued");
  });

  it("releasing a unit that is not on a bench is a 409 with a reason", async () => {
    const [queued] = await db()
      .select()
      .from(units)
      .where(sql`${units.lotId} = ${late.id} AND ${units.status} = 'queued'`)
      .limit(1);
    const res = await api<{ error: { message: string } }>(lead, "DELETE", `/api/units/${queued.id}/lease`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe("This unit is waiting in the queue, so it cannot be put back in the queue.");
  });
});

describe("bad input changes nothing", () => {
  const snapshot = async () =>
    (
      await db()
        .select({ id: units.id, status: units.status, holder: units.leaseHolderId, exp: units.leaseExpiresAt })
        .from(units)
        .where(sql`${units.lotId} IN (${early.id}, ${late.id})`)
    ).sort((x, y) => x.id.localeCompare(y.id));

  it("unknown or malformed filters → 400", async () => {
    const before = await snapshot();
    const unknown = await api<{ error: { message: string } }>(a, "POST", "/api/queue/next", { partType: "battery" });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toMatch(/Unknown field: partType/);
    expect((await api(a, "POST", "/api/queue/next", { lotId: "not-a-uuid" })).status).toBe(400);
    expect((await api(a, "POST", "/api/queue/next", "[1,2]", { "content-type": "application/json" })).status).toBe(400);
    expect((await api(a, "GET", "/api/queue?color=red")).status).toBe(400);
    expect((await api(a, "GET", "/api/queue?cursor=garbage")).status).toBe(400);
    expect((await api(a, "GET", "/api/queue?limit=100000")).status).toBe(400);
    expect(await snapshot()).toEqual(before);
  });

  it("forged unit ids → 404; auditors may not take units", async () => {
    const before = await snapshot();
    expect((await api(a, "PUT", "/api/units/00000000-0000-4000-8000-000000000000/lease")).status).toBe(404);
    expect((await api(a, "DELETE", "/api/units/not-a-unit-id/lease")).status).toBe(404);
    expect((await api(lead, "POST", `/api/units/${early.id}/lease/reassign`, { userId: bId })).status).toBe(404);
    expect((await api(lead, "POST", "/api/units/00000000-0000-4000-8000-000000000000/lease/reassign", { userId: "x" })).status).toBe(400);
    expect((await api(auditor, "POST", "/api/queue/next")).status).toBe(403);
    expect(await snapshot()).toEqual(before);
  });
});
