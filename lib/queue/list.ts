import "server-only";
import { listQueuePage, listQueueStats } from "@/db/queries/queue";
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

/**
 * One keyset page of the queue (waiting units and units on a bench, in open lots), in Take next
 * order. The cursor is the last row's sort key; one row more than the page tells whether a next
 * page exists.
 */
export async function listQueue({ workspaceId, filters, cursor, limit }: { workspaceId: string; filters: QueueFilters; cursor?: string; limit: number }) {
  const after: QueueKey | null = cursor ? decodeCursor(cursor) : null;
  const rows = await listQueuePage({ workspaceId, filters, after, limit: limit + 1 });
  const page = rows.slice(0, limit);
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
    nextCursor:
      rows.length > limit && last
        ? encodeCursor({ dueOn: last.lot_due_on, receivedOn: last.lot_received_on, lotCreatedAt: last.lot_created_at, lotId: last.lot_id, sampleIndex: last.sample_index, id: last.id })
        : null,
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
    .map((r) => ({ partTypeId: r.part_type_id, name: r.name, waiting: r.waiting, onBench: r.on_bench, gradedToday: r.graded_today, medianMinutes: r.median_minutes === null ? null : Math.round(Number(r.median_minutes) * 10) / 10 }))
    .filter((r) => r.waiting + r.onBench + r.gradedToday > 0 || r.medianMinutes !== null);
  return {
    waiting: byPartType.reduce((n, r) => n + r.waiting, 0),
    onBench: byPartType.reduce((n, r) => n + r.onBench, 0),
    gradedToday: byPartType.reduce((n, r) => n + r.gradedToday, 0),
    byPartType: byPartType.map(({ gradedToday: _g, ...rest }) => rest),
  };
}
