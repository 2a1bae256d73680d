import Link from "next/link";
import type { QueueRow } from "@/lib/queue/list";

function since(iso: string) {
  const minutes = Math.max(0, Math.round((Date.now() - new Date(iso).getTime()) / 60_000));
  return minutes < 60 ? `${minutes} min` : `${Math.floor(minutes / 60)} h ${minutes % 60} min`;
}

export function QueueTable({ rows, loading, emptyText = "No units are waiting in open lots." }: { rows: QueueRow[]; loading: boolean; emptyText?: string }) {
  return (
    <div className="card overflow-x-auto">
      <table className="min-w-full text-sm" data-testid="queue-table">
        <thead className="bg-gauge-50 text-left text-xs uppercase tracking-wide text-gauge-600">
          <tr>
            <th scope="col" className="px-4 py-2">
              Due
            </th>
            <th scope="col" className="px-4 py-2">
              Lot
            </th>
            <th scope="col" className="px-4 py-2">
              Part type
            </th>
            <th scope="col" className="px-4 py-2">
              Supplier
            </th>
            <th scope="col" className="px-4 py-2">
              Unit
            </th>
            <th scope="col" className="px-4 py-2">
              On the bench of
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-gauge-100">
          {rows.map((r) => (
            <tr key={r.id} data-testid="queue-row">
              <td className="whitespace-nowrap px-4 py-2">{r.dueOn}</td>
              <td className="px-4 py-2">
                <Link href={`/lots/${r.lotId}`} className="text-gauge-700 underline">
                  {r.purchaseRef}
                </Link>
              </td>
              <td className="px-4 py-2">{r.partTypeName}</td>
              <td className="px-4 py-2">{r.supplierName}</td>
              <td className="px-4 py-2 font-mono text-xs">{r.serial ?? `#${r.sampleIndex} (no serial yet)`}</td>
              <td className="px-4 py-2">
                {/* The minutes are counted again in the browser; a minute may turn between the server's render and hydration. */}
                {r.holder ? <span suppressHydrationWarning>{`${r.holder.name}, for ${since(r.holder.since)}`}</span> : <span className="text-gauge-500">waiting</span>}
              </td>
            </tr>
          ))}
          {!loading && rows.length === 0 && (
            <tr>
              <td colSpan={6} className="px-4 py-6 text-center text-gauge-600">
                {emptyText}
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}
