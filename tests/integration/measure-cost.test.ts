/**
 * Issue 14, items 3 and 4, over HTTP against the test server and its PostgreSQL:
 * - measuring costs are bounded: Line widths and Spot radii are capped relative to the photo and
 *   a photo's set has a work budget, refused at save with a sentence; sets stored before the caps
 *   are refused when measuring (409, nothing stored); measuring runs off the request thread;
 * - request bodies are read as a stream with a byte counter: 413 as soon as the limit is passed,
 *   with or without Content-Length, before the client has finished sending.
 */
import http from "node:http";
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { measurements, regions } from "@/db/schema";
import { FIXTURE_SURFACE, createMeasurableUnit, createPhoto, saveRegions, workspaceIdOf, type FixtureRegion } from "../support/grading";
import { api, BASE_URL, signIn, type Session } from "../support/http";

type ErrorBody = { error: { code: string; message: string; fieldErrors?: Record<string, string> } };

let inspector: Session;
let owner: { workspaceId: string; userId: string };

beforeAll(async () => {
  inspector = await signIn("inspector@vellmoor.example");
  owner = await workspaceIdOf("lead@vellmoor.example");
});

/** A 12 MP photo row on a measurable unit (measuring reads regions and size, not the image). */
async function largePhoto() {
  const { unit, photo } = await createMeasurableUnit(owner);
  const large = await createPhoto({ workspaceId: owner.workspaceId, unitId: unit.id, uploadedBy: owner.userId, width: 4000, height: 3000 });
  return { unit, small: photo, large };
}

const save = (photoId: string, shapes: unknown[]) =>
  api<ErrorBody>(inspector, "PUT", `/api/photos/${photoId}/regions`, {
    baseVersion: 0,
    regions: { regions: shapes.map((shape, k) => ({ id: `r${k}`, defect: "scratch", shape })), surfaces: [], ruler: null },
  });

describe("measuring costs are bounded", () => {
  it("a Line or Spot beyond its cap, or a set beyond the work budget, is refused at save and nothing is stored", async () => {
    const { large } = await largePhoto();
    // The case: a 2-point Line 4 000 px wide (16 s to measure before, 68 s for four).
    const wide = await save(large.id, [
      {
        kind: "line",
        points: [
          [0, 1500],
          [4000, 1500],
        ],
        width: 4000,
      },
    ]);
    expect(wide.status).toBe(400);
    expect(wide.body.error.message).toMatch(/Region 1 \(Line\): the line is 4000 px wide; at most 200 px \(5 % of the photo's long edge\) is allowed — mark a wider defect with Outline\./);
    const spot = await save(large.id, [{ kind: "spot", x: 2000, y: 1500, radius: 900 }]);
    expect(spot.body.error.message).toMatch(/the spot's radius is 900 px; at most 400 px/);
    // 20 comb outlines (401 points: 200 teeth down the whole photo, closed along the top edge),
    // every tooth edge across all 3 000 rows: 20 × (400 × 3 000 + 3 000) = 24.06 million shape rows.
    const zigzags = Array.from({ length: 20 }, (_, k) => ({ kind: "polygon", points: Array.from({ length: 401 }, (_, i) => [100 + k * 150 + i * 0.3, i % 2 ? 3000 : 0]) }));
    const costly = await save(large.id, zigzags);
    expect(costly.status).toBe(400);
    expect(costly.body.error.message).toMatch(/too long to measure: their edges and lines cross 24\.1 million pixel rows in all, at most 1\.0 million are allowed per photo/);
    expect(await db().select().from(regions).where(eq(regions.photoId, large.id))).toHaveLength(0);
    // At the caps is fine.
    expect(
      (
        await save(large.id, [
          {
            kind: "line",
            points: [
              [0, 1500],
              [4000, 1500],
            ],
            width: 200,
          },
          { kind: "spot", x: 10, y: 10, radius: 400 },
        ])
      ).status,
    ).toBe(200);
  });

  it("regions stored before the caps make measuring answer 409 naming the photo, and store nothing", async () => {
    const { unit, large } = await largePhoto();
    await saveRegions({
      workspaceId: owner.workspaceId,
      photoId: large.id,
      authorId: owner.userId,
      regions: [
        FIXTURE_SURFACE,
        {
          clientId: "w",
          role: "defect",
          defect: "scratch",
          shape: {
            kind: "line",
            points: [
              [0, 1500],
              [4000, 1500],
            ],
            width: 4000,
          },
        },
      ],
    });
    const started = Date.now();
    const res = await api<ErrorBody>(inspector, "POST", `/api/units/${unit.id}/measure`);
    expect(res.status, JSON.stringify(res.body)).toBe(409);
    expect(res.body.error.message).toMatch(/^Photo 2 \(Lens\) cannot be measured: .*regions\.0\.shape\.width: must be at most 200 px .* Change its regions, then measure again\.$/);
    expect(Date.now() - started).toBeLessThan(15_000); // refused, not measured for 16 s (generous for a loaded machine)
    expect(await db().select().from(measurements).where(eq(measurements.unitId, unit.id))).toHaveLength(0);
  });

  it("measuring runs off the request thread: the server keeps answering while a heavy set is measured", async () => {
    const { unit, large } = await largePhoto();
    // Within every cap and the budget: 330 Lines at the width cap, each across all 3 000 rows.
    const heavy: FixtureRegion[] = Array.from({ length: 330 }, (_, k) => ({
      clientId: `h${k}`,
      role: "defect",
      defect: "scratch",
      shape: {
        kind: "line",
        points: [
          [k * 11, 0],
          [k * 11 + 2, 3000],
        ],
        width: 199,
      },
    }));
    await saveRegions({ workspaceId: owner.workspaceId, photoId: large.id, authorId: owner.userId, regions: heavy });
    let measured = false;
    const measuring = api(inspector, "POST", `/api/units/${unit.id}/measure`).then((res) => {
      measured = true;
      return res;
    });
    const answeredMeanwhile: number[] = [];
    while (!measured && answeredMeanwhile.length < 200) {
      const before = performance.now();
      const health = await api(null, "GET", "/api/health");
      expect(health.status).toBe(200);
      if (!measured) answeredMeanwhile.push(performance.now() - before);
    }
    const res = await measuring;
    // 200 with the result, or 202 when it needed longer than the request's 2 s budget.
    expect([200, 202], JSON.stringify(res.body)).toContain(res.status);
    expect(answeredMeanwhile.length).toBeGreaterThan(0);
  });
});

/**
 * Streams `total` bytes in 64 KB chunks with chunked transfer encoding (no Content-Length) and
 * reports the answer's status and how many bytes had been sent when it arrived.
 */
function streamBody(path: string, total: number, cookie?: string): Promise<{ status: number; sentWhenAnswered: number }> {
  return new Promise((resolve, reject) => {
    const url = new URL(path, BASE_URL);
    // Same-origin, JSON: only the size may be wrong.
    const req = http.request(url, {
      method: path.includes("/regions") ? "PUT" : "POST",
      headers: { origin: BASE_URL, "content-type": "application/json", "transfer-encoding": "chunked", ...(cookie ? { cookie } : {}) },
    });
    let sent = 0;
    let answered = false;
    const chunk = Buffer.alloc(64 * 1024, 0x20); // JSON whitespace
    req.on("response", (res) => {
      answered = true;
      resolve({ status: res.statusCode ?? 0, sentWhenAnswered: sent });
      res.resume();
      req.destroy();
    });
    req.on("error", (err) => (answered ? undefined : reject(err)));
    const pump = () => {
      while (!answered && sent < total) {
        sent += chunk.length;
        if (!req.write(chunk)) return void req.once("drain", pump);
      }
      if (!answered) req.end();
    };
    req.write("{");
    pump();
  });
}

describe("request bodies are counted while they stream", () => {
  it("answers 413 before the client has finished sending a chunked body past the limit (public and signed-in routes)", async () => {
    const total = 64 * 1024 * 1024;
    const signup = await streamBody("/api/signup", total);
    expect(signup.status).toBe(413);
    expect(signup.sentWhenAnswered).toBeLessThan(total / 4);
    const { unit, small } = await largePhoto();
    // The measure route used to clone the request and read it whole, whatever its size.
    const measure = await streamBody(`/api/units/${unit.id}/measure`, total, inspector.cookie);
    expect(measure.status).toBe(413);
    expect(measure.sentWhenAnswered).toBeLessThan(total / 4);
    // Region saves have their own, larger limit (12 MB): counted all the same.
    const regionsSave = await streamBody(`/api/photos/${small.id}/regions`, total, inspector.cookie);
    expect(regionsSave.status).toBe(413);
    expect(regionsSave.sentWhenAnswered).toBeLessThan(total / 2);
  });

  it("a declared Content-Length over the limit is refused with a sentence without reading the body", async () => {
    const res = await fetch(`${BASE_URL}/api/password/forgot`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ email: `${"a".repeat(40_000)}@tests.example` }),
    });
    expect(res.status).toBe(413);
    expect(((await res.json()) as ErrorBody).error.message).toBe("The request is too large (limit 16 KB).");
  });
});
