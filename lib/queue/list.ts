import "server-only";
import { listQueuePage, listQueueStats, type QueuePageRow } from "@/db/queries/queue";
import { decodeCursor, encodeCursor, type QueueKey } from "./cursor";
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

export type QueuePage = { units: QueueRow[]; nextCursor: string | null; prevCursor: string | null };

const keyOf = (r: QueuePageRow) => encodeCursor({ dueOn: r.lot_due_on, receivedOn: r.lot_received_on, lotCreatedAt: r.lot_created_at, lotId: r.lot_id, sampleIndex: r.sample_index, id: r.id });

/**
 * One keyset page of the queue (waiting units and units on a bench, in open lots), in Take next
 * order: the units after `cursor`, or the units just before `before` (the page before a page, for
 * Previous). A cursor is a row's sort key; one row more than the page tells whether more lie that
 * way. `nextCursor` / `prevCursor` open the pages on either side (null when nothing is there; after
 * a `before` page the page it came from is assumed to follow).
 */
export async function listQueue({ workspaceId, filters, cursor, before, limit }: { workspaceId: string; filters: QueueFilters; cursor?: string; before?: string; limit: number }): Promise<QueuePage> {
  const backwards = before !== undefined;
  const from: QueueKey | null = before !== undefined ? decodeCursor(before) : cursor ? decodeCursor(cursor) : null;
  const rows = await listQueuePage({ workspaceId, filters, from, backwards, limit: limit + 1 });
  const more = rows.length > limit;
  // The extra row is the farthest one from the cursor: the last going forwards, the first going back.
  const page = more ? (backwards ? rows.slice(1) : rows.slice(0, limit)) : rows;
  const first = page.at(0);
  const last = page.at(-1);
  return {
    units: page.map((r): QueueRow => ({
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
    })),
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

/** Depth and throughput: waiting, on bench, graded today (UTC day), median minutes per unit (last 30 days). */
export async function queueStats({ workspaceId }: { workspaceId: string }): Promise<QueueStats> {
  const rows = await listQueueStats({ workspaceId });
  const byPartType = rows
    .map((r) => ({
      partTypeId: r.part_type_id,
      name: r.name,
      waiting: r.waiting,
      onBench: r.on_bench,
      gradedToday: r.graded_today,
      medianMinutes: r.median_minutes === null ? null : Math.round(Number(r.median_minutes) * 10) / 10,
    }))
    .filter((r) => r.waiting + r.onBench + r.gradedToday > 0 || r.medianMinutes !== null);
  return {
    waiting: byPartType.reduce((n, r) => n + r.waiting, 0),
    onBench: byPartType.reduce((n, r) => n + r.onBench, 0),
    gradedToday: byPartType.reduce((n, r) => n + r.gradedToday, 0),
    byPartType: byPartType.map(({ gradedToday: _g, ...rest }) => rest),
  };
}
