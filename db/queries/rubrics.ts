import "server-only";
import { and, asc, desc, eq, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db, type DbOrTx } from "@/db/client";
import { partTypes, rubricVersions, users } from "@/db/schema";
import type { Rubric } from "@/lib/grading/rubric-schema";

type PartTypeKey = { workspaceId: string; partTypeId: string };

/** The columns grading reads from a part type, scoped by workspace. */
export async function getGradingPartType({ workspaceId, partTypeId }: PartTypeKey, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({
      id: partTypes.id,
      slug: partTypes.slug,
      name: partTypes.name,
      category: partTypes.category,
      views: partTypes.views,
      defectClasses: partTypes.defectClasses,
      nominalSizeMm: partTypes.nominalSizeMm,
      panelResolution: partTypes.panelResolution,
    })
    .from(partTypes)
    .where(and(eq(partTypes.workspaceId, workspaceId), eq(partTypes.id, partTypeId)))
    .limit(1);
  return row;
}
export type GradingPartTypeRow = NonNullable<Awaited<ReturnType<typeof getGradingPartType>>>;

/** Part types of a workspace with their rubric state, for the Rubrics screen's picker. */
export async function listPartTypesWithRubrics({ workspaceId }: { workspaceId: string }) {
  const latest = sql<number | null>`max(${rubricVersions.version}) filter (where ${rubricVersions.status} = 'published')`;
  const draft = sql<number | null>`max(${rubricVersions.version}) filter (where ${rubricVersions.status} = 'draft')`;
  return db()
    .select({ id: partTypes.id, slug: partTypes.slug, name: partTypes.name, active: partTypes.active, publishedVersion: latest, draftVersion: draft })
    .from(partTypes)
    .leftJoin(rubricVersions, and(eq(rubricVersions.partTypeId, partTypes.id), eq(rubricVersions.workspaceId, workspaceId)))
    .where(eq(partTypes.workspaceId, workspaceId))
    .groupBy(partTypes.id)
    .orderBy(asc(sql`lower(${partTypes.name})`));
}

const creators = alias(users, "creators");
const publishers = alias(users, "publishers");
const editors = alias(users, "editors");

const versionColumns = {
  id: rubricVersions.id,
  partTypeId: rubricVersions.partTypeId,
  version: rubricVersions.version,
  status: rubricVersions.status,
  rubric: rubricVersions.rubric,
  basedOnVersion: rubricVersions.basedOnVersion,
  revision: rubricVersions.revision,
  createdAt: rubricVersions.createdAt,
  createdByName: creators.name,
  updatedAt: rubricVersions.updatedAt,
  updatedByName: editors.name,
  publishedAt: rubricVersions.publishedAt,
  publishedByName: publishers.name,
};

function selectVersions(tx: DbOrTx) {
  return tx
    .select(versionColumns)
    .from(rubricVersions)
    .leftJoin(creators, eq(creators.id, rubricVersions.createdBy))
    .leftJoin(editors, eq(editors.id, rubricVersions.updatedBy))
    .leftJoin(publishers, eq(publishers.id, rubricVersions.publishedBy));
}
export type RubricVersionView = Awaited<ReturnType<typeof listRubricVersions>>[number];

/** Every version of a part type's rubric, newest first. */
export function listRubricVersions({ workspaceId, partTypeId }: PartTypeKey, tx: DbOrTx = db()) {
  return selectVersions(tx)
    .where(and(eq(rubricVersions.workspaceId, workspaceId), eq(rubricVersions.partTypeId, partTypeId)))
    .orderBy(desc(rubricVersions.version));
}

export async function getRubricVersion({ workspaceId, partTypeId, version }: PartTypeKey & { version: number }, tx: DbOrTx = db()) {
  const [row] = await selectVersions(tx)
    .where(and(eq(rubricVersions.workspaceId, workspaceId), eq(rubricVersions.partTypeId, partTypeId), eq(rubricVersions.version, version)))
    .limit(1);
  return row;
}

export async function getRubricVersionById({ workspaceId, id }: { workspaceId: string; id: string }, tx: DbOrTx = db()) {
  const [row] = await selectVersions(tx)
    .where(and(eq(rubricVersions.workspaceId, workspaceId), eq(rubricVersions.id, id)))
    .limit(1);
  return row;
}

export async function getDraft({ workspaceId, partTypeId }: PartTypeKey, tx: DbOrTx = db()) {
  const [row] = await selectVersions(tx)
    .where(and(eq(rubricVersions.workspaceId, workspaceId), eq(rubricVersions.partTypeId, partTypeId), eq(rubricVersions.status, "draft")))
    .limit(1);
  return row;
}

/** Locks the part type's row so concurrent draft/publish actions on it run one after another. */
export async function lockPartType(tx: DbOrTx, { workspaceId, partTypeId }: PartTypeKey) {
  const [row] = await tx
    .select({ id: partTypes.id })
    .from(partTypes)
    .where(and(eq(partTypes.workspaceId, workspaceId), eq(partTypes.id, partTypeId)))
    .for("update");
  return row;
}

export async function insertRubricVersion(tx: DbOrTx, row: PartTypeKey & { version: number; rubric: Rubric; basedOnVersion: number | null; actorId: string | null; status?: "draft" | "published" }) {
  const published = row.status === "published";
  const [inserted] = await tx
    .insert(rubricVersions)
    .values({
      workspaceId: row.workspaceId,
      partTypeId: row.partTypeId,
      version: row.version,
      status: row.status ?? "draft",
      rubric: row.rubric,
      basedOnVersion: row.basedOnVersion,
      createdBy: row.actorId,
      updatedBy: row.actorId,
      publishedBy: published ? row.actorId : null,
      publishedAt: published ? new Date() : null,
    })
    .returning({ id: rubricVersions.id, version: rubricVersions.version });
  return inserted;
}

/**
 * Changes a draft's rules and counts the edit; the status test in the WHERE clause keeps
 * published rows untouched, the revision test refuses (no row) a save based on an older edit.
 */
export async function updateDraftRubric(tx: DbOrTx, { workspaceId, partTypeId, rubric, actorId, revision }: PartTypeKey & { rubric: Rubric; actorId: string; revision: number }) {
  const [row] = await tx
    .update(rubricVersions)
    .set({ rubric, updatedBy: actorId, updatedAt: new Date(), revision: sql`${rubricVersions.revision} + 1` })
    .where(and(eq(rubricVersions.workspaceId, workspaceId), eq(rubricVersions.partTypeId, partTypeId), eq(rubricVersions.status, "draft"), eq(rubricVersions.revision, revision)))
    .returning({ version: rubricVersions.version, revision: rubricVersions.revision });
  return row;
}

export async function markDraftPublished(tx: DbOrTx, { workspaceId, partTypeId, actorId }: PartTypeKey & { actorId: string }) {
  const now = new Date();
  const [row] = await tx
    .update(rubricVersions)
    .set({ status: "published", publishedBy: actorId, publishedAt: now, updatedAt: now })
    .where(and(eq(rubricVersions.workspaceId, workspaceId), eq(rubricVersions.partTypeId, partTypeId), eq(rubricVersions.status, "draft")))
    .returning({ id: rubricVersions.id, version: rubricVersions.version });
  return row;
}

/** The latest published version of a part type (the one that grades new measurements). */
export async function getLatestPublished({ workspaceId, partTypeId }: PartTypeKey, tx: DbOrTx = db()) {
  const [row] = await selectVersions(tx)
    .where(and(eq(rubricVersions.workspaceId, workspaceId), eq(rubricVersions.partTypeId, partTypeId), eq(rubricVersions.status, "published")))
    .orderBy(desc(rubricVersions.version))
    .limit(1);
  return row;
}
