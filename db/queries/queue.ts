import "server-only";
/**
 * The queue's reads: a keyset page, depth and throughput, "is anything waiting", and the screen's
 * filter choices. Claims and lease changes are writes of a unit's status: ./unit-status.ts.
 *
 * The page, the probe and the claim (unit-status.ts) run as named prepared statements
 * (executePrepared, planned once per connection without parameter values; see db/client.ts and
 * DEVELOPERS.md "Hot-path SQL"). So each is written as an index walk that suits every value, and the
 * statuses a partial index names (db/schema/lots.ts: units_open_queue_idx, units_queued_by_lot_idx,
 * …) appear in the SQL as literals: a `status = $1` cannot use an index `WHERE status = 'queued'`,
 * and the generic plan would then scan the table.
 */
import { and, asc, eq, sql, type SQL } from "drizzle-orm";
import { db, executePrepared } from "@/db/client";
import { lots, partTypes, suppliers } from "@/db/schema";
import type { UnitStatus } from "@/db/schema/lots";
import type { QueueKey } from "@/lib/queue/cursor";
import type { QueueFilters } from "@/lib/queue/schemas";

/** A status as an SQL literal. Only the constants below come here, never input. */
const statusLiteral = (status: UnitStatus) => sql.raw(`'${status}'`);
/** Waiting in the queue, as units_queued_by_lot_idx names it. */
export const QUEUED_LITERAL = statusLiteral("queued");
/** On somebody's bench (the lease may have run out), as units_lease_expiry_idx names it. */
export const ON_BENCH_LITERAL = statusLiteral("on_bench");

export function filterSql(filters: QueueFilters): SQL {
  const parts: SQL[] = [];
  if (filters.partTypeId) parts.push(sql`AND u.part_type_id = ${filters.partTypeId}`);
  if (filters.supplierId) parts.push(sql`AND u.supplier_id = ${filters.supplierId}`);
  if (filters.lotId) parts.push(sql`AND u.lot_id = ${filters.lotId}`);
  return sql.join(parts, sql` `);
}

/**
 * Queued units of open lots that match the filters, in Take next order: the claim's candidates.
 * With the ORDER BY (and a LIMIT) the planner walks units_queue_idx or the filter's index
 * (units_queued_by_lot_idx, units_open_by_part_type_idx, …) and stops at the first open row.
 */
export function queuedInTakeNextOrder(workspaceId: string, filters: QueueFilters, extraCondition: SQL = sql``): SQL {
  return sql`
      SELECT u.id FROM units u
      WHERE u.workspace_id = ${workspaceId}
        AND u.status = ${QUEUED_LITERAL}
        AND EXISTS (SELECT 1 FROM lots l WHERE l.id = u.lot_id AND l.status = 'open')
        ${extraCondition}
        ${filterSql(filters)}
      ORDER BY u.lot_due_on, u.lot_received_on, u.lot_created_at, u.lot_id, u.sample_index, u.id
      LIMIT 1`;
}

/**
 * True when a unit is waiting (read without locks, so rows other claimers are busy with count too):
 * a queued unit, or a unit whose lease has run out. Asked as two probes, each on its own index.
 * One EXISTS over "queued OR expired" let the planner pick a sequential scan, betting on finding
 * a row early, while most units of a big workspace are graded: 70–170 ms at 125 000 units for
 * the answer "nothing waiting" (an EXISTS would also drop the ORDER BY that steers the first probe).
 */
export async function anythingWaiting({ workspaceId, filters }: { workspaceId: string; filters: QueueFilters }): Promise<boolean> {
  const { rows } = await executePrepared<{ waiting: boolean }>(sql`
    SELECT (${queuedInTakeNextOrder(workspaceId, filters)}) IS NOT NULL
      OR EXISTS (
        SELECT 1 FROM units u
        WHERE u.workspace_id = ${workspaceId} AND u.status = ${ON_BENCH_LITERAL} AND u.lease_expires_at < now()
          AND EXISTS (SELECT 1 FROM lots l WHERE l.id = u.lot_id AND l.status = 'open')
          ${filterSql(filters)}
      ) AS waiting`);
  return rows[0]?.waiting ?? false;
}

export type QueuePageRow = {
  id: string;
  serial: string | null;
  sample_index: number;
  status: UnitStatus;
  /** The lease has not run out, by the database's clock. */
  lease_active: boolean;
  lot_id: string;
  purchase_ref: string;
  part_type_id: string;
  part_type_name: string;
  supplier_name: string;
  lot_due_on: string;
  lot_received_on: string;
  /** Microsecond text, so the cursor compares exactly (a JS Date would round to milliseconds). */
  lot_created_at: string;
  holder_id: string | null;
  holder_name: string | null;
  claimed_at: Date | null;
  lease_expires_at: Date | null;
};

/**
 * Up to `limit` rows of the queue (waiting units and units on a bench, in open lots) next to the
 * sort key `from`: after it, or, `backwards`, the ones just before it (for a previous page). Rows
 * come back in Take next order either way. No OFFSET, so deep pages cost the same as the first.
 */
export async function listQueuePage({
  workspaceId,
  filters,
  from,
  backwards = false,
  limit,
}: {
  workspaceId: string;
  filters: QueueFilters;
  from: QueueKey | null;
  backwards?: boolean;
  limit: number;
}): Promise<QueuePageRow[]> {
  const keyset = from
    ? sql`AND (u.lot_due_on, u.lot_received_on, u.lot_created_at, u.lot_id, u.sample_index, u.id)
          ${sql.raw(backwards ? "<" : ">")} (${from.dueOn}::date, ${from.receivedOn}::date, ${from.lotCreatedAt}::timestamptz, ${from.lotId}::uuid, ${from.sampleIndex}, ${from.id}::uuid)`
    : sql``;
  const direction = sql.raw(backwards ? "DESC" : "ASC");
  // The page is cut from units alone (walking units_open_queue_idx, or the part type's or
  // supplier's units_open_by_* index, in order — backwards for a previous page: the same index,
  // 0.1 ms either way at 120 000 units), then the few rows are joined; joining first lets the
  // planner misjudge the row count and sort the whole queue.
  const { rows } = await executePrepared<QueuePageRow>(sql`
    WITH page AS MATERIALIZED (
      SELECT u.* FROM units u
      WHERE u.workspace_id = ${workspaceId}
        AND u.status IN (${QUEUED_LITERAL}, ${ON_BENCH_LITERAL})
        AND EXISTS (SELECT 1 FROM lots l WHERE l.id = u.lot_id AND l.status = 'open')
        ${filterSql(filters)}
        ${keyset}
      ORDER BY u.lot_due_on ${direction}, u.lot_received_on ${direction}, u.lot_created_at ${direction}, u.lot_id ${direction}, u.sample_index ${direction}, u.id ${direction}
      LIMIT ${limit}
    )
    SELECT u.id, u.serial, u.sample_index, u.status, (u.lease_expires_at > now()) AS lease_active,
           u.lot_id, l.purchase_ref, u.part_type_id, pt.name AS part_type_name, s.name AS supplier_name,
           to_char(u.lot_due_on, 'YYYY-MM-DD') AS lot_due_on, to_char(u.lot_received_on, 'YYYY-MM-DD') AS lot_received_on,
           to_char(u.lot_created_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"') AS lot_created_at,
           u.lease_holder_id AS holder_id, h.name AS holder_name, u.claimed_at, u.lease_expires_at
    FROM page u
    JOIN lots l ON l.id = u.lot_id
    JOIN part_types pt ON pt.id = u.part_type_id
    JOIN suppliers s ON s.id = u.supplier_id
    LEFT JOIN users h ON h.id = u.lease_holder_id
    ORDER BY u.lot_due_on, u.lot_received_on, u.lot_created_at, u.lot_id, u.sample_index, u.id`);
  return rows;
}

export type QueueStatsRow = { part_type_id: string; name: string; waiting: number; on_bench: number; graded_today: number; median_minutes: number | null };

/**
 * Per part type: waiting, on bench, graded today (UTC day), median minutes per unit (last 30
 * days). The open queue and the recent grades are counted apart, each from its own index
 * (units_open_queue_idx, units_graded_idx), so the cost follows the queue and the month, not the
 * whole inspection history (one pass over every unit took about 220 ms at 170 000 units).
 */
export async function listQueueStats({ workspaceId }: { workspaceId: string }): Promise<QueueStatsRow[]> {
  const { rows } = await db().execute<QueueStatsRow>(sql`
    WITH open_queue AS (
      SELECT u.part_type_id,
        count(*) FILTER (WHERE u.status = ${QUEUED_LITERAL} OR u.lease_expires_at <= now()) AS waiting,
        count(*) FILTER (WHERE u.status = ${ON_BENCH_LITERAL} AND u.lease_expires_at > now()) AS on_bench
      FROM units u
      WHERE u.workspace_id = ${workspaceId} AND u.status IN (${QUEUED_LITERAL}, ${ON_BENCH_LITERAL})
        AND EXISTS (SELECT 1 FROM lots l WHERE l.id = u.lot_id AND l.status = 'open')
      GROUP BY u.part_type_id
    ), recent_grades AS (
      SELECT u.part_type_id,
        count(*) FILTER (WHERE u.graded_at >= date_trunc('day', now())) AS graded_today,
        percentile_cont(0.5) WITHIN GROUP (ORDER BY extract(epoch FROM (u.graded_at - u.claimed_at)) / 60)
          FILTER (WHERE u.claimed_at IS NOT NULL) AS median_minutes
      FROM units u
      -- The UTC day began less than 30 days ago, so this range holds both figures' units.
      WHERE u.workspace_id = ${workspaceId} AND u.graded_at >= now() - interval '30 days'
      GROUP BY u.part_type_id
    )
    SELECT pt.id AS part_type_id, pt.name,
      coalesce(q.waiting, 0)::int AS waiting, coalesce(q.on_bench, 0)::int AS on_bench,
      coalesce(g.graded_today, 0)::int AS graded_today, g.median_minutes
    FROM part_types pt
    LEFT JOIN open_queue q ON q.part_type_id = pt.id
    LEFT JOIN recent_grades g ON g.part_type_id = pt.id
    WHERE pt.workspace_id = ${workspaceId} AND (q.part_type_id IS NOT NULL OR g.part_type_id IS NOT NULL)
    ORDER BY pt.name`);
  return rows;
}

/** What the Queue screen's filters offer: part types, suppliers and open lots (earliest due first). */
export async function listQueueFilterChoices({ workspaceId }: { workspaceId: string }) {
  const [partTypeRows, supplierRows, openLots] = await Promise.all([
    db().select({ id: partTypes.id, name: partTypes.name }).from(partTypes).where(eq(partTypes.workspaceId, workspaceId)).orderBy(asc(partTypes.name)),
    db().select({ id: suppliers.id, name: suppliers.name }).from(suppliers).where(eq(suppliers.workspaceId, workspaceId)).orderBy(asc(suppliers.name)),
    db()
      .select({ id: lots.id, purchaseRef: lots.purchaseRef, dueOn: lots.dueOn })
      .from(lots)
      .where(and(eq(lots.workspaceId, workspaceId), eq(lots.status, "open")))
      .orderBy(asc(lots.dueOn)),
  ]);
  return { partTypes: partTypeRows, suppliers: supplierRows, openLots };
}
