import type { ReactNode } from "react";

/**
 * The header row of a list table in the app's style (small caps on a light band), one column
 * heading per entry; `children` adds headings built from data (e.g. one per item). New tables use
 * it; older ones still write their <thead> out.
 */
export function TableHead({ columns, cellClassName = "px-4 py-2", children }: { columns: ReactNode[]; cellClassName?: string; children?: ReactNode }) {
  return (
    <thead className="bg-gauge-50 text-left text-xs uppercase tracking-wide text-gauge-600">
      <tr>
        {columns.map((column, i) => (
          <th key={i} scope="col" className={cellClassName}>
            {column}
          </th>
        ))}
        {children}
      </tr>
    </thead>
  );
}
