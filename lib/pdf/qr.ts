/**
 * QR codes drawn as vector squares (sharp at any print size), from the module matrix of the
 * pure-JS `qrcode` library. Error correction M (15 % of the code may be damaged — ISO/IEC 18004
 * levels, b) and the standard 4-module quiet zone around it (ISO/IEC 18004, b).
 */
import QRCode from "qrcode";
import type { PdfDoc } from "./document";

export const QR_QUIET_ZONE = 4;

export type QrMatrix = { size: number; isDark: (column: number, row: number) => boolean };

export function qrMatrix(text: string): QrMatrix {
  const { modules } = QRCode.create(text, { errorCorrectionLevel: "M" });
  return { size: modules.size, isDark: (column, row) => modules.get(row, column) === 1 };
}

/** Horizontal runs of dark modules, one rectangle each: [column, row, length]. */
export function darkRuns(matrix: QrMatrix): [number, number, number][] {
  const runs: [number, number, number][] = [];
  for (let row = 0; row < matrix.size; row++) {
    let start = -1;
    for (let column = 0; column <= matrix.size; column++) {
      const dark = column < matrix.size && matrix.isDark(column, row);
      if (dark && start < 0) start = column;
      if (!dark && start >= 0) {
        runs.push([start, row, column - start]);
        start = -1;
      }
    }
  }
  return runs;
}

/** Draws the code with its quiet zone in a `size` × `size` square at (x, y). */
export function drawQr(doc: PdfDoc, text: string, { x, y, size }: { x: number; y: number; size: number }): void {
  const matrix = qrMatrix(text);
  const moduleSize = size / (matrix.size + 2 * QR_QUIET_ZONE);
  const origin = { x: x + QR_QUIET_ZONE * moduleSize, y: y + QR_QUIET_ZONE * moduleSize };
  doc.save();
  doc.rect(x, y, size, size).fill("#FFFFFF");
  for (const [column, row, length] of darkRuns(matrix)) {
    // A hair of overlap closes the seams some viewers draw between touching rectangles.
    doc.rect(origin.x + column * moduleSize, origin.y + row * moduleSize, length * moduleSize + 0.01, moduleSize + 0.01);
  }
  doc.fill("#000000");
  doc.restore();
}
