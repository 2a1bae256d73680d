/**
 * Reads a PDF's text back with pdf.js (Mozilla's general-purpose PDF library), one string per
 * page, lines joined with "\n". Tests compare what a reader would copy out of the file with the
 * data the file was made from.
 */
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";

type TextItem = { str: string; hasEOL: boolean };

export async function pdfText(pdf: Buffer): Promise<string[]> {
  const document = await getDocument({ data: new Uint8Array(pdf), isEvalSupported: false, useSystemFonts: false, disableFontFace: true, verbosity: 0 }).promise;
  const pages: string[] = [];
  for (let n = 1; n <= document.numPages; n++) {
    const page = await document.getPage(n);
    const content = await page.getTextContent();
    const items = content.items.filter((item): item is TextItem & typeof item => "str" in item);
    pages.push(items.map((item) => item.str + (item.hasEOL ? "\n" : "")).join(""));
  }
  await document.destroy();
  return pages;
}

/** All pages' text with runs of whitespace made single spaces (line breaks inside cells vary). */
export const flatText = (pages: string[]) => pages.join("\n").replace(/\s+/g, " ");
