/**
 * Issue 19, step 3: the recheck is blind, proven at the API. An auditor holding a recheck calls
 * every route an auditor may call (the access matrix, tests/integration/routes.ts, filtered by
 * lib/auth/permissions.ts) with the rechecked unit's own ids wherever a route takes one, and no
 * answer carries anything of the first grade: its id, grade, measurement ids, the first grader's
 * id or name, or the first regions' ids. Then the auditor marks, measures and submits; the
 * comparison is stored. Bad submissions get a clear 4xx and store nothing.
 */
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { grades, rechecks, units, users } from "@/db/schema";
import { holders } from "@/lib/auth/permissions";
import { FIXTURE_SURFACE } from "../support/grading";
import { api, BASE_URL } from "../support/http";
import { flatText, pdfText } from "../support/pdf-text";
import { gradedUnit, RECHECK_DEFAULTS, recheckWorld, type RecheckWorld } from "../support/recheck";
import { ROUTES } from "./routes";

type ErrorBody = { error: { code: string; message: string; fieldErrors?: Record<string, string> } };
const ZERO = "00000000-0000-4000-8000-000000000000";
const marker = `Firstgrader Vantrel ${Date.now().toString(36)}`;
const firstRegionId = `first-mark-${Date.now().toString(36)}`;

let world: RecheckWorld;
let made: Awaited<ReturnType<typeof gradedUnit>>;
let recheckId: string;
let galleryItemId: string;

beforeAll(async () => {
  world = await recheckWorld({ ...RECHECK_DEFAULTS, rate: 1, raisedRate: 1 });
  await db().update(users).set({ name: marker }).where(eq(users.id, world.inspector.id));
  made = await gradedUnit(world, world.inspector, {
    regions: [FIXTURE_SURFACE, { clientId: firstRegionId, role: "defect", defect: "scratch", shape: { kind: "rect", x: 60, y: 60, width: 12, height: 10 } }],
  });
  // A lead promotes the graded photo to the Gallery and publishes it: the item carries the first
  // grader's regions and grade, so the auditor must not reach it while the recheck waits.
  const promoted = await api<{ item: { id: string } }>(world.lead, "POST", "/api/gallery", { photoId: made.photo.id });
  expect(promoted.status, JSON.stringify(promoted.body)).toBe(201);
  galleryItemId = promoted.body.item.id;
  expect((await api(world.lead, "PATCH", `/api/gallery/${galleryItemId}`, { revision: 0, caption: "A scratch across the lens window" })).status).toBe(200);
  expect((await api(world.lead, "POST", `/api/gallery/${galleryItemId}/publish`, { revision: 1 })).status).toBe(200);
  const taken = await api<{ recheck: { id: string } }>(world.auditor, "POST", "/api/rechecks/next");
  expect(taken.status).toBe(200);
  recheckId = taken.body.recheck.id;
});

describe("blind at the API", () => {
  it("no route an auditor can call answers with anything of the first grade", async () => {
    const [grade] = await db().select().from(grades).where(eq(grades.id, made.grade.id));
    const [unit] = await db().select().from(units).where(eq(units.id, made.unit.id));
    const secrets = [grade.id, world.inspector.id, marker, firstRegionId, galleryItemId, ...grade.measurementIds];
    const ids: Record<string, string> = new Proxy({} as Record<string, string>, {
      get: (_t, key: string) => {
        if (/galleryItem/i.test(key)) return galleryItemId;
        if (/unit/i.test(key)) return made.unit.id;
        if (/photo/i.test(key)) return made.photo.id;
        if (/lot/i.test(key) && !/PartType/.test(key)) return unit.lotId;
        if (/partType/i.test(key)) return made.partType.id;
        if (/supplier/i.test(key)) return unit.supplierId;
        if (/recheck/i.test(key)) return recheckId;
        return ZERO;
      },
    });
    const auditorRoutes = ROUTES.filter((r) => r.permission !== "public" && holders(r.permission).includes("auditor"));
    expect(auditorRoutes.length).toBeGreaterThan(15);
    const extra = [
      { method: "GET", path: `/api/rechecks/${recheckId}` },
      { method: "POST", path: `/api/rechecks/${recheckId}/measure` },
    ];
    const calls = [...auditorRoutes.map((r) => ({ method: r.method, path: r.path.replace(/:([a-zA-Z]+)/g, (_, k: string) => ids[k]), body: r.body?.(ids) })), ...extra];
    for (const call of calls) {
      const res = await api(world.auditor, call.method, call.path, "body" in call ? call.body : undefined);
      const text = typeof res.body === "string" ? res.body : JSON.stringify(res.body);
      // Scorecards name graders by design (per-grader figures over a period, never a unit): there only the grade's own traces count.
      const checked = call.path.startsWith("/api/recheck/scorecards") ? secrets.filter((secret) => secret !== world.inspector.id && secret !== marker) : secrets;
      for (const secret of checked) expect(text.includes(secret), `${call.method} ${call.path} leaks ${secret}: ${text.slice(0, 300)}`).toBe(false);
      // The grade itself: no answer about this unit, its lot, photo or recheck names a grade (the
      // rubric and part type routes list rule grades, which are the rules, not this unit's grade).
      // (…/measure answers the auditor's own proposal from their own marks, which is theirs to see.)
      const aboutUnit = [made.unit.id, unit.lotId, made.photo.id, recheckId, galleryItemId].some((id) => call.path.includes(id)) && !call.path.endsWith("/measure");
      if (aboutUnit) expect(text, `${call.method} ${call.path}`).not.toMatch(/"(finalGrade|proposedGrade|grade|overrideReason|gradedBy\w*)":\s*"/);
    }
    // The Gallery item made from this unit is out of the auditor's reach until the recheck is submitted.
    expect((await api(world.auditor, "GET", `/api/gallery/${galleryItemId}`)).status).toBe(404);
    expect((await api(world.auditor, "GET", `/api/gallery/${galleryItemId}/measurement`)).status).toBe(404);
    expect((await api(world.lead, "GET", `/api/gallery/${galleryItemId}`)).status).toBe(200);
    // Reports: the auditor's exports leave the unit out (the lead's keep it); the auditor's lot
    // report lists the unit with neither its grade nor its marked defects.
    for (const kind of ["units", "grades", "defects"]) {
      const forAuditor = await api<string>(world.auditor, "GET", `/api/reports/export?kind=${kind}`);
      expect(forAuditor.status, kind).toBe(200);
      expect(String(forAuditor.body), kind).not.toContain(made.unit.id);
      expect(String((await api<string>(world.lead, "GET", `/api/reports/export?kind=${kind}`)).body), kind).toContain(made.unit.id);
    }
    const reportText = async (session: typeof world.lead) => {
      const res = await fetch(`${BASE_URL}/api/lots/${unit.lotId}/report`, { headers: { cookie: session.cookie } });
      expect(res.status).toBe(200);
      return flatText(await pdfText(Buffer.from(await res.arrayBuffer())));
    };
    expect(await reportText(world.lead)).toContain("scratch");
    expect(await reportText(world.auditor)).not.toContain("scratch");
    const view = await api<{ photos: { id: string }[]; regionSets: Record<string, unknown> }>(world.auditor, "GET", `/api/rechecks/${recheckId}`);
    expect(view.status).toBe(200);
    expect(view.body.photos.map((p) => p.id)).toEqual([made.photo.id]);
    expect(view.body.regionSets).toEqual({});
  });
});

describe("marking, measuring and submitting", () => {
  it("refuses bad submissions with a clear 4xx and stores nothing", async () => {
    const cases: [unknown, number, RegExp][] = [
      [{ decision: "override", proposedGrade: "A", finalGrade: "C" }, 400, /override needs a reason/],
      [{ decision: "accept", proposedGrade: "E" }, 400, /must be A, B, C or Reject/],
      [{ decision: "maybe", proposedGrade: "A" }, 400, /decision must be/],
      [{ decision: "accept", proposedGrade: "B" }, 409, /now proposes A/],
    ];
    for (const [body, status, message] of cases) {
      const res = await api<ErrorBody>(world.auditor, "POST", `/api/rechecks/${recheckId}/submission`, body);
      expect(res.status, JSON.stringify(body)).toBe(status);
      expect(res.body.error.message).toMatch(message);
    }
    const other = await api<ErrorBody>(world.auditor2, "POST", `/api/rechecks/${recheckId}/submission`, { decision: "accept", proposedGrade: "A" });
    expect(other.status).toBe(409);
    expect((await api(world.auditor, "POST", `/api/rechecks/${ZERO}/submission`, { decision: "accept", proposedGrade: "A" })).status).toBe(404);
    const [row] = await db().select().from(rechecks).where(eq(rechecks.id, recheckId));
    expect(row).toMatchObject({ status: "waiting", submittedAt: null, recheckGrade: null, comparison: null });
  });

  it("the auditor marks their own regions, measures and grades; the comparison is stored and differing grades go to adjudication", async () => {
    // A smaller scratch than the first grader's 12 × 10: 10 × 4 = 40 px = 0.4 % of the lens window → A under v1 (first: C).
    const regions = {
      regions: [{ id: "audit-1", defect: "scratch", shape: { kind: "rect", x: 60, y: 60, width: 10, height: 4 } }],
      surfaces: [
        {
          id: "audit-surface",
          shape: {
            kind: "polygon",
            points: [
              [50, 50],
              [250, 50],
              [250, 150],
              [50, 150],
            ],
          },
        },
      ],
      ruler: null,
    };
    const saved = await api(world.auditor, "PUT", `/api/rechecks/${recheckId}/regions`, { photoId: made.photo.id, baseVersion: 0, regions });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    const stale = await api<ErrorBody>(world.auditor, "PUT", `/api/rechecks/${recheckId}/regions`, { photoId: made.photo.id, baseVersion: 0, regions });
    expect(stale.status).toBe(409);
    const measured = await api<{ proposal: { grade: string } }>(world.auditor, "POST", `/api/rechecks/${recheckId}/measure`);
    expect(measured.status, JSON.stringify(measured.body)).toBe(200);
    expect(measured.body.proposal.grade).toBe("A");
    const submitted = await api<{ recheck: { status: string; notBlind: boolean; recheckGrade: string } }>(world.auditor, "POST", `/api/rechecks/${recheckId}/submission`, {
      decision: "accept",
      proposedGrade: "A",
    });
    expect(submitted.status, JSON.stringify(submitted.body)).toBe(201);
    expect(submitted.body.recheck).toMatchObject({ status: "adjudication", notBlind: false, recheckGrade: "A" });
    const [row] = await db().select().from(rechecks).where(eq(rechecks.id, recheckId));
    expect(row.status).toBe("adjudication");
    expect(row.leaseHolderId).toBeNull();
    // Hand-computable: first 12 × 10 = 120 px, recheck 10 × 4 = 40 px inside it → IoU 40 / 120 = 1/3, Dice 80 / 160 = 0.5.
    expect(row.comparison!.classes.scratch).toMatchObject({ firstPx: 120, recheckPx: 40, sharedPx: 40, unionPx: 120 });
    expect(row.comparison!.classes.scratch.iou).toBeCloseTo(1 / 3, 10);
    expect(row.comparison!.classes.scratch.dice).toBeCloseTo(0.5, 10);
    expect(row.comparison!.grade).toMatchObject({ first: "C", recheck: "A", steps: 2 });
    expect(row.adjudicationReasons!.map((r) => r.kind)).toContain("grade_differs");
    // Submitted: the Gallery item made from the unit is visible to auditors again.
    expect((await api(world.auditor, "GET", `/api/gallery/${galleryItemId}`)).status).toBe(200);
    // Submitted: no second submission.
    expect((await api(world.auditor, "POST", `/api/rechecks/${recheckId}/submission`, { decision: "accept", proposedGrade: "A" })).status).toBe(409);
  });
});
