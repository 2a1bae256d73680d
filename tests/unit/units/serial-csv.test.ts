/**
 * Serial list parsing. The CSV rules follow RFC 4180 (a: quoted fields may hold the delimiter;
 * CRLF line ends) as implemented by papaparse; the rest (header names, serial characters,
 * case-insensitive duplicates, whole-list refusal) are our choices (c), stated in serial-csv.ts.
 */
import { describe, expect, it } from "vitest";
import { describeSerialProblems, hasSerialProblems, MAX_SERIAL_LINES, parseSerialCsv } from "@/lib/units/serial-csv";

const serialsOf = (text: string) => parseSerialCsv(text).serials.map((s) => s.serial);
const serial = (n: number) => `OV-CAM-24-${String(n).padStart(6, "0")}`;

describe("parseSerialCsv", () => {
  it("reads one serial a line and keeps the line numbers", () => {
    const parsed = parseSerialCsv("OV-CAM-24-000001\nOV-CAM-24-000002\nOV-CAM-24-000003\n");
    expect(parsed.serials).toEqual([
      { serial: "OV-CAM-24-000001", line: 1 },
      { serial: "OV-CAM-24-000002", line: 2 },
      { serial: "OV-CAM-24-000003", line: 3 },
    ]);
    expect(hasSerialProblems(parsed)).toBe(false);
  });

  it("drops a byte-order mark and accepts CRLF and lone CR line ends (RFC 4180, a)", () => {
    expect(serialsOf("\uFEFFA-1\r\nA-2\r\nA-3")).toEqual(["A-1", "A-2", "A-3"]);
    expect(serialsOf("A-1\rA-2\rA-3\r")).toEqual(["A-1", "A-2", "A-3"]);
  });

  it("skips empty and blank lines but counts them for line numbers", () => {
    const parsed = parseSerialCsv("A-1\n\n   \nA-2\n\n");
    expect(parsed.serials).toEqual([
      { serial: "A-1", line: 1 },
      { serial: "A-2", line: 4 },
    ]);
  });

  it("finds a header and its column among several; quoted fields may hold commas (RFC 4180, a)", () => {
    const parsed = parseSerialCsv('model,"Serial Number",note\r\nKorvo X2,OV-1,"boxed, sealed"\r\nKorvo X2,OV-2,\r\n');
    expect(parsed.headerLine).toBe(1);
    expect(serialsOf('model,"Serial Number",note\r\nKorvo X2,OV-1,"boxed, sealed"\r\nKorvo X2,OV-2,\r\n')).toEqual(["OV-1", "OV-2"]);
  });

  it("reads a spreadsheet paste (tabs) and semicolon lists", () => {
    expect(serialsOf("serial\tgrade\nTR-9\tA\nTR-10\tB")).toEqual(["TR-9", "TR-10"]);
    expect(serialsOf("sn;lot\nTR-9;4\nTR-10;4")).toEqual(["TR-9", "TR-10"]);
  });

  it("gives one clear error per bad line, with its number", () => {
    const parsed = parseSerialCsv(["OV-1", "OV 2", "-OV3", "x".repeat(65), "OV-5", 'OV-"6'].join("\n"));
    expect(parsed.serials.map((s) => s.serial)).toEqual(["OV-1", "OV-5"]);
    expect(parsed.errors).toEqual([
      { line: 2, message: "line 2: “OV 2” contains a space; serials use letters, digits and . _ / -" },
      { line: 3, message: "line 3: “-OV3” must start with a letter or digit" },
      { line: 4, message: "line 4: the serial is longer than 64 characters" },
      { line: 6, message: 'line 6: “OV-"6” contains “"”; serials use letters, digits and . _ / -' },
    ]);
  });

  it("reports a header row's empty serial cells and an unclosed quote", () => {
    const parsed = parseSerialCsv('serial,model\n,Korvo X2\nOV-1,Korvo X2\n"OV-2,Korvo X2\n');
    expect(parsed.errors.map((e) => e.message)).toEqual(["line 2: there is no value in the serial column", "line 4: a quoted field is not closed"]);
  });

  it("reports duplicates case-insensitively with every line they are on", () => {
    const parsed = parseSerialCsv("OV-1\nOV-2\nov-1\nOV-3\nOV-1\nOV-2");
    expect(parsed.duplicates).toEqual([
      { serial: "OV-1", lines: [1, 3, 5] },
      { serial: "OV-2", lines: [2, 6] },
    ]);
    expect(describeSerialProblems(parsed)).toEqual(["“OV-1” appears 3 times (lines 1, 3, 5)", "“OV-2” appears 2 times (lines 2, 6)"]);
    expect(hasSerialProblems(parsed)).toBe(true);
  });

  it("says so when a list is empty or only a header", () => {
    expect(parseSerialCsv("").listError).toBe("The list has no serials.");
    expect(parseSerialCsv("\n \n").listError).toBe("The list has no serials.");
    expect(parseSerialCsv("serial\n").listError).toBe("The list has no serials.");
  });

  it("reads 10 000 lines, with line numbers right to the end", () => {
    const lines = Array.from({ length: 10_000 }, (_, i) => serial(i + 1));
    lines[9_998] = "bad serial";
    const parsed = parseSerialCsv(lines.join("\r\n"));
    expect(parsed.serials).toHaveLength(9_999);
    expect(parsed.serials.at(-1)).toEqual({ serial: serial(10_000), line: 10_000 });
    expect(parsed.errors).toEqual([{ line: 9_999, message: "line 9999: “bad serial” contains a space; serials use letters, digits and . _ / -" }]);
  });

  it("refuses a list longer than the import limit as a whole", () => {
    const parsed = parseSerialCsv(Array.from({ length: MAX_SERIAL_LINES + 1 }, (_, i) => serial(i)).join("\n"));
    expect(parsed.serials).toEqual([]);
    expect(parsed.listError).toBe("The list has 20,001 lines; at most 20,000 can be imported at once.");
  });

  it("caps the problem list with a count of the rest", () => {
    const parsed = parseSerialCsv(Array.from({ length: 30 }, (_, i) => `bad ${i}`).join("\n"));
    const described = describeSerialProblems(parsed, 5);
    expect(described).toHaveLength(6);
    expect(described[5]).toBe("… and 25 more");
  });
});
