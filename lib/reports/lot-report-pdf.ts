/**
 * The lot inspection report as a PDF (pdfkit): the lot, its sampling plan per severity with code
 * letter, sample size and Ac/Re, the defectives found, the verdict and disposition with the
 * lead's reason, a Pareto chart of defect classes with its numbers, the sampled units, and the
 * annotated photos of defective units (two a page). Page n of N on every page.
 */
import { DISPOSITION_LABELS } from "@/lib/lots/schemas";
import { DEFECT_SEVERITIES, DEFECT_SEVERITY_LABELS } from "@/lib/part-types/severity";
import { createPdf, pdfBuffer, stampFooters, type PdfDoc } from "@/lib/pdf/document";
import { PDF_FONT } from "@/lib/pdf/fonts";
import { drawParetoChart } from "@/lib/pdf/pareto-chart";
import { drawTable, type PdfColumn } from "@/lib/pdf/table";
import { formatAql, formatInstant, formatShare, GRADE_CAUTION } from "./format";
import type { LotReportData, LotReportPhoto, LotReportPlanRow, LotReportUnit } from "./lot-report-data";
import { paretoRows, type ParetoRow } from "./pareto";

export type LotReportOptions = { timeZone?: string };

const INK = "#111111";
const MUTED = "#555555";

function heading(doc: PdfDoc, text: string) {
  if (doc.y > doc.page.height - doc.page.margins.bottom - 80) doc.addPage();
  doc.moveDown(0.8).font(PDF_FONT.bold).fontSize(12).fillColor(INK).text(text, doc.page.margins.left);
  doc.moveDown(0.3).font(PDF_FONT.regular).fontSize(9);
}

function facts(doc: PdfDoc, rows: [string, string][]) {
  const left = doc.page.margins.left;
  const labelWidth = 130;
  const width = doc.page.width - left - doc.page.margins.right - labelWidth;
  for (const [label, value] of rows) {
    const y = doc.y;
    doc
      .font(PDF_FONT.semibold)
      .fontSize(9)
      .fillColor(MUTED)
      .text(label, left, y, { width: labelWidth - 8 });
    doc
      .font(PDF_FONT.regular)
      .fillColor(INK)
      .text(value || "—", left + labelWidth, y, { width });
    doc.y = Math.max(doc.y, y + 12);
  }
}

const planColumns: PdfColumn<[string, LotReportPlanRow]>[] = [
  { header: "Severity", width: 62, value: ([severity]) => severity },
  { header: "AQL", width: 70, value: ([, p]) => formatAql(p.aql) },
  { header: "Code letter", width: 50, align: "center", value: ([, p]) => (p.planLetter === p.codeLetter ? p.codeLetter : `${p.codeLetter} → ${p.planLetter}`) },
  { header: "Sample size", width: 52, align: "right", value: ([, p]) => String(p.sampleSize) },
  { header: "Ac", width: 30, align: "right", value: ([, p]) => String(p.accept) },
  { header: "Re", width: 30, align: "right", value: ([, p]) => String(p.reject) },
  { header: "Inspected", width: 52, align: "right", value: ([, p]) => String(p.inspected) },
  { header: "Defectives found", width: 62, align: "right", value: ([, p]) => String(p.found) },
  { header: "Result", width: 103, value: ([, p]) => classResult(p) },
];

function classResult(p: LotReportPlanRow): string {
  if (p.found >= p.reject) return `Reject (${p.found} ≥ Re ${p.reject})`;
  if (p.inspected < p.sampleSize) return `Pending (${p.inspected} of ${p.sampleSize} inspected)`;
  return `Accept (${p.found} ≤ Ac ${p.accept})`;
}

const unitColumns: PdfColumn<LotReportUnit>[] = [
  { header: "#", width: 28, align: "right", value: (u) => String(u.sampleIndex) },
  { header: "Serial", width: 110, value: (u) => u.serial ?? "(not recorded)" },
  { header: "Grade", width: 44, value: (u) => u.grade ?? "not graded" },
  { header: "Defect classes", width: 165, value: (u) => u.defectClasses.join(", ") },
  { header: "Functional failures", width: 164, value: (u) => u.functionalFailures.join("; ") },
];

const paretoColumns: PdfColumn<ParetoRow>[] = [
  { header: "Defect class", width: 92, value: (r) => r.label },
  { header: "Defects", width: 40, align: "right", value: (r) => String(r.count) },
  { header: "Share", width: 42, align: "right", value: (r) => formatShare(r.share) },
  { header: "Cumul.", width: 42, align: "right", value: (r) => formatShare(r.cumulativeShare) },
];

function verdictBlock(doc: PdfDoc, data: LotReportData, timeZone: string) {
  const { decision } = data;
  const verdict = decision?.verdict ?? data.runningVerdict ?? "pending";
  const title = decision ? (verdict === "accept" ? "Accepted" : "Rejected") : `Not decided yet (running verdict: ${verdict})`;
  doc
    .font(PDF_FONT.bold)
    .fontSize(14)
    .fillColor(verdict === "reject" ? "#A2261C" : verdict === "accept" ? "#1F6B3A" : MUTED)
    .text(title);
  doc.moveDown(0.2);
  if (decision) {
    facts(doc, [
      ["Disposition", decision.disposition ? DISPOSITION_LABELS[decision.disposition] : "not recorded"],
      ["Lead's reason", decision.reason ?? ""],
      ["Decided", `${formatInstant(decision.decidedAt, timeZone)} by ${decision.decidedBy}`],
    ]);
  }
}

function paretoSection(doc: PdfDoc, rows: ParetoRow[]) {
  if (rows.length === 0) {
    doc.font(PDF_FONT.regular).fontSize(9).fillColor(MUTED).text("No cosmetic defects were marked on the sampled units.");
    return;
  }
  const top = doc.y + 4;
  if (top + 210 > doc.page.height - doc.page.margins.bottom) doc.addPage();
  const y = Math.max(doc.y + 4, doc.page.margins.top);
  const left = doc.page.margins.left;
  drawParetoChart(doc, rows, { x: left, y, width: 285, height: 200 });
  const tableEnd = drawTable(doc, paretoColumns, rows, { x: left + 295, y, fontSize: 7.5, padding: 2 });
  doc.y = Math.max(tableEnd, y + 206);
  doc.x = left;
}

function photoPages(doc: PdfDoc, photos: readonly LotReportPhoto[]) {
  const left = doc.page.margins.left;
  const width = doc.page.width - left - doc.page.margins.right;
  const slot = (doc.page.height - doc.page.margins.top - doc.page.margins.bottom - 30) / 2;
  photos.forEach((photo, i) => {
    if (i % 2 === 0) {
      doc.addPage();
      if (i === 0) doc.font(PDF_FONT.bold).fontSize(12).fillColor(INK).text("Annotated photos of defective units", left, doc.page.margins.top);
    }
    const top = doc.page.margins.top + 22 + (i % 2) * (slot + 8);
    doc.font(PDF_FONT.semibold).fontSize(9).fillColor(INK).text(photo.caption, left, top, { width, lineBreak: false, ellipsis: true });
    doc.image(photo.jpeg, left, top + 14, { fit: [width, slot - 18], align: "center" });
  });
}

export async function renderLotReportPdf(data: LotReportData, options: LotReportOptions = {}): Promise<Buffer> {
  const timeZone = options.timeZone ?? "UTC";
  const { lot } = data;
  const doc = createPdf({ title: `Lot inspection report — ${lot.purchaseRef}`, subject: `${lot.supplierName} · ${lot.partTypeName}`, author: data.workspaceName, createdAt: data.generatedAt });
  const left = doc.page.margins.left;

  doc.font(PDF_FONT.bold).fontSize(18).fillColor(INK).text("Lot inspection report", left, doc.page.margins.top);
  doc
    .font(PDF_FONT.regular)
    .fontSize(9)
    .fillColor(MUTED)
    .text(`${data.workspaceName} · generated ${formatInstant(data.generatedAt, timeZone)} by ${data.generatedBy}`);
  doc.moveDown(0.8);
  facts(doc, [
    ["Lot (purchase reference)", lot.purchaseRef],
    ["Supplier", lot.supplierName],
    ["Part type", lot.partTypeName],
    ["Device model family", lot.modelFamily],
    ["Lot size", `${lot.quantity} units, received ${lot.receivedOn}`],
    ["Inspection", `${lot.hundredPercent ? "100 % (every unit)" : `${lot.sampleSize} units sampled`} · level ${lot.inspectionLevel} · ${lot.inspectionSeverity} inspection`],
    ...(lot.switchingReason ? ([["Why this severity", lot.switchingReason]] as [string, string][]) : []),
  ]);

  heading(doc, "Sampling plan per severity (ISO 2859-1 single sampling)");
  const planRows = DEFECT_SEVERITIES.map((severity) => [DEFECT_SEVERITY_LABELS[severity], data.plan[severity]] as [string, LotReportPlanRow]);
  drawTable(doc, planColumns, planRows, { x: left, y: doc.y });
  doc
    .font(PDF_FONT.regular)
    .fontSize(7.5)
    .fillColor(MUTED)
    .text("A unit counts once per severity in which it has a nonconformity; a lot is rejected in a class when the defectives found reach Re.", left, doc.y + 4);

  heading(doc, "Verdict and disposition");
  verdictBlock(doc, data, timeZone);
  doc
    .font(PDF_FONT.regular)
    .fontSize(7.5)
    .fillColor(MUTED)
    .text(GRADE_CAUTION, left, doc.y + 4, { width: doc.page.width - left - doc.page.margins.right });

  heading(doc, "Defect classes (Pareto)");
  paretoSection(doc, paretoRows(data.defectCounts));

  heading(doc, `Sampled units (${data.units.length})`);
  drawTable(doc, unitColumns, data.units, { x: left, y: doc.y });

  photoPages(doc, data.photos);

  stampFooters(doc, `${data.workspaceName} · Lot inspection report · ${lot.purchaseRef}`);
  return pdfBuffer(doc);
}
