/**
 * QR codes: the matrix the PDF draws decodes back to the URL with jsQR (a general-purpose QR
 * reader, a), and the drawn runs cover exactly the dark modules.
 */
import jsQR from "jsqr";
import { describe, expect, it } from "vitest";
import { darkRuns, QR_QUIET_ZONE, qrMatrix } from "@/lib/pdf/qr";

function rasterise(text: string, modulePx = 4) {
  const matrix = qrMatrix(text);
  const side = (matrix.size + 2 * QR_QUIET_ZONE) * modulePx;
  const rgba = new Uint8ClampedArray(side * side * 4).fill(255);
  // Paint from the runs, as drawQr does, so the test reads what the PDF would show.
  for (const [column, row, length] of darkRuns(matrix)) {
    for (let y = 0; y < modulePx; y++) {
      for (let x = 0; x < length * modulePx; x++) {
        const px = (QR_QUIET_ZONE + column) * modulePx + x;
        const py = (QR_QUIET_ZONE + row) * modulePx + y;
        const at = (py * side + px) * 4;
        rgba[at] = rgba[at + 1] = rgba[at + 2] = 0;
      }
    }
  }
  return { rgba, side, matrix };
}

// Rendering and reading PDFs/images back is CPU-bound; the machine may be shared.
describe("QR codes", { timeout: 30_000 }, () => {
  it("decode back to the verification URL", () => {
    const url = "https://parts.example.invalid/verify/eyJ2IjoxLCJpZCI6IjdlNmQ1YzRiLTNhMjktNDgxNy1hNmI1LWM0ZDNlMmYxYTBiOSIsImV4cCI6MTk1MDAwMDAwMH0.5Zk2bq0yqJ8iK3nVqVQ0tD7hZr6z2n1oQmWwX8cJp0A";
    const { rgba, side } = rasterise(url);
    expect(jsQR(rgba, side, side)?.data).toBe(url);
  });

  it("draw exactly the dark modules, as horizontal runs", () => {
    const { matrix } = rasterise("PP");
    let dark = 0;
    for (let r = 0; r < matrix.size; r++) for (let c = 0; c < matrix.size; c++) if (matrix.isDark(c, r)) dark++;
    const runs = darkRuns(matrix);
    expect(runs.reduce((sum, [, , length]) => sum + length, 0)).toBe(dark);
    for (const [column, row, length] of runs) for (let c = column; c < column + length; c++) expect(matrix.isDark(c, row)).toBe(true);
    // Version 1 is 21 × 21 modules (ISO/IEC 18004, b).
    expect(matrix.size).toBe(21);
  });
});
