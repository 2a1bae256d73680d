import "server-only";
import { sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import type { Shape } from "@/lib/geometry/shape";

type LotKey = { workspaceId: string; lotId: string };

/**
 * Per unit of the lot and defect class: the separate defects the measurement under the unit's
 * current grade counted (summed over its photos). Units without a grade or without defects have
 * no rows.
 */
export async function listLotUnitDefects({ workspaceId, lotId }: LotKey, tx: DbOrTx = db()) {
  const { rows } = await tx.execute<{ unit_id: string; defect: string; defects: number }>(sql`
    SELECT cur.unit_id, d.key AS defect, sum((d.value->>'count')::int)::int AS defects
    FROM units u
    CROSS JOIN LATERAL (SELECT g.unit_id, g.measurement_ids FROM grades g WHERE g.workspace_id = u.workspace_id AND g.unit_id = u.id ORDER BY g.created_at DESC, g.id DESC LIMIT 1) cur
    JOIN measurements m ON m.workspace_id = u.workspace_id AND m.id = ANY(cur.measurement_ids) AND m.photo_id IS NOT NULL
    CROSS JOIN LATERAL jsonb_each(m.result->'measurement'->'byDefect') d
    WHERE u.workspace_id = ${workspaceId} AND u.lot_id = ${lotId} AND (d.value->>'count')::int > 0
    GROUP BY cur.unit_id, d.key`);
  return rows.map((r) => ({ unitId: r.unit_id, defect: r.defect, defects: r.defects }));
}

export type LotReportPhotoRow = {
  photoId: string;
  unitId: string;
  viewKey: string;
  previewKey: string | null;
  width: number;
  height: number;
  regions: { role: "defect" | "surface"; defect: string | null; shape: Shape }[];
};

/** The current photos of some units of the lot that carry at least one defect region, with their defect and Surface regions. */
export async function listLotReportPhotos({ workspaceId, lotId, unitIds }: LotKey & { unitIds: string[] }, tx: DbOrTx = db()): Promise<LotReportPhotoRow[]> {
  if (unitIds.length === 0) return [];
  const { rows } = await tx.execute<{ id: string; unit_id: string; view_key: string; preview_key: string | null; width: number; height: number; regions: LotReportPhotoRow["regions"] }>(sql`
    SELECT p.id, p.unit_id, p.view_key, p.preview_key, p.width, p.height,
      (SELECT jsonb_agg(jsonb_build_object('role', r.role, 'defect', r.defect_class, 'shape', r.shape) ORDER BY r.position, r.created_at, r.client_id)
         FROM regions r WHERE r.workspace_id = p.workspace_id AND r.photo_id = p.id AND r.role IN ('defect', 'surface')) AS regions
    FROM photos p JOIN units u ON u.id = p.unit_id AND u.workspace_id = p.workspace_id
    WHERE p.workspace_id = ${workspaceId} AND u.lot_id = ${lotId} AND p.removed_at IS NULL AND p.status = 'ready'
      AND p.unit_id IN (${sql.join(
        unitIds.map((id) => sql`${id}`),
        sql`, `,
      )})
      AND EXISTS (SELECT 1 FROM regions r WHERE r.workspace_id = p.workspace_id AND r.photo_id = p.id AND r.role = 'defect')
    ORDER BY u.sample_index, p.created_at, p.id`);
  return rows.map((r) => ({ photoId: r.id, unitId: r.unit_id, viewKey: r.view_key, previewKey: r.preview_key, width: r.width, height: r.height, regions: r.regions ?? [] }));
}
