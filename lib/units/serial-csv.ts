/**
 * Parses a pasted or uploaded list of serials (CSV, or one serial a line). Pure and shared by the
 * browser (a preview before sending) and the server (the check that counts).
 *
 * Rules chosen here:
 * - A leading byte-order mark is dropped; CRLF, LF and CR line ends are all accepted.
 * - Lines that are empty or only whitespace are skipped (they keep their line numbers).
 * - If the first non-empty line has a cell named "serial" (also "serial number", "serial no",
 *   "sn"), it is a header and that column holds the serials; otherwise the first column does.
 *   Other columns are ignored. The delimiter is a tab if the first line has one (a spreadsheet
 *   paste), else ";" when it has ";" and no ",", else ",".
 * - A serial is 1–64 characters of letters, digits and . _ / - (starting with a letter or digit).
 * - Duplicates are found case-insensitively ("ov-1" and "OV-1" are one serial) and reported with
 *   every line they are on; a list with duplicates or bad lines is refused as a whole.
 */
import Papa from "papaparse";

export const MAX_SERIAL_LINES = 20_000;
export const MAX_SERIAL_LENGTH = 64;
export const SERIAL_PATTERN = /^[A-Za-z0-9][A-Za-z0-9._/-]*$/;
const HEADER_NAMES = ["serial", "serial number", "serial no", "serial no.", "serialnumber", "sn", "s/n"];

export type SerialLine = { serial: string; line: number };
export type SerialLineError = { line: number; message: string };
export type SerialDuplicate = { serial: string; lines: number[] };
export type SerialParseResult = {
  serials: SerialLine[];
  errors: SerialLineError[];
  duplicates: SerialDuplicate[];
  /** Line number of the header row, when there is one. */
  headerLine: number | null;
  /** An error about the whole list (empty, too long), when there is one. */
  listError: string | null;
};

/** Why a single serial is not acceptable, or null when it is. */
export function serialProblem(serial: string): string | null {
  if (serial.length === 0) return "the serial is empty";
  if (serial.length > MAX_SERIAL_LENGTH) return `the serial is longer than ${MAX_SERIAL_LENGTH} characters`;
  if (!/^[A-Za-z0-9]/.test(serial)) return `“${serial}” must start with a letter or digit`;
  const bad = [...serial].find((c) => !/[A-Za-z0-9._/-]/.test(c));
  if (bad !== undefined) {
    const shown = bad === " " ? "a space" : /\s/.test(bad) ? "white space" : `“${bad}”`;
    return `“${serial}” contains ${shown}; serials use letters, digits and . _ / -`;
  }
  return null;
}

function pickDelimiter(firstLine: string): string {
  if (firstLine.includes("\t")) return "\t";
  if (firstLine.includes(";") && !firstLine.includes(",")) return ";";
  return ",";
}

/** Line number (1-based) of a character offset, from the sorted offsets of "\n". */
function lineAt(newlines: number[], offset: number): number {
  let lo = 0;
  let hi = newlines.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (newlines[mid] < offset) lo = mid + 1;
    else hi = mid;
  }
  return lo + 1;
}

export function parseSerialCsv(input: string): SerialParseResult {
  const text = input.replace(/^\uFEFF/, "").replace(/\r\n?/g, "\n");
  const result: SerialParseResult = { serials: [], errors: [], duplicates: [], headerLine: null, listError: null };
  const newlines: number[] = [];
  for (let i = text.indexOf("\n"); i !== -1; i = text.indexOf("\n", i + 1)) newlines.push(i);
  const firstLine = text.split("\n").find((l) => l.trim() !== "") ?? "";
  let column: number | null = null;
  let rowStart = 0;
  let rows = 0;

  Papa.parse<string[]>(text, {
    delimiter: pickDelimiter(firstLine),
    newline: "\n",
    step(row) {
      const line = lineAt(newlines, rowStart);
      // Papa's cursor is the offset just after the row's newline: the next row's start.
      rowStart = row.meta.cursor;
      const cells = row.data.map((c) => c.trim());
      if (cells.every((c) => c === "")) return;
      rows += 1;
      if (rows > MAX_SERIAL_LINES) return;
      const quoteError = row.errors.find((e) => e.type === "Quotes");
      if (quoteError) {
        result.errors.push({ line, message: `line ${line}: a quoted field is not closed` });
        return;
      }
      if (column === null) {
        const header = cells.findIndex((c) => HEADER_NAMES.includes(c.toLowerCase()));
        if (header >= 0) {
          column = header;
          result.headerLine = line;
          return;
        }
        column = 0;
      }
      const serial = cells[column] ?? "";
      const problem = serial === "" ? "there is no value in the serial column" : serialProblem(serial);
      if (problem) result.errors.push({ line, message: `line ${line}: ${problem}` });
      else result.serials.push({ serial, line });
    },
  });

  if (rows > MAX_SERIAL_LINES) {
    result.listError = `The list has ${rows.toLocaleString("en-GB")} lines; at most ${MAX_SERIAL_LINES.toLocaleString("en-GB")} can be imported at once.`;
    result.serials = [];
    result.errors = [];
    return result;
  }
  const byKey = new Map<string, SerialLine[]>();
  for (const entry of result.serials) {
    const key = entry.serial.toUpperCase();
    byKey.set(key, [...(byKey.get(key) ?? []), entry]);
  }
  for (const entries of byKey.values()) {
    if (entries.length > 1) result.duplicates.push({ serial: entries[0].serial, lines: entries.map((e) => e.line) });
  }
  if (result.serials.length === 0 && result.errors.length === 0) result.listError = "The list has no serials.";
  return result;
}

/** One sentence per problem, for a form or an API error (at most `limit`, then "… and N more"). */
export function describeSerialProblems(parsed: SerialParseResult, limit = 20): string[] {
  if (parsed.listError) return [parsed.listError];
  const lines = [...parsed.errors.map((e) => e.message), ...parsed.duplicates.map((d) => `“${d.serial}” appears ${d.lines.length} times (lines ${d.lines.join(", ")})`)];
  return lines.length > limit ? [...lines.slice(0, limit), `… and ${lines.length - limit} more`] : lines;
}

export function hasSerialProblems(parsed: SerialParseResult): boolean {
  return parsed.listError !== null || parsed.errors.length > 0 || parsed.duplicates.length > 0;
}
