/**
 * Fixture ids for the learned-suggestion routes in the access matrix: the workspace's latest
 * training job, and a stored model (not in use, so the Bench never runs it) that decisions can name.
 */
import { db } from "@/db/client";
import { sql } from "drizzle-orm";
import { suggestionModels } from "@/db/schema";
import type { RegionModel } from "@/lib/imaging/learned";
import { api, type Session } from "./http";

/**
 * Waits until no learned-suggestion training is waiting or running in the worker. The access
 * matrix asks for trainings (POST /api/suggestion-models answers 202 and the worker trains for
 * 20–60 s), so a file that asks for them waits here before it ends: a training that finishes
 * during the next file adds a model and an activity row under it (bad-input.test.ts compares row
 * counts before and after each case). A state, polled with a deadline.
 */
export async function waitForTrainingsToFinish(deadlineMs = 240_000): Promise<void> {
  const deadline = Date.now() + deadlineMs;
  for (;;) {
    const { rows } = await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'suggestion-training' AND state IN ('created', 'retry', 'active')`);
    if (rows[0].n === 0) return;
    if (Date.now() > deadline) throw new Error(`${rows[0].n} learned-suggestion training job(s) still waiting or running after ${deadlineMs / 1000} s.`);
    await new Promise((resolve) => setTimeout(resolve, 500));
  }
}

export async function suggestionFixtureIds(lead: Session): Promise<Record<string, string>> {
  const me = await api<{ user: { workspaceId: string } }>(lead, "GET", "/api/me");
  const queued = await api<{ jobId: string | null }>(lead, "POST", "/api/suggestion-models", {});
  if (queued.status !== 202) throw new Error(`Fixture training request failed: ${JSON.stringify(queued.body)}`);
  // null when one was already waiting (stately queue): take the newest job of this workspace.
  const result = await db().execute<{ id: string }>(
    sql`SELECT id FROM pgboss.job WHERE name = 'suggestion-training' AND data->>'workspaceId' = ${me.body.user.workspaceId} ORDER BY created_on DESC LIMIT 1`,
  );
  const trainingJobId = queued.body.jobId ?? result.rows[0]?.id;
  if (!trainingJobId) throw new Error("No training job found for the fixture workspace.");
  const [model] = await db()
    .insert(suggestionModels)
    .values({
      workspaceId: me.body.user.workspaceId,
      version: sql`(SELECT coalesce(max(version), 0) + 1 FROM suggestion_models WHERE workspace_id = ${me.body.user.workspaceId})`,
      model: {} as RegionModel,
      classCounts: {},
      sources: { unitPhotos: 0, galleryPhotos: 0, dismissalPhotos: 0, testPhotos: 0, acceptedRegions: 0 },
      evaluation: { iouThreshold: 0.3, photos: 0, byClass: {} },
      suggestable: [],
      decision: "Access-matrix fixture.",
      trainingMs: 0,
    })
    .returning({ id: suggestionModels.id });
  return { trainingJobId, suggestionModelId: model.id };
}
