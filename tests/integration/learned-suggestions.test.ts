/**
 * Learned suggestions on the Bench, through the running app and its PostgreSQL (no mocks): ghosts
 * from the workspace's model in use, only where the caller may mark regions now, only classes the
 * model may suggest and the part type has; and the record of what the inspector did with them.
 * The model in use is a fixture: trained here, quickly, on synthetic photos with planted defects
 * (its figures are not what is tested; the API around it is).
 */
import crypto from "node:crypto";
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { photos, suggestionDecisions, suggestionModels, units } from "@/db/schema";
import { renderDefectPhotos } from "@/db/seed/defect-photos";
import { boundsOfShape } from "@/lib/geometry/bounds";
import { trainRegionModel } from "@/lib/imaging/learned";
import type { LearnedSuggestionResponse } from "@/lib/suggestions/dto";
import { createUser, createWorkspace, TEST_PASSWORD } from "../support/db";
import { api, signIn, type Session } from "../support/http";
import { createPlantedPhotos } from "../support/suggestion-training";

type ErrorBody = { error: { code: string; message: string } };

let workspaceId: string;
let inspector: Session;
let auditor: Session;
let otherInspectorId: string;
let modelId: string;
let benchPhotoId: string;
let benchUnitId: string;
let gradedPhotoId: string;
let photoSize: { width: number; height: number };

beforeAll(async () => {
  const ws = await createWorkspace();
  workspaceId = ws.id;
  const lead = await createUser({ workspaceId, roles: ["lead"] });
  const [insp, aud, other] = [await createUser({ workspaceId, roles: ["inspector"] }), await createUser({ workspaceId, roles: ["auditor"] }), await createUser({ workspaceId, roles: ["inspector"] })];
  otherInspectorId = other.id;
  [inspector, auditor] = [await signIn(insp.email, TEST_PASSWORD), await signIn(aud.email, TEST_PASSWORD)];
  const owner = { workspaceId, userId: lead.id };

  const rendered = await renderDefectPhotos(400, 12, 640);
  const model = await trainRegionModel(
    rendered.map((p) => ({ image: p.jpeg, regions: p.regions, surface: [p.surface] })),
    { trees: 8 },
  );
  const [row] = await db()
    .insert(suggestionModels)
    .values({
      workspaceId,
      version: 1,
      model,
      classCounts: {},
      sources: { unitPhotos: 12, galleryPhotos: 0, dismissalPhotos: 0, testPhotos: 0, acceptedRegions: 0 },
      evaluation: { iouThreshold: 0.3, photos: 0, byClass: {} },
      // Scratch and stain may be suggested, crack may not; the part type has scratch and crack but no stain.
      suggestable: [
        { defect: "crack", suggest: false, reason: "fixture" },
        { defect: "scratch", suggest: true, reason: "fixture" },
        { defect: "stain", suggest: true, reason: "fixture" },
      ],
      inUse: true,
      decision: "fixture",
      trainingMs: 0,
    })
    .returning();
  modelId = row.id;

  const bench = await createPlantedPhotos(owner, { train: 1, held: 0, firstIndex: 500, width: 960, status: "on_bench" });
  benchPhotoId = bench.planted[0].photoId;
  benchUnitId = bench.unit.id;
  const [photo] = await db().select({ width: photos.width, height: photos.height }).from(photos).where(eq(photos.id, benchPhotoId));
  photoSize = { width: photo.width!, height: photo.height! };
  gradedPhotoId = (await createPlantedPhotos(owner, { train: 1, held: 0, firstIndex: 501, width: 640 })).planted[0].photoId;
}, 300_000);

describe("learned suggestions on the Bench", { timeout: 120_000 }, () => {
  it("proposes ghosts of the allowed classes the part type has, inside the photo, from the model in use", async () => {
    const res = await api<LearnedSuggestionResponse>(inspector, "POST", `/api/photos/${benchPhotoId}/learned-suggestions`, {});
    expect(res.status).toBe(200);
    expect(res.body.modelId).toBe(modelId);
    expect(res.body.modelVersion).toBe(1);
    expect(res.body.ghosts.length).toBeGreaterThan(0);
    for (const ghost of res.body.ghosts) {
      expect(ghost.defect).toBe("scratch");
      expect(ghost.score).toBeGreaterThan(0);
      expect(ghost.score).toBeLessThanOrEqual(1);
      const box = boundsOfShape(ghost.shape);
      expect(box.minX).toBeGreaterThanOrEqual(0);
      expect(box.maxX).toBeLessThanOrEqual(photoSize.width);
      expect(box.maxY).toBeLessThanOrEqual(photoSize.height);
    }
    // Nothing is stored by asking.
    expect(await db().select().from(suggestionDecisions).where(eq(suggestionDecisions.photoId, benchPhotoId))).toEqual([]);
  });

  it("is refused for a photo the caller may not mark: a graded unit, another inspector's running lease, an auditor, a body it does not know", async () => {
    const graded = await api<ErrorBody>(inspector, "POST", `/api/photos/${gradedPhotoId}/learned-suggestions`, {});
    expect(graded.status).toBe(409);
    expect(graded.body.error.message).toMatch(/graded|record/i);

    await db()
      .update(units)
      .set({ leaseHolderId: otherInspectorId, leaseExpiresAt: new Date(Date.now() + 30 * 60_000) })
      .where(eq(units.id, benchUnitId));
    try {
      const leased = await api<ErrorBody>(inspector, "POST", `/api/photos/${benchPhotoId}/learned-suggestions`, {});
      expect(leased.status).toBe(409);
      expect(leased.body.error.message).toMatch(/bench|read-only/i);
    } finally {
      await db().update(units).set({ leaseHolderId: null, leaseExpiresAt: null }).where(eq(units.id, benchUnitId));
    }

    expect((await api(auditor, "POST", `/api/photos/${benchPhotoId}/learned-suggestions`, {})).status).toBe(403);
    expect((await api(inspector, "POST", `/api/photos/${crypto.randomUUID()}/learned-suggestions`, {})).status).toBe(404);
    const extra = await api<ErrorBody>(inspector, "POST", `/api/photos/${benchPhotoId}/learned-suggestions`, { kind: "surface" });
    expect(extra.status).toBe(400);
  });

  it("records accepted and dismissed ghosts with who decided, and writes nothing for a bad request", async () => {
    const { body } = await api<LearnedSuggestionResponse>(inspector, "POST", `/api/photos/${benchPhotoId}/learned-suggestions`, {});
    const [first] = body.ghosts;
    const decisions = [
      { defect: first.defect, shape: first.shape, score: first.score, decision: "accepted" },
      { defect: "crack", shape: { kind: "spot", x: 20, y: 20, radius: 6 }, score: 0.4, decision: "dismissed" },
    ];
    const outside = { defect: "scratch", shape: { kind: "rect", x: photoSize.width - 5, y: 10, width: 50, height: 10 }, score: 0.5, decision: "dismissed" };
    const refused = [
      await api<ErrorBody>(inspector, "POST", `/api/photos/${benchPhotoId}/suggestion-decisions`, { modelId: crypto.randomUUID(), decisions }),
      await api<ErrorBody>(inspector, "POST", `/api/photos/${benchPhotoId}/suggestion-decisions`, { modelId, decisions: [...decisions, { ...decisions[1], defect: "stain" }] }),
      await api<ErrorBody>(inspector, "POST", `/api/photos/${benchPhotoId}/suggestion-decisions`, { modelId, decisions: [...decisions, outside] }),
      await api<ErrorBody>(inspector, "POST", `/api/photos/${benchPhotoId}/suggestion-decisions`, { modelId, decisions: [{ ...decisions[0], decision: "maybe" }] }),
    ];
    expect(refused.map((r) => r.status)).toEqual([404, 400, 400, 400]);
    expect(refused[1].body.error.message).toMatch(/stain/);
    expect(refused[2].body.error.message).toMatch(/outside the photo/);
    expect(await db().select().from(suggestionDecisions).where(eq(suggestionDecisions.photoId, benchPhotoId))).toEqual([]);

    const ok = await api<{ recorded: number }>(inspector, "POST", `/api/photos/${benchPhotoId}/suggestion-decisions`, { modelId, decisions });
    expect(ok.status).toBe(201);
    expect(ok.body.recorded).toBe(2);
    const rows = await db()
      .select()
      .from(suggestionDecisions)
      .where(and(eq(suggestionDecisions.workspaceId, workspaceId), eq(suggestionDecisions.photoId, benchPhotoId)))
      .orderBy(suggestionDecisions.decision);
    expect(rows.map((r) => [r.decision, r.defectClass, r.modelId])).toEqual([
      ["accepted", first.defect, modelId],
      ["dismissed", "crack", modelId],
    ]);
    const [me] = await api<{ user: { id: string } }>(inspector, "GET", "/api/me").then((r) => [r.body.user]);
    expect(new Set(rows.map((r) => r.decidedBy))).toEqual(new Set([me.id]));
  });
});
