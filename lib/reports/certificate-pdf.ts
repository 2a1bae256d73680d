/**
 * The one-page condition certificate for a graded unit (pdfkit): what the part is, its grade and
 * why, the checklist's results, each view's thumbnail with its regions, the rubric version, the
 * issuer (the workspace), a QR code and short code that open the public verification page, and
 * the content hash that page shows too. Every block has a fixed height, so long data is cut
 * ("… 3 more on the verification page"), never pushed onto a second page.
 */
import { createPdf, pdfBuffer, type PdfDoc } from "@/lib/pdf/document";
import { PDF_FONT } from "@/lib/pdf/fonts";
import { drawQr } from "@/lib/pdf/qr";
import { certificateHash, groupedHash, type CertificateData } from "./certificate-content";
import { formatInstant, GRADE_CAUTION } from "./format";

export type CertificateOptions = { timeZone?: string };

const INK = "#111111";
const MUTED = "#555555";
const MAX_EXPLANATION_LINES = 6;
const MAX_CHECKLIST_LINES = 10;
const MAX_VIEWS = 4;

/** Lines that fit, plus "… n more" when some are left out. */
export function clampLines(lines: readonly string[], max: number, more = "on the verification page"): string[] {
  if (lines.length <= max) return [...lines];
  const shown = lines.slice(0, max - 1);
  return [...shown, `… ${lines.length - shown.length} more ${more}`];
}

function label(doc: PdfDoc, text: string, x: number, y: number, width: number) {
  doc.font(PDF_FONT.semibold).fontSize(7.5).fillColor(MUTED).text(text.toUpperCase(), x, y, { width, characterSpacing: 0.4, lineBreak: false });
}

function field(doc: PdfDoc, name: string, value: string, x: number, y: number, width: number, size = 11) {
  label(doc, name, x, y, width);
  doc
    .font(PDF_FONT.semibold)
    .fontSize(size)
    .fillColor(INK)
    .text(value || "—", x, y + 10, { width, height: size * 2.6, ellipsis: true });
}

/** Pixel size of an image as pdfkit reads it (openImage exists at run time; its types omit it). */
function imageSize(doc: PdfDoc, image: Buffer): { width: number; height: number } {
  return (doc as unknown as { openImage(src: Buffer): { width: number; height: number } }).openImage(image);
}

export async function renderCertificatePdf(data: CertificateData, options: CertificateOptions = {}): Promise<Buffer> {
  const timeZone = options.timeZone ?? "UTC";
  const doc = createPdf({ title: `Condition certificate — ${data.serial}`, subject: `${data.partType} · ${data.modelFamily}`, author: data.workspaceName, createdAt: data.issuedAt });
  const { margins } = doc.page;
  const left = margins.left;
  const width = doc.page.width - left - margins.right;
  const qrSize = 112;
  const textWidth = width - qrSize - 16;

  // Header: issuer, title, and the verification block on the right.
  doc.font(PDF_FONT.semibold).fontSize(10).fillColor(MUTED).text(data.workspaceName, left, margins.top, { width: textWidth, lineBreak: false, ellipsis: true });
  doc
    .font(PDF_FONT.bold)
    .fontSize(22)
    .fillColor(INK)
    .text("Condition certificate", left, margins.top + 14, { width: textWidth });
  doc
    .font(PDF_FONT.regular)
    .fontSize(9)
    .fillColor(MUTED)
    .text(`Issued ${formatInstant(data.issuedAt, timeZone)} · certificate ${data.shortCode}`, left, margins.top + 44, { width: textWidth });
  const qrX = left + width - qrSize;
  drawQr(doc, data.verificationUrl, { x: qrX, y: margins.top - 6, size: qrSize });
  doc
    .font(PDF_FONT.bold)
    .fontSize(10)
    .fillColor(INK)
    .text(data.shortCode, qrX, margins.top + qrSize - 4, { width: qrSize, align: "center", lineBreak: false });
  doc
    .font(PDF_FONT.regular)
    .fontSize(7)
    .fillColor(MUTED)
    .text("Scan, or enter the code on the verification page", qrX - 10, margins.top + qrSize + 9, { width: qrSize + 20, align: "center" });

  // The part.
  let y = margins.top + 78;
  const col = textWidth / 2;
  field(doc, "Part type", data.partType, left, y, col - 10);
  field(doc, "Device model family", data.modelFamily, left + col, y, col - 10);
  y += 40;
  field(doc, "Serial", data.serial, left, y, col - 10, 13);
  field(doc, "Rubric", `${data.rubric.name}, version ${data.rubric.version}`, left + col, y, col - 10);
  y += 50;

  // Grade and its explanation.
  const gradeBox = 84;
  doc.roundedRect(left, y, gradeBox, gradeBox, 6).lineWidth(1.5).strokeColor(INK).stroke();
  label(doc, "Cosmetic grade", left + 8, y + 8, gradeBox - 16);
  doc
    .font(PDF_FONT.bold)
    .fontSize(data.grade === "Reject" ? 20 : 40)
    .fillColor(INK)
    .text(data.grade, left, y + (data.grade === "Reject" ? 38 : 24), { width: gradeBox, align: "center", lineBreak: false });
  const explanation = data.explanation.length ? data.explanation : ["No rubric rule lowered the grade: no measured defect reached a limit."];
  label(doc, "Why this grade", left + gradeBox + 16, y, width - gradeBox - 16);
  doc.font(PDF_FONT.regular).fontSize(9).fillColor(INK);
  doc.text(
    clampLines(explanation, MAX_EXPLANATION_LINES)
      .map((line) => `• ${line}`)
      .join("\n"),
    left + gradeBox + 16,
    y + 12,
    { width: width - gradeBox - 16, height: 96, ellipsis: true },
  );
  y += 110;

  // Checklist.
  const failed = data.checklist.filter((item) => item.result === "fail");
  const passed = data.checklist.filter((item) => item.result === "pass").length;
  const missing = data.checklist.length - passed - failed.length;
  label(doc, "Functional checklist", left, y, width);
  const summary = `${passed} of ${data.checklist.length} checks passed` + (failed.length ? `, ${failed.length} failed` : "") + (missing ? `, ${missing} not recorded` : "") + ".";
  doc
    .font(PDF_FONT.semibold)
    .fontSize(9.5)
    .fillColor(INK)
    .text(summary, left, y + 11, { width });
  const itemLines = data.checklist.map((item) => `${item.result === "pass" ? "✓" : item.result === "fail" ? "✗" : "–"} ${item.label}${item.detail ? ` (${item.detail})` : ""}`);
  doc
    .font(PDF_FONT.regular)
    .fontSize(8.5)
    .text(clampLines(itemLines, MAX_CHECKLIST_LINES).join("\n"), left, y + 25, { width, columns: 2, columnGap: 16, height: 62, ellipsis: true });
  y += 96;

  // Views with their regions.
  const views = data.views.slice(0, MAX_VIEWS);
  label(doc, `Photos graded (${data.views.length} view${data.views.length === 1 ? "" : "s"}, regions drawn in)`, left, y, width);
  const gap = 10;
  const thumbWidth = (width - gap * (MAX_VIEWS - 1)) / MAX_VIEWS;
  const thumbMaxHeight = 150;
  views.forEach((view, i) => {
    const x = left + i * (thumbWidth + gap);
    // The label goes right under the picture as drawn (fit keeps the aspect ratio). A photo the
    // store could not give back still has its place and label (its hash is on the page).
    let drawnHeight = 90;
    if (view.thumbnail.length > 0) {
      const size = imageSize(doc, view.thumbnail);
      drawnHeight = Math.min(thumbMaxHeight, (size.height * thumbWidth) / size.width);
      doc.image(view.thumbnail, x, y + 12, { fit: [thumbWidth, thumbMaxHeight], align: "center" });
    } else {
      doc
        .rect(x, y + 12, thumbWidth, drawnHeight)
        .lineWidth(0.5)
        .strokeColor(MUTED)
        .stroke();
      doc
        .font(PDF_FONT.regular)
        .fontSize(8)
        .fillColor(MUTED)
        .text("Photo not available", x, y + 12 + drawnHeight / 2 - 4, { width: thumbWidth, align: "center", lineBreak: false });
    }
    doc
      .font(PDF_FONT.regular)
      .fontSize(8)
      .fillColor(MUTED)
      .text(view.label, x, y + 16 + drawnHeight, { width: thumbWidth, align: "center", lineBreak: false, ellipsis: true });
  });
  if (data.views.length > MAX_VIEWS) doc.text(`… ${data.views.length - MAX_VIEWS} more on the verification page`, left, y + 178, { width });
  y += 196;

  // Integrity and caution, pinned to the bottom of the page.
  const bottom = doc.page.height - margins.bottom;
  label(doc, "Content hash (SHA-256 of the certificate's data, also shown on the verification page)", left, bottom - 74, width);
  doc
    .font(PDF_FONT.regular)
    .fontSize(9)
    .fillColor(INK)
    .text(groupedHash(certificateHash(data)), left, bottom - 63, { width, lineBreak: false });
  doc
    .font(PDF_FONT.regular)
    .fontSize(7.5)
    .fillColor(MUTED)
    .text(`${GRADE_CAUTION} Verify this certificate before relying on it: a revoked certificate says so on its verification page.`, left, bottom - 44, { width, height: 40 });

  if (doc.bufferedPageRange().count !== 1) throw new Error("The certificate ran onto a second page");
  return pdfBuffer(doc);
}
