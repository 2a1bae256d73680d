/**
 * Dropping tables from a font file: the result is a valid font for fontkit (a general-purpose
 * font engine, a) with the same glyphs, the same advance widths and the same character map.
 */
import fs from "node:fs";
import * as fontkit from "fontkit";
import { describe, expect, it } from "vitest";
import { pdfFontPath } from "@/lib/pdf/fonts";
import { withoutTables } from "@/lib/pdf/sfnt";

const original = fs.readFileSync(pdfFontPath("regular"));
const open = (buffer: Buffer) => fontkit.create(buffer) as fontkit.Font;

describe("withoutTables", () => {
  it("removes only the named tables and keeps glyphs, widths and the character map", () => {
    const before = open(original);
    const trimmed = withoutTables(original, ["GSUB", "GPOS"]);
    const after = open(trimmed);
    const tags = (font: fontkit.Font) => Object.keys((font as unknown as { directory: { tables: Record<string, unknown> } }).directory.tables).sort();
    expect(tags(before)).toContain("GSUB");
    expect(tags(after)).toEqual(tags(before).filter((tag) => tag !== "GSUB" && tag !== "GPOS"));
    expect(after.numGlyphs).toBe(before.numGlyphs);
    expect(after.characterSet).toEqual(before.characterSet);
    for (const char of "AVWaŁłøæë≤✓€0") {
      const a = before.glyphForCodePoint(char.codePointAt(0)!);
      const b = after.glyphForCodePoint(char.codePointAt(0)!);
      expect([b.id, b.advanceWidth]).toEqual([a.id, a.advanceWidth]);
    }
    expect(trimmed.length).toBeLessThan(original.length);
  });

  it("lays text out as the sum of the glyphs' own advances (no kerning left)", () => {
    const after = open(withoutTables(original, ["GSUB", "GPOS"]));
    const text = "AVATAR Zoë Łukasiewicz";
    const sum = [...text].reduce((total, char) => total + after.glyphForCodePoint(char.codePointAt(0)!).advanceWidth, 0);
    expect(after.layout(text).advanceWidth).toBe(sum);
  });

  it("refuses a file whose table runs past its end", () => {
    expect(() => withoutTables(original.subarray(0, 2000), ["GSUB"])).toThrow(/past the end/);
  });
});
