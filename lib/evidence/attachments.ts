/**
 * The files of an evidence pack, from the lot report's data: the lot inspection report (PDF), each
 * defective unit's photos with the regions drawn in and a legend (renderAnnotatedPhoto: classes
 * told apart by pattern as well as colour), and a CSV of the sampled units. Pure apart from the
 * rendering libraries: data in, buffers out.
 *
 * Over the size limit (EVIDENCE_ATTACHMENT_LIMIT_BYTES, 10 MB by default: a common mailbox limit,
 * common practice) the e-mail carries an expiring evidence link instead of the files.
 */
import type { EvidenceAttachment } from "@/db/schema/evidence";
import type { LotReportData } from "@/lib/reports/lot-report-data";
import { renderLotReportPdf } from "@/lib/reports/lot-report-pdf";
import { csvHeader, csvLines, type CsvColumn } from "@/lib/reports/csv-stream";

export const DEFAULT_EVIDENCE_LIMIT_BYTES = 10 * 1024 * 1024;

export type EvidenceFile = EvidenceAttachment & { content: Buffer };

/** File-name safe text: letters, digits, dot, dash and underscore. */
const safe = (text: string) => text.replace(/[^A-Za-z0-9._-]+/g, "_").replace(/^_+|_+$/g, "") || "file";

type Unit = LotReportData["units"][number];
const UNIT_COLUMNS: CsvColumn<Unit>[] = [
  { header: "sample_index", value: (u) => u.sampleIndex },
  { header: "serial", value: (u) => u.serial },
  { header: "grade", value: (u) => u.grade },
  { header: "defect_classes", value: (u) => u.defectClasses.join("; ") },
  { header: "functional_failures", value: (u) => u.functionalFailures.join("; ") },
];

/** The sampled units as CSV (RFC 4180, UTF-8 with a BOM, csv-stream.ts). */
export function sampledUnitsCsv(report: LotReportData): Buffer {
  return Buffer.from(csvHeader(UNIT_COLUMNS as CsvColumn<never>[]) + (report.units.length ? csvLines(UNIT_COLUMNS, report.units) : ""), "utf8");
}

export async function evidenceFiles(report: LotReportData, { timeZone }: { timeZone: string }): Promise<EvidenceFile[]> {
  const ref = safe(report.lot.purchaseRef);
  const pdf = await renderLotReportPdf(report, { timeZone });
  const files: EvidenceFile[] = [{ filename: `lot-report-${ref}.pdf`, contentType: "application/pdf", bytes: pdf.length, content: pdf }];
  const seen = new Set<string>();
  for (const [i, photo] of report.photos.entries()) {
    let name = `photo-${String(i + 1).padStart(2, "0")}-${safe(photo.caption)}.jpg`;
    if (seen.has(name)) name = name.replace(/\.jpg$/, `-${i + 1}.jpg`);
    seen.add(name);
    files.push({ filename: name, contentType: "image/jpeg", bytes: photo.jpeg.length, content: photo.jpeg });
  }
  const csv = sampledUnitsCsv(report);
  files.push({ filename: `sampled-units-${ref}.csv`, contentType: "text/csv; charset=utf-8", bytes: csv.length, content: csv });
  return files;
}

export const totalBytes = (files: readonly EvidenceAttachment[]) => files.reduce((sum, f) => sum + f.bytes, 0);
