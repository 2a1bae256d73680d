/**
 * What a list shows while its first page streams from the server: the table's frame with grey
 * rows, so the page does not jump when the rows arrive.
 */
export function TableSkeleton({ columns, rows = 8, label }: { columns: number; rows?: number; label: string }) {
  return (
    <div className="card overflow-hidden" aria-busy="true" data-testid="table-skeleton">
      <span className="sr-only" role="status">
        {label}
      </span>
      <div className="animate-pulse divide-y divide-gauge-100" aria-hidden>
        <div className="flex gap-4 bg-gauge-50 px-4 py-3">
          {Array.from({ length: columns }, (_, i) => (
            <div key={i} className="h-3 flex-1 rounded bg-gauge-200" />
          ))}
        </div>
        {Array.from({ length: rows }, (_, r) => (
          <div key={r} className="flex gap-4 px-4 py-3">
            {Array.from({ length: columns }, (_, i) => (
              <div key={i} className="h-3 flex-1 rounded bg-gauge-100" />
            ))}
          </div>
        ))}
      </div>
    </div>
  );
}
