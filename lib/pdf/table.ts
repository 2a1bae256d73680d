/**
 * A plain table for pdfkit: a header row repeated on every page the table runs onto, cells that
 * wrap within their column, light zebra rows. Returns the y below the table.
 */
import type { PdfDoc } from "./document";
import { PDF_FONT } from "./fonts";

export type PdfColumn<Row> = { header: string; width: number; align?: "left" | "right" | "center"; value: (row: Row) => string };
export type TableOptions = { x: number; y: number; fontSize?: number; padding?: number };

const HEADER_FILL = "#E9ECEF";
const ZEBRA_FILL = "#F6F7F8";
const RULE = "#C9CED3";

function rowHeight<Row>(doc: PdfDoc, columns: readonly PdfColumn<Row>[], cells: string[], padding: number): number {
  let tallest = 0;
  cells.forEach((cell, i) => {
    tallest = Math.max(tallest, doc.heightOfString(cell || " ", { width: columns[i].width - 2 * padding }));
  });
  return tallest + 2 * padding;
}

function drawRow<Row>(doc: PdfDoc, columns: readonly PdfColumn<Row>[], cells: string[], x: number, y: number, height: number, padding: number, fill?: string) {
  const width = columns.reduce((sum, c) => sum + c.width, 0);
  if (fill) doc.rect(x, y, width, height).fill(fill);
  let cx = x;
  doc.fillColor("#111111");
  cells.forEach((cell, i) => {
    doc.text(cell, cx + padding, y + padding, { width: columns[i].width - 2 * padding, align: columns[i].align ?? "left" });
    cx += columns[i].width;
  });
  doc
    .moveTo(x, y + height)
    .lineTo(x + width, y + height)
    .lineWidth(0.4)
    .strokeColor(RULE)
    .stroke();
}

export function drawTable<Row>(doc: PdfDoc, columns: readonly PdfColumn<Row>[], rows: readonly Row[], options: TableOptions): number {
  const fontSize = options.fontSize ?? 8.5;
  const padding = options.padding ?? 3;
  const headers = columns.map((c) => c.header);
  const bottom = () => doc.page.height - doc.page.margins.bottom;

  const header = (y: number) => {
    doc.font(PDF_FONT.semibold).fontSize(fontSize);
    const height = rowHeight(doc, columns, headers, padding);
    drawRow(doc, columns, headers, options.x, y, height, padding, HEADER_FILL);
    doc.font(PDF_FONT.regular).fontSize(fontSize);
    return y + height;
  };

  let y = header(options.y);
  rows.forEach((row, index) => {
    const cells = columns.map((c) => c.value(row));
    const height = rowHeight(doc, columns, cells, padding);
    if (y + height > bottom()) {
      doc.addPage();
      y = header(doc.page.margins.top);
    }
    drawRow(doc, columns, cells, options.x, y, height, padding, index % 2 ? ZEBRA_FILL : undefined);
    y += height;
  });
  doc.x = options.x;
  doc.y = y;
  return y;
}
