/**
 * The regions API over HTTP against the test server and its PostgreSQL (no mocks): version
 * compare-and-swap with 409 and the current state, every kind of bad input refused with the
 * validation library's sentences and nothing stored, read-only while another person's lease runs,
 * closed units, workspaces and roles, and the measurement reading what was saved.
 */
import { and, asc, eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { activityLog, regions, regionSets, units } from "@/db/schema";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { createMeasurableUnit, createPartType, createPhoto, createUnit, workspaceIdOf } from "../support/grading";
import { api, signIn, type Session } from "../support/http";

type ErrorBody = { error: { code: string; message: string; fieldErrors?: Record<string, string> } };
type SetBody = { photoId: string; version: number; regions: RegionSetPayload; updatedByName: string | null };
type ConflictBody = ErrorBody & { current: SetBody };

let inspector: Session;
let inspector2: Session;
let lead: Session;
let auditor: Session;
let owner: { workspaceId: string; userId: string };

beforeAll(async () => {
  [inspector, inspector2, lead, auditor] = await Promise.all(["inspector@vellmoor.example", "inspector2@vellmoor.example", "lead@vellmoor.example", "auditor@vellmoor.example"].map((e) => signIn(e)));
  owner = await workspaceIdOf("lead@vellmoor.example");
});

/** A 300 × 200 px ready photo on a unit on the bench that nobody holds (fixture part type: scratch, dent, crack). */
async function freshPhoto() {
  const partType = await createPartType(owner.workspaceId);
  const unit = await createUnit({ workspaceId: owner.workspaceId, partTypeId: partType.id, createdBy: owner.userId });
  const photo = await createPhoto({ workspaceId: owner.workspaceId, unitId: unit.id, uploadedBy: owner.userId });
  return { unit, photo, path: `/api/photos/${photo.id}/regions` };
}

const ONE_OF_EACH: RegionSetPayload = {
  surfaces: [
    {
      id: "s-1",
      shape: {
        kind: "polygon",
        points: [
          [10, 10],
          [290, 10],
          [290, 190],
          [10, 190],
        ],
      },
    },
  ],
  regions: [
    { id: "k-1", defect: "scratch", shape: { kind: "rect", x: 20.5, y: 30.25, width: 40, height: 12.125 } },
    {
      id: "k-2",
      defect: "dent",
      shape: {
        kind: "polygon",
        points: [
          [100, 100],
          [140, 100],
          [120, 130],
        ],
      },
    },
    {
      id: "k-10",
      defect: "scratch",
      shape: {
        kind: "line",
        points: [
          [50, 150],
          [90, 160],
          [130, 150.5],
        ],
        width: 2.5,
      },
    },
    { id: "k-3", defect: "crack", shape: { kind: "spot", x: 250, y: 50, radius: 3.75 } },
  ],
  ruler: { id: "r-1", a: [10, 195], b: [110, 195], lengthMm: 10 },
};

const withRegion = (region: unknown) => ({ baseVersion: 0, regions: { regions: [region], surfaces: [], ruler: null } });
const rowCount = async (photoId: string) => (await db().select({ id: regions.id }).from(regions).where(eq(regions.photoId, photoId))).length;
const setVersion = async (photoId: string) => (await db().select({ v: regionSets.version }).from(regionSets).where(eq(regionSets.photoId, photoId)))[0]?.v ?? null;

describe("reading and saving a photo's regions", () => {
  it("starts at version 0, saves one shape of each tool and gives back exactly what was sent, in order", async () => {
    const { photo, path } = await freshPhoto();
    const empty = await api<SetBody>(inspector, "GET", path);
    expect(empty.status).toBe(200);
    expect(empty.body).toMatchObject({ photoId: photo.id, version: 0, regions: { regions: [], surfaces: [], ruler: null } });

    const saved = await api<SetBody>(inspector, "PUT", path, { baseVersion: 0, regions: ONE_OF_EACH });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    expect(saved.body.version).toBe(1);
    expect(saved.body.regions).toEqual(ONE_OF_EACH);
    const read = await api<SetBody>(inspector, "GET", path);
    expect(read.body).toMatchObject({ version: 1, regions: ONE_OF_EACH, updatedByName: expect.any(String) });

    const rows = await db().select().from(regions).where(eq(regions.photoId, photo.id)).orderBy(asc(regions.position));
    expect(rows.map((r) => [r.clientId, r.role, r.position, r.versionWritten])).toEqual([
      ["s-1", "surface", 0, 1],
      ["k-1", "defect", 1, 1],
      ["k-2", "defect", 2, 1],
      ["k-10", "defect", 3, 1],
      ["k-3", "defect", 4, 1],
      ["r-1", "ruler", 5, 1],
    ]);
    const [logged] = await db()
      .select()
      .from(activityLog)
      .where(and(eq(activityLog.subjectId, photo.id), eq(activityLog.action, "regions.saved")));
    expect(logged.detail).toMatchObject({ version: 1, regions: 6, added: 6, changed: 0, removed: 0 });
  });

  it("answers 409 with the current version and regions to a save from an old version, and stores nothing", async () => {
    const { path, photo } = await freshPhoto();
    // Two tabs of the same inspector (the first save took the unit onto their bench).
    await api(inspector, "PUT", path, { baseVersion: 0, regions: ONE_OF_EACH });
    const stale = await api<ConflictBody>(inspector, "PUT", path, withRegion({ id: "other-1", defect: "dent", shape: { kind: "spot", x: 5, y: 5, radius: 2 } }));
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe("conflict");
    expect(stale.body.error.message).toMatch(/changed elsewhere .*now version 1; this edit started from version 0\)\. Nothing was saved/);
    expect(stale.body.current).toMatchObject({ version: 1, regions: ONE_OF_EACH });
    expect(await setVersion(photo.id)).toBe(1);
    expect(await rowCount(photo.id)).toBe(6);

    // From the current version it goes through; unchanged regions keep the version that wrote them.
    const merged = { ...ONE_OF_EACH, regions: [...ONE_OF_EACH.regions, { id: "other-1", defect: "dent", shape: { kind: "spot" as const, x: 5, y: 5, radius: 2 } }] };
    const next = await api<SetBody>(inspector, "PUT", path, { baseVersion: 1, regions: merged });
    expect(next.status).toBe(200);
    expect(next.body.version).toBe(2);
    const rows = await db().select({ clientId: regions.clientId, v: regions.versionWritten }).from(regions).where(eq(regions.photoId, photo.id));
    expect(Object.fromEntries(rows.map((r) => [r.clientId, r.v]))).toMatchObject({ "k-1": 1, "r-1": 1, "other-1": 2 });
  });

  it("of two saves from the same version at the same moment, exactly one wins", async () => {
    const { path, photo } = await freshPhoto();
    const body = (id: string) => withRegion({ id, defect: "scratch", shape: { kind: "rect", x: 1, y: 1, width: 5, height: 5 } });
    const results = await Promise.all([api(inspector, "PUT", path, body("a-1")), api(inspector2, "PUT", path, body("b-1")), api(lead, "PUT", path, body("c-1"))]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409, 409]);
    expect(await setVersion(photo.id)).toBe(1);
    expect(await rowCount(photo.id)).toBe(1);
  });

  it("refuses every kind of bad geometry with the library's sentence and stores nothing", async () => {
    const { path, photo } = await freshPhoto();
    const points = (n: number) => Array.from({ length: n }, (_, i) => [i % 300, Math.floor(i / 300)]);
    const cases: [string, string | object, RegExp][] = [
      // 1e309 is valid JSON that JSON.parse turns into Infinity (NaN cannot be written in JSON at all).
      [
        "1e309",
        '{"baseVersion":0,"regions":{"regions":[{"id":"a","defect":"scratch","shape":{"kind":"rect","x":1e309,"y":1,"width":5,"height":5}}]}}',
        /Region 1 \(Box\): x must be a finite number\./,
      ],
      [
        "-1e309 radius",
        '{"baseVersion":0,"regions":{"regions":[{"id":"a","defect":"scratch","shape":{"kind":"spot","x":5,"y":5,"radius":-1e309}}]}}',
        /Region 1 \(Spot\): the radius must be a finite number\./,
      ],
      ["Infinity literal", '{"baseVersion":0,"regions":{"regions":[{"id":"a","defect":"scratch","shape":{"kind":"spot","x":Infinity,"y":5,"radius":2}}]}}', /not valid JSON/],
      ["NaN literal", '{"baseVersion":0,"regions":{"regions":[{"id":"a","defect":"scratch","shape":{"kind":"spot","x":NaN,"y":5,"radius":2}}]}}', /not valid JSON/],
      [
        "2 million points",
        withRegion({ id: "a", defect: "scratch", shape: { kind: "line", points: new Array(2_000_000).fill(0), width: 1 } }),
        /Region 1 \(Line\): the points may hold at most 5000 points\./,
      ],
      ["5 001 points", withRegion({ id: "a", defect: "scratch", shape: { kind: "polygon", points: points(5_001) } }), /Region 1 \(Outline\): the points may hold at most 5000 points\./],
      [
        "self-closing line",
        withRegion({
          id: "a",
          defect: "scratch",
          shape: {
            kind: "line",
            points: [
              [10, 10],
              [60, 40],
              [10, 10],
            ],
            width: 2,
          },
        }),
        /Region 1 \(Line\): the line only runs back and forth between 2 points/,
      ],
      [
        "collinear outline",
        withRegion({
          id: "a",
          defect: "scratch",
          shape: {
            kind: "polygon",
            points: [
              [10, 10],
              [20, 20],
              [30, 30],
            ],
          },
        }),
        /Region 1 \(Outline\): a polygon needs at least 3 points that are not on one line/,
      ],
      [
        "two-point outline",
        withRegion({
          id: "a",
          defect: "scratch",
          shape: {
            kind: "polygon",
            points: [
              [10, 10],
              [20, 20],
            ],
          },
        }),
        /Region 1 \(Outline\)/,
      ],
      ["outside the photo", withRegion({ id: "a", defect: "scratch", shape: { kind: "rect", x: 280, y: 10, width: 40, height: 5 } }), /Region 1 \(Box\): .*outside the 300 × 200 px photo/],
      ["negative coordinates", withRegion({ id: "a", defect: "scratch", shape: { kind: "spot", x: -3, y: 5, radius: 2 } }), /Region 1 \(Spot\): the spot's centre \(-3, 5\) lies/],
      ["zero radius", withRegion({ id: "a", defect: "scratch", shape: { kind: "spot", x: 30, y: 30, radius: 0 } }), /Region 1 \(Spot\)/],
      [
        "zero line width",
        withRegion({
          id: "a",
          defect: "scratch",
          shape: {
            kind: "line",
            points: [
              [10, 10],
              [50, 50],
            ],
            width: 0,
          },
        }),
        /Region 1 \(Line\): a line needs a width above 0\./,
      ],
      ["negative box", withRegion({ id: "a", defect: "scratch", shape: { kind: "rect", x: 50, y: 50, width: -10, height: 5 } }), /Region 1 \(Box\)/],
      [
        "unknown class",
        withRegion({ id: "a", defect: "bogus", shape: { kind: "spot", x: 30, y: 30, radius: 2 } }),
        /Region 1 \(Spot\): the defect class “bogus” is not allowed for this part type \(allowed: scratch, dent, crack\)\./,
      ],
      ["unknown shape field", withRegion({ id: "a", defect: "scratch", shape: { kind: "spot", x: 30, y: 30, radius: 2, colour: "red" } }), /has unknown field\(s\) colour/],
      ["unknown top-level field", { baseVersion: 0, regions: { regions: [], surfaces: [], ruler: null }, force: true }, /Unknown field: force/],
      ["unknown set field", { baseVersion: 0, regions: { regions: [], surfaces: [], ruler: null, zones: [] } }, /has unknown field\(s\) zones/],
      ["unknown shape kind", withRegion({ id: "a", defect: "scratch", shape: { kind: "ellipse", x: 30, y: 30 } }), /must be "rect", "polygon", "line" or "spot"/],
      ["missing regions", { baseVersion: 0 }, /regions\): is missing/],
      ["version as text", { baseVersion: "0", regions: { regions: [] } }, /baseVersion/],
      [
        "duplicate ids",
        { baseVersion: 0, regions: { regions: [1, 2].map(() => ({ id: "same", defect: "scratch", shape: { kind: "spot", x: 30, y: 30, radius: 2 } })) } },
        /“same” is already used by region 1/,
      ],
    ];
    for (const [name, body, message] of cases) {
      const res = await api<ErrorBody>(inspector, "PUT", path, body);
      expect(res.status, `${name}: ${JSON.stringify(res.body).slice(0, 300)}`).toBe(400);
      expect(res.body.error.message, name).toMatch(message);
    }
    // A body far past any real set is refused before it is read.
    const huge = await api<ErrorBody>(inspector, "PUT", path, `{"baseVersion":0,"regions":{"regions":[],"pad":"${"x".repeat(13 * 1024 * 1024)}"}}`);
    expect(huge.status).toBe(413);
    expect(await setVersion(photo.id)).toBeNull();
    expect(await rowCount(photo.id)).toBe(0);
  });

  it("lists every problem (up to 20) as field errors too", async () => {
    const { path } = await freshPhoto();
    const bad = Array.from({ length: 3 }, (_, i) => ({ id: `b${i}`, defect: "bogus", shape: { kind: "spot", x: 30, y: 30, radius: 2 } }));
    const res = await api<ErrorBody>(inspector, "PUT", path, { baseVersion: 0, regions: { regions: bad } });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fieldErrors ?? {}).sort()).toEqual(["regions", "regions.0", "regions.1", "regions.2"]);
    expect(res.body.error.message).toMatch(/^The regions were not saved: Region 1 \(Spot\).* Nothing was stored\.$/);
  });
});

describe("who may save, and when", () => {
  it("is read-only for everybody else while another person's lease runs, leads included; the holder saves", async () => {
    const { unit, path, photo } = await freshPhoto();
    const holder = await workspaceIdOf("inspector2@vellmoor.example");
    await db()
      .update(units)
      .set({ leaseHolderId: holder.userId, leaseExpiresAt: new Date(Date.now() + 600_000) })
      .where(eq(units.id, unit.id));
    const body = withRegion({ id: "a", defect: "scratch", shape: { kind: "spot", x: 30, y: 30, radius: 2 } });
    for (const session of [inspector, lead]) {
      const refused = await api<ErrorBody>(session, "PUT", path, body);
      expect(refused.status).toBe(409);
      expect(refused.body.error.message).toMatch(/has this unit on their bench \(lease until \d\d:\d\d\), so it is read-only for you/);
    }
    expect(await setVersion(photo.id)).toBeNull();
    expect((await api(inspector2, "PUT", path, body)).status).toBe(200);
    // An expired lease no longer locks anyone out.
    await db()
      .update(units)
      .set({ leaseExpiresAt: new Date(Date.now() - 1000) })
      .where(eq(units.id, unit.id));
    expect((await api(inspector, "PUT", path, { ...body, baseVersion: 1 })).status).toBe(200);
  });

  it("takes a unit still waiting in the queue onto the saver's bench, as the checklist does", async () => {
    // Issue 15: regions could be saved on a queued unit while the queue still offered it to others.
    const { unit, path } = await freshPhoto();
    await db().update(units).set({ status: "queued", leaseHolderId: null, leaseExpiresAt: null }).where(eq(units.id, unit.id));
    const body = withRegion({ id: "a", defect: "scratch", shape: { kind: "spot", x: 30, y: 30, radius: 2 } });
    const saved = await api<SetBody>(inspector, "PUT", path, body);
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    const [after] = await db().select().from(units).where(eq(units.id, unit.id));
    const me = await workspaceIdOf("inspector@vellmoor.example");
    expect(after).toMatchObject({ status: "on_bench", leaseHolderId: me.userId });
    expect(after.leaseExpiresAt!.getTime()).toBeGreaterThan(Date.now());
    const [claimed] = await db()
      .select()
      .from(activityLog)
      .where(and(eq(activityLog.subjectId, unit.id), eq(activityLog.action, "unit.claimed")));
    expect(claimed.detail).toMatchObject({ via: "regions" });
    // It is now the saver's: someone else is refused, and the queue no longer offers it.
    const refused = await api<ErrorBody>(inspector2, "PUT", path, { ...body, baseVersion: 1 });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/has this unit on their bench/);
  });

  it("refuses graded units, decided lots and photos still processing", async () => {
    const graded = await freshPhoto();
    await db().update(units).set({ status: "graded" }).where(eq(units.id, graded.unit.id));
    const body = withRegion({ id: "a", defect: "scratch", shape: { kind: "spot", x: 30, y: 30, radius: 2 } });
    const g = await api<ErrorBody>(inspector, "PUT", graded.path, body);
    expect([g.status, g.body.error.message]).toEqual([409, "This unit is graded, so its regions are part of the record and can no longer change."]);

    const decided = await freshPhoto();
    await db().execute(sql`UPDATE lots SET status = 'decided' WHERE id = ${decided.unit.lotId}`);
    expect((await api<ErrorBody>(inspector, "PUT", decided.path, body)).body.error.message).toMatch(/lot is decided/);

    const { unit } = await freshPhoto();
    const pending = await createPhoto({ workspaceId: owner.workspaceId, unitId: unit.id, uploadedBy: owner.userId, status: "processing" });
    const p = await api<ErrorBody>(inspector, "PUT", `/api/photos/${pending.id}/regions`, body);
    expect([p.status, p.body.error.message]).toEqual([409, "This photo is still being processed (or was refused); regions can be marked once it is ready."]);
    for (const path of [graded.path, decided.path]) expect(await setVersion(path.split("/")[3])).toBeNull();
  });

  it("another workspace's photo is not found, exactly like a missing one; auditors neither read nor save", async () => {
    const { path } = await freshPhoto();
    const other = await signIn("lead@quillfen.example");
    const foreignGet = await api<ErrorBody>(other, "GET", path);
    const missingGet = await api<ErrorBody>(other, "GET", "/api/photos/00000000-0000-4000-8000-000000000000/regions");
    expect(foreignGet.status).toBe(404);
    expect(foreignGet.body).toEqual(missingGet.body);
    const body = withRegion({ id: "a", defect: "scratch", shape: { kind: "spot", x: 30, y: 30, radius: 2 } });
    expect((await api(other, "PUT", path, body)).status).toBe(404);
    // Blind recheck: the first grader's regions are not for auditors.
    expect((await api(auditor, "GET", path)).status).toBe(403);
    const denied = await api<ErrorBody>(auditor, "PUT", path, body);
    expect(denied.status).toBe(403);
    expect((await api(null, "PUT", path, body)).status).toBe(401);
  });
});

describe("measuring reads what was saved", () => {
  it("a save makes the last measurement stale, and measuring again uses the new regions and version", async () => {
    // The grading fixture: Surface 200 × 100 px, lens window its left half; a 12 × 10 px scratch = 1.2 % → C.
    const { unit, photo } = await createMeasurableUnit(owner);
    const first = await api<{ measurement: { proposal: { grade: string } } }>(inspector, "POST", `/api/units/${unit.id}/measure`);
    expect(first.body.measurement.proposal.grade).toBe("C");
    const current = await api<SetBody>(inspector, "GET", `/api/photos/${photo.id}/regions`);
    expect(current.body.version).toBe(1);
    // Shrink the scratch to 4 × 5 px = 20 px of the 10 000 px lens window = 0.2 % → A (hand computation).
    const smaller = { ...current.body.regions, regions: current.body.regions.regions.map((r) => ({ ...r, shape: { kind: "rect" as const, x: 60, y: 60, width: 4, height: 5 } })) };
    expect((await api(inspector, "PUT", `/api/photos/${photo.id}/regions`, { baseVersion: 1, regions: smaller })).status).toBe(200);
    const stale = await api<{ measurement: { stale: boolean; reasons: string[] } }>(inspector, "GET", `/api/units/${unit.id}/measure`);
    expect(stale.body.measurement).toMatchObject({ stale: true, reasons: ["Photo 1 (lens): regions changed since measuring (version 1 → 2)."] });
    const again = await api<{ measurement: { proposal: { grade: string }; regionsVersions: Record<string, number> } }>(inspector, "POST", `/api/units/${unit.id}/measure`);
    expect(again.body.measurement.proposal.grade).toBe("A");
    expect(again.body.measurement.regionsVersions).toEqual({ [photo.id]: 2 });
  });
});
