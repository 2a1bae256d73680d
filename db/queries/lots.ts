import "server-only";
import { and, asc, desc, eq, ilike, inArray, isNotNull, sql, type SQL } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { runReads } from "@/db/run-reads";
import { checklistResults, grades, inspectionSchemes, lots, measurements, partTypes, rubricVersions, suppliers, units, users } from "@/db/schema";
import type { InspectionScheme, Lot, NewLot, SampleDraw } from "@/db/schema/lots";
import type { DefectSeverity } from "@/lib/part-types/severity";
import type { Grade, Rule } from "@/lib/grading/rubric-schema";
import type { LotListQuery } from "@/lib/lots/schemas";

const lotColumns = {
  lot: lots,
  supplierName: suppliers.name,
  partTypeName: partTypes.name,
  partTypeCategory: partTypes.category,
  checklistItemIds: sql<string[]>`(SELECT coalesce(jsonb_agg(item->>'id'), '[]'::jsonb) FROM jsonb_array_elements(${partTypes.checklist}) AS item)`,
};

export type LotRow = NonNullable<Awaited<ReturnType<typeof getLot>>>;

export async function getLot({ workspaceId, lotId }: { workspaceId: string; lotId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ ...lotColumns, createdByName: users.name })
    .from(lots)
    .innerJoin(suppliers, eq(suppliers.id, lots.supplierId))
    .innerJoin(partTypes, eq(partTypes.id, lots.partTypeId))
    .innerJoin(users, eq(users.id, lots.createdBy))
    .where(and(eq(lots.workspaceId, workspaceId), eq(lots.id, lotId)))
    .limit(1);
  return row;
}

/** The lot row alone, locked for the rest of the transaction (decisions and unit creation). */
export async function lockLot(tx: DbOrTx, { workspaceId, lotId }: { workspaceId: string; lotId: string }) {
  const [row] = await tx
    .select()
    .from(lots)
    .where(and(eq(lots.workspaceId, workspaceId), eq(lots.id, lotId)))
    .for("update");
  return row;
}

/** Stores how the lot's sample was drawn (once, with its units). */
export async function setLotSampleDraw(tx: DbOrTx, { workspaceId, lotId, seed, draw }: { workspaceId: string; lotId: string; seed: string | null; draw: SampleDraw }) {
  await tx
    .update(lots)
    .set({ sampleSeed: seed, sampleDraw: draw, updatedAt: new Date() })
    .where(and(eq(lots.workspaceId, workspaceId), eq(lots.id, lotId)));
}

export async function insertLot(tx: DbOrTx, values: NewLot) {
  const [row] = await tx.insert(lots).values(values).returning();
  return row;
}

/** The lead's decision on a locked open lot. */
export async function recordLotDecision(
  tx: DbOrTx,
  { workspaceId, lotId, decision }: { workspaceId: string; lotId: string; decision: Pick<Lot, "verdict" | "disposition" | "dispositionReason" | "decisionCounts" | "decidedBy"> & { decidedAt: Date } },
) {
  const [row] = await tx
    .update(lots)
    .set({ status: "decided", ...decision, updatedAt: decision.decidedAt })
    .where(and(eq(lots.workspaceId, workspaceId), eq(lots.id, lotId)))
    .returning();
  return row;
}

const sortColumns = {
  dueOn: lots.dueOn,
  receivedOn: lots.receivedOn,
  createdAt: lots.createdAt,
  purchaseRef: sql`lower(${lots.purchaseRef})`,
  supplier: sql`lower(${suppliers.name})`,
  partType: sql`lower(${partTypes.name})`,
  quantity: lots.quantity,
  status: lots.status,
} satisfies Record<LotListQuery["sort"], unknown>;

export async function listLots({ workspaceId, query }: { workspaceId: string; query: LotListQuery }) {
  const where: SQL[] = [eq(lots.workspaceId, workspaceId)];
  if (query.status !== "all") where.push(eq(lots.status, query.status));
  if (query.supplierId) where.push(eq(lots.supplierId, query.supplierId));
  if (query.partTypeId) where.push(eq(lots.partTypeId, query.partTypeId));
  if (query.search) where.push(ilike(lots.purchaseRef, `%${query.search.replace(/[%_\\]/g, (c) => `\\${c}`)}%`));
  const order = query.dir === "asc" ? asc : desc;
  const [rows, [{ total }]] = await Promise.all([
    db()
      .select(lotColumns)
      .from(lots)
      .innerJoin(suppliers, eq(suppliers.id, lots.supplierId))
      .innerJoin(partTypes, eq(partTypes.id, lots.partTypeId))
      .where(and(...where))
      // The id keeps the order stable between pages when the sort key ties.
      .orderBy(order(sortColumns[query.sort] as SQL), desc(lots.createdAt), asc(lots.id))
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize),
    db()
      .select({ total: sql<number>`count(*)::int` })
      .from(lots)
      .innerJoin(suppliers, eq(suppliers.id, lots.supplierId))
      .innerJoin(partTypes, eq(partTypes.id, lots.partTypeId))
      .where(and(...where)),
  ]);
  return { rows, total };
}

/**
 * What the running verdicts of some lots rest on: their units, checklist results, each graded
 * unit's current grade (the last row of its history, with the defect severities and labels stored
 * with the measurement it rests on), the rules of the rubric versions those grades used, and which
 * of the lots' part types have a published rubric.
 */
export async function loadLotEvidence({ workspaceId, lotIds }: { workspaceId: string; lotIds: string[] }, tx: DbOrTx = db()) {
  if (lotIds.length === 0) return { units: [], results: [], grades: [], rubricRules: new Map<string, Rule[]>(), gradedPartTypeIds: new Set<string>() };
  const [unitRows, resultRows, gradeRows, published] = await runReads(tx, [
    () =>
      tx
        .select({ id: units.id, lotId: units.lotId, sampleIndex: units.sampleIndex, status: units.status })
        .from(units)
        .where(and(eq(units.workspaceId, workspaceId), inArray(units.lotId, lotIds))),
    () =>
      tx
        .select({ unitId: checklistResults.unitId, lotId: units.lotId, itemId: checklistResults.itemId, passed: checklistResults.passed, severityOnFail: checklistResults.severityOnFail })
        .from(checklistResults)
        .innerJoin(units, eq(units.id, checklistResults.unitId))
        .where(and(eq(checklistResults.workspaceId, workspaceId), inArray(units.lotId, lotIds))),
    () =>
      tx.execute<{
        unit_id: string;
        final_grade: Grade;
        lines: { ruleId: string; grade: Grade }[];
        rubric_version_id: string;
        severities: Record<string, DefectSeverity> | null;
        labels: Record<string, string> | null;
      }>(sql`
      SELECT DISTINCT ON (g.unit_id) g.unit_id, g.final_grade, g.explanation->'lines' AS lines, g.rubric_version_id,
        m.result->'defectSeverities' AS severities, m.result->'labels'->'defects' AS labels
      FROM ${grades} g
      JOIN ${units} u ON u.id = g.unit_id
      LEFT JOIN ${measurements} m ON m.id = g.measurement_ids[1] AND m.workspace_id = g.workspace_id
      WHERE g.workspace_id = ${workspaceId} AND u.workspace_id = ${workspaceId} AND u.lot_id IN (${sql.join(
        lotIds.map((id) => sql`${id}`),
        sql`, `,
      )})
      ORDER BY g.unit_id, g.created_at DESC, g.id DESC`),
    () =>
      tx
        .selectDistinct({ partTypeId: rubricVersions.partTypeId })
        .from(rubricVersions)
        .innerJoin(lots, eq(lots.partTypeId, rubricVersions.partTypeId))
        .where(and(eq(rubricVersions.workspaceId, workspaceId), eq(rubricVersions.status, "published"), inArray(lots.id, lotIds))),
  ]);
  const versionIds = [...new Set(gradeRows.rows.map((g) => g.rubric_version_id))];
  const versions = versionIds.length
    ? await tx
        .select({ id: rubricVersions.id, rubric: rubricVersions.rubric })
        .from(rubricVersions)
        .where(and(eq(rubricVersions.workspaceId, workspaceId), inArray(rubricVersions.id, versionIds)))
    : [];
  return {
    units: unitRows,
    results: resultRows,
    grades: gradeRows.rows.map((g) => ({
      unitId: g.unit_id,
      finalGrade: g.final_grade,
      lines: g.lines ?? [],
      rubricVersionId: g.rubric_version_id,
      severities: g.severities ?? {},
      labels: g.labels ?? {},
    })),
    rubricRules: new Map(versions.map((v) => [v.id, v.rubric.rules])),
    gradedPartTypeIds: new Set(published.map((p) => p.partTypeId)),
  };
}

/** A supplier + part type's decided lots in the order their verdicts were recorded. */
export function listDecidedLots({ workspaceId, supplierId, partTypeId }: { workspaceId: string; supplierId: string; partTypeId: string }, tx: DbOrTx = db()) {
  return tx
    .select({
      id: lots.id,
      purchaseRef: lots.purchaseRef,
      inspectionSeverity: lots.inspectionSeverity,
      verdict: lots.verdict,
      plan: lots.plan,
      decisionCounts: lots.decisionCounts,
      decidedAt: lots.decidedAt,
    })
    .from(lots)
    .where(and(eq(lots.workspaceId, workspaceId), eq(lots.supplierId, supplierId), eq(lots.partTypeId, partTypeId), eq(lots.status, "decided"), isNotNull(lots.verdict)))
    .orderBy(asc(lots.decidedAt), asc(lots.createdAt), asc(lots.id));
}

export async function getScheme({ workspaceId, supplierId, partTypeId }: { workspaceId: string; supplierId: string; partTypeId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(inspectionSchemes)
    .where(and(eq(inspectionSchemes.workspaceId, workspaceId), eq(inspectionSchemes.supplierId, supplierId), eq(inspectionSchemes.partTypeId, partTypeId)))
    .limit(1);
  return row;
}

/** The lead's approvals for a supplier + part type, one row per pair. */
export async function upsertScheme(
  tx: DbOrTx,
  pair: { workspaceId: string; supplierId: string; partTypeId: string },
  values: Pick<InspectionScheme, "reducedAllowed" | "steadyProduction" | "resumedAfterLotIds" | "updatedBy" | "updatedAt">,
) {
  await tx
    .insert(inspectionSchemes)
    .values({ ...pair, ...values })
    .onConflictDoUpdate({ target: [inspectionSchemes.workspaceId, inspectionSchemes.supplierId, inspectionSchemes.partTypeId], set: values });
}
