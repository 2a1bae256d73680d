import "server-only";
import { sql } from "drizzle-orm";
import { db, executePrepared } from "@/db/client";
import { decodeCursor, encodeCursor, type QueueKey } from "./cursor";
import { filterSql, ON_BENCH_LITERAL, QUEUED_LITERAL } from "./queue";
import type { QueueFilters } from "./schemas";

export type QueueRow = {
  id: string;
  serial: string | null;
  sampleIndex: number;
  status: "waiting" | "on_bench";
  lotId: string;
  purchaseRef: string;
  partTypeId: string;
  partTypeName: string;
  supplierName: string;
  dueOn: string;
  receivedOn: string;
  holder: { id: string; name: string; since: string; leaseExpiresAt: string } | null;
};

type Raw = {
  id: string;
  serial: string | null;
  sample_index: number;
  status: string;
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

export type QueuePage = { units: QueueRow[]; nextCursor: string | null; prevCursor: string | null };

const keyOf = (r: Raw) => encodeCursor({ dueOn: r.lot_due_on, receivedOn: r.lot_received_on, lotCreatedAt: r.lot_created_at, lotId: r.lot_id, sampleIndex: r.sample_index, id: r.id });

/**
 * One keyset page of the queue (waiting units and units on a bench, in open lots), in Take next
 * order: the units after `cursor`, or the units just before `before` (the page before a page, for
 * Previous; walked backwards on the same index). A cursor is a row's sort key; no OFFSET, so deep
 * pages cost the same as the first. `nextCursor` / `prevCursor` open the pages on either side (null
 * when nothing is there; after a `before` page the page it came from is assumed to follow).
 */
export async function listQueue({ workspaceId, filters, cursor, before, limit }: { workspaceId: string; filters: QueueFilters; cursor?: string; before?: string; limit: number }): Promise<QueuePage> {
  const backwards = before !== undefined;
  const from: QueueKey | null = before !== undefined ? decodeCursor(before) : cursor ? decodeCursor(cursor) : null;
  const keyset = from
    ? sql`AND (u.lot_due_on, u.lot_received_on, u.lot_created_at, u.lot_id, u.sample_index, u.id)
          ${backwards ? sql.raw("<") : sql.raw(">")} (${from.dueOn}::date, ${from.receivedOn}::date, ${from.lotCreatedAt}::timestamptz, ${from.lotId}::uuid, ${from.sampleIndex}, ${from.id}::uuid)`
    : sql``;
  const direction = sql.raw(backwards ? "DESC" : "ASC");
  // The page is cut from units alone (walking units_open_queue_idx, or the part type's or
  // supplier's units_open_by_* index, in order — backwards for a previous page), then the few rows
  // are joined; joining first lets the planner misjudge the row count and sort the whole queue.
  const { rows } = await executePrepared<Raw>(sql`
    WITH page AS MATERIALIZED (
      SELECT u.* FROM units u
      WHERE u.workspace_id = ${workspaceId}
        AND u.status IN (${QUEUED_LITERAL}, ${ON_BENCH_LITERAL})
        AND EXISTS (SELECT 1 FROM lots l WHERE l.id = u.lot_id AND l.status = 'open')
        ${filterSql(filters)}
        ${keyset}
      ORDER BY u.lot_due_on ${direction}, u.lot_received_on ${direction}, u.lot_created_at ${direction}, u.lot_id ${direction}, u.sample_index ${direction}, u.id ${direction}
      LIMIT ${limit + 1}
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
  const more = rows.length > limit;
  // The extra row read to know whether more follow is the farthest one: last going forwards, first going back.
  const page = more ? (backwards ? rows.slice(1) : rows.slice(0, limit)) : rows;
  const first = page.at(0);
  const last = page.at(-1);
  return {
    units: page.map(
      (r): QueueRow => ({
        id: r.id,
        serial: r.serial,
        sampleIndex: r.sample_index,
        status: r.status === "on_bench" && r.lease_active ? "on_bench" : "waiting",
        lotId: r.lot_id,
        purchaseRef: r.purchase_ref,
        partTypeId: r.part_type_id,
        partTypeName: r.part_type_name,
        supplierName: r.supplier_name,
        dueOn: r.lot_due_on,
        receivedOn: r.lot_received_on,
        holder:
          r.status === "on_bench" && r.lease_active && r.holder_id
            ? { id: r.holder_id, name: r.holder_name ?? "", since: new Date(r.claimed_at!).toISOString(), leaseExpiresAt: new Date(r.lease_expires_at!).toISOString() }
            : null,
      }),
    ),
    nextCursor: last && (backwards || more) ? keyOf(last) : null,
    prevCursor: first && (backwards ? more : from !== null) ? keyOf(first) : null,
  };
}

export type QueueStats = {
  waiting: number;
  onBench: number;
  gradedToday: number;
  byPartType: { partTypeId: string; name: string; waiting: number; onBench: number; medianMinutes: number | null }[];
};

/**
 * Depth and throughput: waiting, on bench, graded today (UTC day), median minutes per unit (last
 * 30 days). The open queue and the recent grades are counted apart, each from its own index
 * (units_open_queue_idx, units_graded_idx), so the cost follows the queue and the month, not the
 * whole inspection history (one pass over every unit took about 220 ms at 170 000 units).
 */
export async function queueStats({ workspaceId }: { workspaceId: string }): Promise<QueueStats> {
  const { rows } = await db().execute<{ part_type_id: string; name: string; waiting: number; on_bench: number; graded_today: number; median_minutes: number | null }>(sql`
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
  const byPartType = rows
    .map((r) => ({ partTypeId: r.part_type_id, name: r.name, waiting: r.waiting, onBench: r.on_bench, gradedToday: r.graded_today, medianMinutes: r.median_minutes === null ? null : Math.round(Number(r.median_minutes) * 10) / 10 }))
    .filter((r) => r.waiting + r.onBench + r.gradedToday > 0 || r.medianMinutes !== null);
  return {
    waiting: byPartType.reduce((n, r) => n + r.waiting, 0),
    onBench: byPartType.reduce((n, r) => n + r.onBench, 0),
    gradedToday: byPartType.reduce((n, r) => n + r.gradedToday, 0),
    byPartType: byPartType.map(({ gradedToday: _g, ...rest }) => rest),
  };
}
