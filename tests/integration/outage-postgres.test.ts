/**
 * PostgreSQL goes away (pg_ctl stop -m fast: every connection cut) while the Bench's autosaver is
 * saving regions, and comes back. The real autosaver class and the Bench's own save call
 * (components/bench) run here against the test server: while the database is down the saves are
 * answered 503 with a sentence (not 500) and retried with backoff; once it is back, without
 * restarting the app, the last set is saved and every region is stored exactly once.
 */
import { eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, expect, it } from "vitest";
import { RegionAutosaver, type SaveStatus } from "@/components/bench/region-autosaver";
import { putRegionSet } from "@/components/bench/regions-api";
import { db } from "@/db/client";
import { regions, regionSets } from "@/db/schema";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { createPartType, createPhoto, createUnit, workspaceIdOf } from "../support/grading";
import { api, BASE_URL, FILE_CLIENT_ADDRESS, signIn, type Session } from "../support/http";
import { serviceControl } from "../support/services";

let inspector: Session;
let photoId: string;
let databaseDown = false;
const realFetch = globalThis.fetch;
const answers: number[] = [];

beforeAll(async () => {
  inspector = await signIn("inspector@vellmoor.example");
  const owner = await workspaceIdOf("lead@vellmoor.example");
  const partType = await createPartType(owner.workspaceId);
  const unit = await createUnit({ workspaceId: owner.workspaceId, partTypeId: partType.id, createdBy: owner.userId });
  photoId = (await createPhoto({ workspaceId: owner.workspaceId, unitId: unit.id, uploadedBy: owner.userId, width: 4000, height: 3000 })).id;
  // The Bench's save call, as in the browser: same-origin paths, the session cookie attached.
  globalThis.fetch = async (input, init) => {
    const url = typeof input === "string" && input.startsWith("/") ? `${BASE_URL}${input}` : input;
    const res = await realFetch(url, { ...init, headers: { ...(init?.headers as Record<string, string>), cookie: inspector.cookie, "x-forwarded-for": FILE_CLIENT_ADDRESS } });
    answers.push(res.status);
    return res;
  };
});

afterAll(async () => {
  globalThis.fetch = realFetch;
  if (databaseDown) await serviceControl("postgres", "start");
});

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function setWith(count: number): RegionSetPayload {
  return {
    regions: Array.from({ length: count }, (_, i) => ({
      id: `pg-${i + 1}`,
      defect: "scratch",
      shape: { kind: "rect" as const, x: 10 + (i % 20) * 150, y: 10 + Math.floor(i / 20) * 150, width: 100, height: 80 },
    })),
    surfaces: [],
    ruler: null,
  };
}

it("saves fail with 503 while PostgreSQL is down, are retried, and afterwards every region is stored once", { timeout: 120_000 }, async () => {
  const initial = await api<{ version: number; regions: RegionSetPayload }>(inspector, "GET", `/api/photos/${photoId}/regions`);
  expect(initial.status).toBe(200);
  const statuses: SaveStatus["kind"][] = [];
  let retryMessage = "";
  const saver = new RegionAutosaver({ initial: initial.body, send: (request) => putRegionSet(photoId, request), debounceMs: 50, firstRetryMs: 400, maxRetryMs: 1500 });
  saver.subscribe(() => {
    const status = saver.getStatus();
    statuses.push(status.kind);
    if (status.kind === "retrying") retryMessage = status.message;
  });

  // An inspector marks 40 regions, one every 100 ms; PostgreSQL goes down after the 10th and
  // comes back four seconds later, while the marking goes on.
  let restarting: Promise<void> | null = null;
  for (let n = 1; n <= 40; n++) {
    saver.edit(setWith(n));
    if (n === 10) {
      await saver.flush();
      await serviceControl("postgres", "stop");
      databaseDown = true;
      restarting = sleep(4000).then(async () => {
        await serviceControl("postgres", "start");
        databaseDown = false;
      });
    }
    await sleep(100);
  }
  await restarting;
  expect(await saver.flush()).toBe(true);

  // While it was down: 503 with a sentence, shown as "retrying"; never a 500.
  expect(answers).toContain(503);
  expect(answers).not.toContain(500);
  expect(statuses).toContain("retrying");
  expect(retryMessage).toMatch(/problem \(503\)|database did not answer/);
  const down = await realFetch(`${BASE_URL}/api/photos/${photoId}/regions`, { headers: { cookie: inspector.cookie } });
  expect(down.status).toBe(200);

  // Afterwards: the last set, each region once.
  const stored = await api<{ version: number; regions: RegionSetPayload }>(inspector, "GET", `/api/photos/${photoId}/regions`);
  expect(stored.body.regions.regions.map((r) => r.id)).toEqual(setWith(40).regions.map((r) => r.id));
  const rows = await db().select({ clientId: regions.clientId }).from(regions).where(eq(regions.photoId, photoId));
  expect(rows).toHaveLength(40);
  expect(new Set(rows.map((r) => r.clientId)).size).toBe(40);
  const [set] = await db().select().from(regionSets).where(eq(regionSets.photoId, photoId));
  expect(set.version).toBe(stored.body.version);
  const [{ n }] = (await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM regions WHERE photo_id = ${photoId} AND version_written > ${set.version}`)).rows;
  expect(n).toBe(0);
});
