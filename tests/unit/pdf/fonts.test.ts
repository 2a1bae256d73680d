/**
 * The PDF font covers what the templates print, and a character it lacks is replaced, not a crash.
 * Glyph coverage is read with fontkit (the font engine pdfkit itself uses, a general-purpose
 * library); the extracted text is read back with pdf.js (tests/support/pdf-text.ts).
 */
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { createPdf, pdfBuffer } from "@/lib/pdf/document";
import { fontHasGlyph, PDF_FONT, printable } from "@/lib/pdf/fonts";
import { pdfText } from "@/tests/support/pdf-text";

/** Invented names of the kind suppliers and people have (demo-style, not real persons). */
export const ACCENTED_NAMES = ["Piet Moravec", "Zoë Łukasiewicz", "Ørjan Brændøy", "Søren Ødegård", "Ärzte Çelik", "Ñandú Peña", "Đorđe Šćepanović", "Łódź Żółć", "Œuvre Straße", "Dvořák Ťapák"];

const TEMPLATE_FILES = [
  "lib/pdf/document.ts",
  "lib/pdf/table.ts",
  "lib/pdf/pareto-chart.ts",
  "lib/reports/lot-report-pdf.ts",
  "lib/reports/certificate-pdf.ts",
  "lib/reports/format.ts",
  "lib/imaging/annotated-photo.ts",
  "lib/lots/schemas.ts",
];

const codePoints = (text: string) => [...new Set([...text].map((c) => c.codePointAt(0)!))];
const missing = (points: number[]) => points.filter((p) => !fontHasGlyph(p)).map((p) => String.fromCodePoint(p));

describe("the PDF font", () => {
  it("has every printable ASCII, Latin-1 and Latin Extended-A character (names of people and suppliers)", () => {
    const ranges: number[] = [];
    for (let p = 0x20; p <= 0x7e; p++) ranges.push(p);
    for (let p = 0xa0; p <= 0x17f; p++) if (p !== 0xad) ranges.push(p); // soft hyphen is invisible by design
    expect(missing(ranges)).toEqual([]);
    expect(missing(codePoints(ACCENTED_NAMES.join("")))).toEqual([]);
  });

  it("has every character written in the templates' source (labels, arrows, ticks, ≤ ≥ …)", () => {
    const source = TEMPLATE_FILES.map((file) => fs.readFileSync(path.join(process.cwd(), file), "utf8")).join("");
    const nonAscii = codePoints(source).filter((p) => p > 0x7e);
    expect(nonAscii.length).toBeGreaterThan(5);
    expect(missing(nonAscii)).toEqual([]);
  });
});

// Rendering and reading PDFs/images back is CPU-bound; the machine may be shared.
describe("printable", { timeout: 30_000 }, () => {
  it("keeps what the font has and composes decomposed accents", () => {
    expect(printable("Zoë Łukasiewicz")).toBe("Zoë Łukasiewicz");
    expect(printable("Zoe\u0308")).toBe("Zoë");
    expect(printable("a ≤ b ≥ c, ✓ ✗ → €")).toBe("a ≤ b ≥ c, ✓ ✗ → €");
  });

  it("replaces a character the font lacks by its plain form when it has one, else by ? (the font has no �)", () => {
    expect(fontHasGlyph(0x210c)).toBe(false); // ℌ, black-letter H
    expect(printable("ℌ")).toBe("H");
    expect(fontHasGlyph(0xfffd)).toBe(false);
    expect(printable("王")).toBe("?");
    expect(printable("battery 🔋 ok")).toBe("battery ? ok");
  });

  it("drops control characters, turns tabs into spaces and CRLF into LF", () => {
    expect(printable("a\tb\u0007c\u200bd\r\ne\rf")).toBe("a bcd\ne\nf");
  });

  it("is applied to every text pdfkit writes: the PDF's own text shows the replacement, and nothing crashes", async () => {
    const doc = createPdf({ title: "t", author: "a", createdAt: new Date("2026-12-01T00:00:00Z") });
    doc.font(PDF_FONT.regular).fontSize(12).text("Supplier: Ørjan Brændøy 王 ok");
    doc.font(PDF_FONT.bold).text(`Width ${doc.widthOfString("王") > 0}`);
    const [page] = await pdfText(await pdfBuffer(doc));
    expect(page).toContain("Supplier: Ørjan Brændøy ? ok");
    expect(page).toContain("Width true");
  });
});
