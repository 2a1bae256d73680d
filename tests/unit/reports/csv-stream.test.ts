/**
 * Streamed CSV. The reader is papaparse's parser (a general-purpose RFC 4180 implementation, a);
 * the format rules checked here are RFC 4180's (a): CRLF records, a header, quoted fields with
 * doubled quotes. Formula escaping follows OWASP's "CSV Injection" advice (a).
 */
import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { csvCell, csvStream, type CsvColumn } from "@/lib/reports/csv-stream";

type Row = { serial: string; supplier: string; grade: string | null; defects: number; gradedAt: Date | null; note: string };

const columns: CsvColumn<Row>[] = [
  { header: "serial", value: (r) => r.serial },
  { header: "supplier", value: (r) => r.supplier },
  { header: "grade", value: (r) => r.grade },
  { header: "defects", value: (r) => r.defects },
  { header: "graded_at", value: (r) => r.gradedAt },
  { header: "note", value: (r) => r.note },
];

const rows: Row[] = [
  { serial: "OV-CAM-0001", supplier: "Brændøy Komponenter", grade: "A", defects: 0, gradedAt: new Date("2026-11-30T08:15:00Z"), note: "" },
  { serial: "OV-CAM-0002", supplier: "Zoë Łukasiewicz, Parts & Co", grade: "C", defects: 3, gradedAt: new Date("2026-11-30T09:00:05.250Z"), note: 'says "as new", is not' },
  { serial: "OV-CAM-0003", supplier: 'Ørjan\'s "Spares"', grade: null, defects: 12, gradedAt: null, note: "line one\nline two\r\nline three" },
  { serial: "OV-CAM-0004", supplier: "Piet Moravec", grade: "Reject", defects: -1, gradedAt: new Date("2026-12-01T00:00:00Z"), note: '=HYPERLINK("x")' },
];

async function* iterate<T>(items: readonly T[]) {
  for (const item of items) yield item;
}

async function readAll(stream: ReadableStream<Uint8Array>): Promise<Uint8Array> {
  const parts: Uint8Array[] = [];
  const reader = stream.getReader();
  for (let next = await reader.read(); !next.done; next = await reader.read()) parts.push(next.value);
  return Buffer.concat(parts);
}

describe("csvStream", () => {
  it("writes RFC 4180 CSV that parses back row by row (commas, quotes, newlines, accents)", async () => {
    const bytes = await readAll(csvStream(columns, iterate(rows), { batchSize: 3 }));
    const text = new TextDecoder("utf-8", { fatal: true, ignoreBOM: true }).decode(bytes);
    expect(text.startsWith("\uFEFFserial,supplier,grade,defects,graded_at,note\r\n")).toBe(true);
    expect(text.endsWith("\r\n")).toBe(true);
    const parsed = Papa.parse<string[]>(text.slice(1), { newline: "\r\n", skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data).toEqual([
      ["serial", "supplier", "grade", "defects", "graded_at", "note"],
      ["OV-CAM-0001", "Brændøy Komponenter", "A", "0", "2026-11-30T08:15:00.000Z", ""],
      ["OV-CAM-0002", "Zoë Łukasiewicz, Parts & Co", "C", "3", "2026-11-30T09:00:05.250Z", 'says "as new", is not'],
      ["OV-CAM-0003", 'Ørjan\'s "Spares"', "", "12", "", "line one\nline two\r\nline three"],
      // The formula is neutralised (OWASP, a); the negative number is a number and stays as it is.
      ["OV-CAM-0004", "Piet Moravec", "Reject", "-1", "2026-12-01T00:00:00.000Z", '\'=HYPERLINK("x")'],
    ]);
  });

  it("quotes exactly the fields RFC 4180 needs quoted and doubles quotes", async () => {
    const text = new TextDecoder().decode(await readAll(csvStream(columns, iterate(rows.slice(1, 2)), { bom: false })));
    expect(text.split("\r\n")[1]).toBe('OV-CAM-0002,"Zoë Łukasiewicz, Parts & Co",C,3,2026-11-30T09:00:05.250Z,"says ""as new"", is not"');
  });

  it("writes the header alone for an empty export", async () => {
    const text = new TextDecoder().decode(await readAll(csvStream(columns, iterate([]), { bom: false })));
    expect(text).toBe("serial,supplier,grade,defects,graded_at,note\r\n");
  });

  it("pulls rows only as the reader asks (one batch ahead at most)", async () => {
    let produced = 0;
    async function* counting() {
      for (let i = 0; i < 10_000; i++) {
        produced++;
        yield { ...rows[0], serial: `S-${i}` };
      }
    }
    const reader = csvStream(columns, counting(), { batchSize: 100 }).getReader();
    await reader.read(); // header
    await reader.read(); // first batch
    await new Promise((resolve) => setTimeout(resolve, 20));
    expect(produced).toBeLessThanOrEqual(300);
    await reader.cancel();
  });

  it("closes the source when the reader cancels, and when a row fails", async () => {
    let closed = 0;
    async function* source() {
      try {
        for (let i = 0; ; i++) yield { ...rows[0], serial: `S-${i}` };
      } finally {
        closed++;
      }
    }
    const reader = csvStream(columns, source(), { batchSize: 10 }).getReader();
    await reader.read();
    await reader.read();
    await reader.cancel();
    expect(closed).toBe(1);

    const failing: CsvColumn<Row>[] = [{ header: "x", value: () => new Date("nonsense") }];
    await expect(readAll(csvStream(failing, source()))).rejects.toThrow(/invalid date/);
    expect(closed).toBe(2);
  });
});

describe("csvCell", () => {
  it("writes ISO 8601 UTC dates, empty nulls, true/false and finite numbers only", () => {
    expect(csvCell(new Date("2026-01-02T03:04:05Z"))).toBe("2026-01-02T03:04:05.000Z");
    expect(csvCell(null)).toBe("");
    expect(csvCell(undefined)).toBe("");
    expect(csvCell(true)).toBe("true");
    expect(csvCell(Number.NaN)).toBe("");
    expect(csvCell(2.5)).toBe(2.5);
  });
});
