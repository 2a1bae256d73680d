/** Fixture id for the training-job route in the access matrix: the workspace's latest training job. */
import { db } from "@/db/client";
import { sql } from "drizzle-orm";
import { api, type Session } from "./http";

export async function suggestionFixtureIds(lead: Session): Promise<Record<string, string>> {
  const me = await api<{ user: { workspaceId: string } }>(lead, "GET", "/api/me");
  const queued = await api<{ jobId: string | null }>(lead, "POST", "/api/suggestion-models", {});
  if (queued.status !== 202) throw new Error(`Fixture training request failed: ${JSON.stringify(queued.body)}`);
  // null when one was already waiting (stately queue): take the newest job of this workspace.
  const result = await db().execute<{ id: string }>(sql`SELECT id FROM pgboss.job WHERE name = 'suggestion-training' AND data->>'workspaceId' = ${me.body.user.workspaceId} ORDER BY created_on DESC LIMIT 1`);
  const trainingJobId = queued.body.jobId ?? result.rows[0]?.id;
  if (!trainingJobId) throw new Error("No training job found for the fixture workspace.");
  return { trainingJobId };
}
