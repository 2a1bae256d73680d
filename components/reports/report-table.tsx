/**
 * A plain table for the Reports screen's figures (server-rendered; nothing to sort or page). Each
 * figure the charts show is also in one of these, so every number is readable as text.
 * Headings wrap between words (bottom-aligned), so a nine-column table fits a 1 024 px window
 * instead of scrolling its last columns out of sight.
 */
export type ReportColumn<Row> = { header: string; cell: (row: Row) => React.ReactNode; numeric?: boolean; rowHeader?: boolean };

export function ReportTable<Row>({
  caption,
  columns,
  rows,
  rowKey,
  testId,
}: {
  caption: string;
  columns: readonly ReportColumn<Row>[];
  rows: readonly Row[];
  rowKey: (row: Row) => string;
  testId?: string;
}) {
  return (
    <div className="overflow-x-auto">
      <table className="min-w-full text-sm" data-testid={testId}>
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-gauge-50 text-left text-xs uppercase tracking-wide text-gauge-600">
          <tr>
            {columns.map((c) => (
              <th key={c.header} scope="col" className={`px-2 py-2 align-bottom font-medium lg:px-3 ${c.numeric ? "text-right" : ""}`}>
                {c.header}
              </th>
            ))}
          </tr>
        </thead>
        <tbody className="divide-y divide-gauge-100">
          {rows.map((row) => (
            <tr key={rowKey(row)}>
              {columns.map((c) =>
                c.rowHeader ? (
                  <th key={c.header} scope="row" className="px-2 py-2 text-left align-top font-medium lg:px-3">
                    {c.cell(row)}
                  </th>
                ) : (
                  <td key={c.header} className={`px-2 py-2 align-top lg:px-3 ${c.numeric ? "text-right tabular-nums whitespace-nowrap" : ""}`}>
                    {c.cell(row)}
                  </td>
                ),
              )}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** "12.5", "n/a" for a figure with nothing to divide by. */
export const figure = (value: number, digits = 1) => (Number.isFinite(value) ? value.toFixed(digits) : "n/a");
/** "37 %" of a 0..1 share, "n/a" when undefined. */
export const percent = (share: number) => (Number.isFinite(share) ? `${Math.round(share * 100)} %` : "n/a");
