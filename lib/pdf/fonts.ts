/**
 * The PDFs' font: Source Sans 3 (Adobe, SIL Open Font License), static TrueType files from the
 * `source-sans` npm package, read once per process. Why this one: it is non-variable and ships
 * complete TTFs (every accented Latin letter, Greek, Cyrillic, ≤, ✓), while Inter's npm packages
 * are variable, WOFF2-only or split by character range, and fontkit crashes on WOFF2 with accents
 * and on variable fonts (see the project's stack notes).
 *
 * Paths are built from process.cwd() (the project root for `next start`, the scripts and the
 * tests): a templated require.resolve breaks the Turbopack build.
 *
 * A character the font lacks never reaches pdfkit: `printable()` replaces it (see there).
 */
import fs from "node:fs";
import path from "node:path";
import * as fontkit from "fontkit";
import { withoutTables } from "./sfnt";

export const PDF_FONT_FILES = {
  regular: "SourceSans3-Regular.ttf",
  semibold: "SourceSans3-Semibold.ttf",
  bold: "SourceSans3-Bold.ttf",
} as const;
export type PdfFontWeight = keyof typeof PDF_FONT_FILES;

/** The folder is spelled out so the build traces only it (a variable path traces the whole project). */
export const pdfFontPath = (weight: PdfFontWeight) => path.join(process.cwd(), "node_modules", "source-sans", "TTF", PDF_FONT_FILES[weight]);
export const PDF_FONT_WEIGHTS = Object.keys(PDF_FONT_FILES) as PdfFontWeight[];

/** The names the documents register the fonts under (`doc.font(PDF_FONT.bold)`). */
export const PDF_FONT: Record<PdfFontWeight, string> = { regular: "PP-Regular", semibold: "PP-Semibold", bold: "PP-Bold" };

type LoadedFont = { buffer: Buffer; font: fontkit.Font };
let loaded: Record<PdfFontWeight, LoadedFont> | undefined;

function loadFonts(): Record<PdfFontWeight, LoadedFont> {
  if (loaded) return loaded;
  const entries = PDF_FONT_WEIGHTS.map((weight) => {
    const file = pdfFontPath(weight);
    // GSUB/GPOS dropped: see sfnt.ts for why and what it costs.
    const buffer = withoutTables(fs.readFileSync(file), ["GSUB", "GPOS"]);
    const font = fontkit.create(buffer);
    if (!("hasGlyphForCodePoint" in font)) throw new Error(`${file} is a font collection, not one font`);
    return [weight, { buffer, font }] as const;
  });
  loaded = Object.fromEntries(entries) as Record<PdfFontWeight, LoadedFont>;
  return loaded;
}

/** The font files' bytes, as registered (read once per process). */
export function pdfFontBuffers(): Record<PdfFontWeight, Buffer> {
  const fonts = loadFonts();
  return { regular: fonts.regular.buffer, semibold: fonts.semibold.buffer, bold: fonts.bold.buffer };
}

/**
 * The fontkit fonts, for `doc.registerFont`: one object per process, so the tables fontkit
 * decodes lazily are decoded once, not once per document.
 */
export function pdfFontObjects(): Record<PdfFontWeight, fontkit.Font> {
  const fonts = loadFonts();
  return { regular: fonts.regular.font, semibold: fonts.semibold.font, bold: fonts.bold.font };
}

const glyphCache = new Map<number, boolean>();

/** True when every weight has a glyph for the code point (text may switch weight anywhere). */
export function fontHasGlyph(codePoint: number): boolean {
  let has = glyphCache.get(codePoint);
  if (has === undefined) {
    const fonts = loadFonts();
    has = PDF_FONT_WEIGHTS.every((weight) => fonts[weight].font.hasGlyphForCodePoint(codePoint));
    glyphCache.set(codePoint, has);
  }
  return has;
}

/** The fontkit font of a weight, for measuring and for drawing text as paths (annotated photos). */
export function fontkitFont(weight: PdfFontWeight): fontkit.Font {
  return loadFonts()[weight].font;
}

/** U+FFFD "�" when the font has it (Source Sans 3 does not), else "?". */
const replacementCharacter = () => (fontHasGlyph(0xfffd) ? "\uFFFD" : "?");
const COMBINING_MARK = /\p{M}/gu;
const PLAIN_ASCII = /^[\x20-\x7e\n]*$/;
// C0/C1 controls and other invisible format characters; tab and line breaks are handled apart.
const CONTROL = /[\p{Cc}\p{Cf}]/u;

/**
 * Text as the PDFs print it (decision, tested):
 * 1. NFC-normalised, so a decomposed "e + ¨" prints as the font's "ë".
 * 2. Tabs become spaces; CR/LF pairs become LF; other control and format characters are dropped.
 * 3. A character the font lacks is replaced by its compatibility decomposition without accents
 *    when the font has all of that ("ℌ" → "H", "ǆ" → "dž"), else by a replacement character
 *    ("�", or "?" in a font without it), so the reader sees that something was there. Never a
 *    crash, never a silent gap.
 */
export function printable(text: string): string {
  // Most text is plain ASCII, which the font covers (tested): nothing to do.
  if (PLAIN_ASCII.test(text)) return text;
  let out = "";
  for (const char of text.normalize("NFC").replace(/\r\n?/g, "\n").replace(/\t/g, " ")) {
    const codePoint = char.codePointAt(0)!;
    if (char === "\n" || char === " ") out += char;
    else if (CONTROL.test(char)) continue;
    else if (fontHasGlyph(codePoint)) out += char;
    else {
      const plain = char.normalize("NFKD").replace(COMBINING_MARK, "");
      const usable = plain.length > 0 && [...plain].every((c) => fontHasGlyph(c.codePointAt(0)!));
      out += usable ? plain : replacementCharacter();
    }
  }
  return out;
}
