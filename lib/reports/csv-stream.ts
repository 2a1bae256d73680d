/**
 * CSV exports streamed from an async iterable of rows (a database cursor) with constant memory.
 *
 * Format (decisions):
 * - RFC 4180 (a): comma-separated, CRLF line ends, a header row, fields holding a comma, a quote or
 *   a line break are quoted and quotes doubled — papaparse's `unparse` writes each batch.
 * - UTF-8, with a byte-order mark first by default: spreadsheet programs read accented names
 *   correctly only with it (c); `{ bom: false }` leaves it out.
 * - Dates as ISO 8601 in UTC (`toISOString()`); null and undefined as empty fields; numbers that
 *   are not finite as empty fields; booleans as true/false.
 * - Text cells starting with = + - @ or a tab/CR get a leading apostrophe (papaparse's
 *   `escapeFormulae`), so a supplier's text cannot run as a formula when the file is opened in a
 *   spreadsheet (OWASP "CSV injection", a). Numbers are never changed.
 * - The stream pulls: the next batch of rows is read only when the consumer asks for more, so a
 *   slow download holds one batch in memory, not the export; cancelling closes the iterator (and
 *   so the cursor).
 */
import Papa from "papaparse";

export type CsvCell = string | number | boolean | Date | null | undefined;
export type CsvColumn<Row> = { header: string; value: (row: Row) => CsvCell };
export type CsvOptions = { bom?: boolean; batchSize?: number };

const BOM = "\uFEFF";
const DEFAULT_BATCH = 500;

export function csvCell(value: CsvCell): string | number {
  if (value === null || value === undefined) return "";
  if (value instanceof Date) {
    if (Number.isNaN(value.getTime())) throw new RangeError("A CSV date cell holds an invalid date");
    return value.toISOString();
  }
  if (typeof value === "number") return Number.isFinite(value) ? value : "";
  if (typeof value === "boolean") return value ? "true" : "false";
  return value;
}

const unparse = (data: (string | number)[][]) => Papa.unparse(data, { newline: "\r\n", escapeFormulae: true });

/** The CSV text of a header row (with the BOM when asked), ending with CRLF. */
export function csvHeader(columns: readonly CsvColumn<never>[], { bom = true }: CsvOptions = {}): string {
  return (bom ? BOM : "") + unparse([columns.map((c) => c.header)]) + "\r\n";
}

/** CSV lines (each ending with CRLF) for a batch of rows. */
export function csvLines<Row>(columns: readonly CsvColumn<Row>[], rows: readonly Row[]): string {
  if (rows.length === 0) return "";
  return unparse(rows.map((row) => columns.map((column) => csvCell(column.value(row))))) + "\r\n";
}

/** A web ReadableStream of UTF-8 CSV bytes (for a route handler's `new Response(stream)`). */
export function csvStream<Row>(columns: readonly CsvColumn<Row>[], rows: AsyncIterable<Row>, options: CsvOptions = {}): ReadableStream<Uint8Array> {
  const batchSize = options.batchSize ?? DEFAULT_BATCH;
  if (!Number.isInteger(batchSize) || batchSize < 1) throw new RangeError("batchSize must be a whole number >= 1");
  const encoder = new TextEncoder();
  const iterator = rows[Symbol.asyncIterator]();
  let headerSent = false;
  return new ReadableStream<Uint8Array>(
    {
      async pull(controller) {
        if (!headerSent) {
          headerSent = true;
          controller.enqueue(encoder.encode(csvHeader(columns as readonly CsvColumn<never>[], options)));
          return;
        }
        const batch: Row[] = [];
        let done = false;
        try {
          while (batch.length < batchSize) {
            const next = await iterator.next();
            if (next.done) {
              done = true;
              break;
            }
            batch.push(next.value);
          }
          if (batch.length > 0) controller.enqueue(encoder.encode(csvLines(columns, batch)));
        } catch (error) {
          // The stream errors; release the source (a cursor) as a cancel would.
          await iterator.return?.();
          throw error;
        }
        if (done) controller.close();
      },
      async cancel() {
        await iterator.return?.();
      },
    },
    // One chunk ahead at most: the source is read only as fast as the consumer reads.
    { highWaterMark: 1 },
  );
}
