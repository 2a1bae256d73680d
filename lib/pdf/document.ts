/**
 * One way to start and finish a Partproof PDF: A4, our fonts registered, every string passed
 * through `printable()`, page footers stamped at the end ("page 3 of 12"), bytes collected into
 * one Buffer. Pure apart from reading the font files once.
 */
import PDFDocument from "pdfkit";
import { PDF_FONT, PDF_FONT_WEIGHTS, pdfFontObjects, printable } from "./fonts";

export const A4 = { width: 595.28, height: 841.89 };
export const PAGE_MARGIN = 42;
/** The footer sits in the bottom margin: this much above the page's bottom edge. */
const FOOTER_OFFSET = 26;

export type PdfDoc = PDFKit.PDFDocument;
export type PdfMeta = { title: string; subject?: string; author: string; createdAt: Date };

type TextFn = (this: PdfDoc, text: unknown, ...rest: unknown[]) => unknown;

export function createPdf(meta: PdfMeta): PdfDoc {
  const doc = new PDFDocument({
    size: "A4",
    margins: { top: PAGE_MARGIN, bottom: PAGE_MARGIN + 16, left: PAGE_MARGIN, right: PAGE_MARGIN },
    bufferPages: true,
    // pdfkit defaults to "now"; a fixed date makes the same data give the same file.
    // pdfkit hashes every info value for the file id, so no key may be undefined.
    info: { Title: meta.title, ...(meta.subject ? { Subject: meta.subject } : {}), Author: meta.author, Creator: "Partproof", Producer: "Partproof", CreationDate: meta.createdAt },
  });
  const fonts = pdfFontObjects();
  // pdfkit takes a fontkit font object as it is (its types only list paths and buffers).
  for (const weight of PDF_FONT_WEIGHTS) doc.registerFont(PDF_FONT[weight], fonts[weight] as unknown as Buffer);
  doc.font(PDF_FONT.regular);

  // Every text path of pdfkit (text, heightOfString, tables) goes through `_text`, and widths
  // through `widthOfString`: filtering both here means no template can print a character the
  // font lacks. These are pdfkit internals; tests/unit/pdf/fonts.test.ts fails if they move.
  const internals = doc as unknown as { _text: TextFn; widthOfString: TextFn };
  const originalText = internals._text;
  const originalWidth = internals.widthOfString;
  internals._text = function (text, ...rest) {
    return originalText.call(this, printable(String(text ?? "")), ...rest);
  };
  internals.widthOfString = function (text, ...rest) {
    return originalWidth.call(this, printable(String(text ?? "")), ...rest);
  };
  return doc;
}

/** Writes "left … page n of N" on every page (call once, before `pdfBuffer`). */
export function stampFooters(doc: PdfDoc, left: string): void {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const { width, height, margins } = doc.page;
    const bottom = margins.bottom;
    // Text below the bottom margin would start a new page; lift the margin while writing.
    doc.page.margins.bottom = 0;
    const y = height - FOOTER_OFFSET;
    const usable = width - margins.left - margins.right;
    doc.font(PDF_FONT.regular).fontSize(7.5).fillColor("#555555");
    doc.text(left, margins.left, y, { width: usable * 0.75, lineBreak: false, ellipsis: true });
    doc.text(`Page ${i - range.start + 1} of ${range.count}`, margins.left, y, { width: usable, align: "right", lineBreak: false });
    doc.page.margins.bottom = bottom;
  }
}

/** Ends the document and resolves with its bytes. */
export function pdfBuffer(doc: PdfDoc): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    doc.on("data", (chunk: Buffer) => chunks.push(chunk));
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
    doc.end();
  });
}
