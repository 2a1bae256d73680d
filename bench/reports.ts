/**
 * Report production speed. Run: `npm run bench -- reports` (or `npx tsx bench/reports.ts`).
 *
 * 1. Streamed CSV of 100 000 unit rows from an async generator (standing in for a database
 *    cursor) through csvStream, read to the end as a download would. Target <= 5 s and peak RSS
 *    growth <= 100 MB. Measured first, in a process that has not yet decoded any photo.
 * 2. Condition certificate: one-page PDF with three view thumbnails drawn from 2 560 px previews
 *    (as stored by the photo worker). Target median <= 300 ms (thumbnails included).
 * 3. Lot inspection report for a 200-unit lot with 40 defective units, each with one annotated
 *    12 MP photo: from the 12 MP originals and from the stored previews. Target <= 5 s.
 * Figures depend on the machine's load; they are printed, never asserted.
 */
import { availableParallelism } from "node:os";
import sharp from "sharp";
import { renderAnnotatedPhoto } from "@/lib/imaging/annotated-photo";
import { renderCertificatePdf } from "@/lib/reports/certificate-pdf";
import { csvStream, type CsvColumn } from "@/lib/reports/csv-stream";
import { renderLotReportPdf } from "@/lib/reports/lot-report-pdf";
import type { Shape } from "@/lib/geometry/shape";
import { makePhotoLikeJpeg } from "@/tests/support/fixtures/make-photos";
import { certificateFixture, lotReportFixture, REPORT_CLASSES } from "@/tests/support/fixtures/report-data";

const mb = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
const ms = (value: number) => `${value.toFixed(0)} ms`;
const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
};

type UnitRow = { id: number; serial: string; lot: string; supplier: string; partType: string; grade: string; gradedAt: Date; inspector: string; defects: number; scratchMm: number; note: string };

async function* unitRows(count: number): AsyncGenerator<UnitRow> {
  const base = Date.parse("2026-01-01T00:00:00Z");
  for (let i = 0; i < count; i++) {
    yield {
      id: i + 1,
      serial: `OV-CAM-24-${String(i).padStart(6, "0")}`,
      lot: `PO-2026-${String(i % 500).padStart(4, "0")}`,
      supplier: i % 3 ? "Ørjan Brændøy Komponenter" : "Moravec, Piet & Söhne",
      partType: "Rear camera module",
      grade: ["A", "B", "C", "Reject"][i % 4],
      gradedAt: new Date(base + i * 60_000),
      inspector: "Zoë Łukasiewicz",
      defects: i % 7,
      scratchMm: (i % 97) / 10,
      note: i % 10 === 0 ? 'lens ring "loose", re-seated\nchecked twice' : "",
    };
  }
}

const csvColumns: CsvColumn<UnitRow>[] = [
  { header: "unit_id", value: (r) => r.id },
  { header: "serial", value: (r) => r.serial },
  { header: "lot", value: (r) => r.lot },
  { header: "supplier", value: (r) => r.supplier },
  { header: "part_type", value: (r) => r.partType },
  { header: "grade", value: (r) => r.grade },
  { header: "graded_at", value: (r) => r.gradedAt },
  { header: "inspector", value: (r) => r.inspector },
  { header: "defects", value: (r) => r.defects },
  { header: "longest_scratch_mm", value: (r) => r.scratchMm },
  { header: "note", value: (r) => r.note },
];

async function benchCsv(rows: number) {
  const before = process.memoryUsage().rss;
  let peak = before;
  const sampler = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 5);
  const start = performance.now();
  let bytes = 0;
  const reader = csvStream(csvColumns, unitRows(rows)).getReader();
  for (let next = await reader.read(); !next.done; next = await reader.read()) {
    bytes += next.value.byteLength;
    peak = Math.max(peak, process.memoryUsage().rss);
  }
  const elapsed = performance.now() - start;
  clearInterval(sampler);
  console.log(`CSV export, ${rows.toLocaleString("en")} rows × ${csvColumns.length} columns: ${ms(elapsed)}, ${mb(bytes)} written, peak RSS growth ${mb(peak - before)} (before ${mb(before)}, peak ${mb(peak)})`);
  console.log("  targets: <= 5 s, peak RSS growth <= 100 MB");
}

/** A few regions of every kind, in 4000 × 3000 original pixels. */
function regionsFor(i: number): { defect: string; shape: Shape }[] {
  const dx = (i % 5) * 300;
  return [
    { defect: "scratch", shape: { kind: "line", points: [[600 + dx, 700], [1400 + dx, 1100], [1900 + dx, 1150]], width: 6 } },
    { defect: "crack", shape: { kind: "polygon", points: [[2200, 900 + dx], [2700, 1000 + dx], [2500, 1500 + dx], [2150, 1300 + dx]] } },
    { defect: "dent", shape: { kind: "rect", x: 900, y: 1800, width: 500, height: 380 } },
    { defect: "dust", shape: { kind: "spot", x: 3100, y: 2200 - dx / 2, radius: 14 } },
  ];
}
const SURFACE: Shape[] = [{ kind: "rect", x: 300, y: 250, width: 3400, height: 2500 }];

async function benchCertificate(previews: Buffer[]) {
  const run = async () => {
    const start = performance.now();
    const thumbnails = await Promise.all(
      previews.slice(0, 3).map((image, i) => renderAnnotatedPhoto({ image, regionSpace: { width: 4000, height: 3000 }, regions: regionsFor(i), surface: SURFACE, classes: REPORT_CLASSES, legend: false, maxEdge: 480 })),
    );
    const middle = performance.now();
    const pdf = await renderCertificatePdf(certificateFixture(thumbnails[0].jpeg, { views: thumbnails.map((t, i) => ({ label: ["Front", "Back", "Lens"][i], photoSha256: "ab".repeat(32), thumbnail: t.jpeg })) }));
    return { total: performance.now() - start, thumbs: middle - start, pdf: performance.now() - middle, bytes: pdf.length };
  };
  for (let i = 0; i < 3; i++) await run();
  const runs = [];
  for (let i = 0; i < 21; i++) runs.push(await run());
  console.log(
    `condition certificate (3 thumbnails from 2560 px previews + one-page PDF): median ${ms(median(runs.map((r) => r.total)))}` +
      ` (thumbnails ${ms(median(runs.map((r) => r.thumbs)))}, PDF ${ms(median(runs.map((r) => r.pdf)))}; min ${ms(Math.min(...runs.map((r) => r.total)))}, max ${ms(Math.max(...runs.map((r) => r.total)))}, 21 runs), ${(runs[0].bytes / 1024).toFixed(0)} KB`,
  );
  console.log("  target: median <= 300 ms");
}

async function benchLotReport(label: string, photos: Buffer[], regionSpace: { width: number; height: number }) {
  const start = performance.now();
  const annotated = [];
  // Two at a time: libvips already spreads one photo over the cores.
  for (let i = 0; i < 40; i += 2) {
    annotated.push(
      ...(await Promise.all(
        [i, i + 1].map(async (n) => {
          const out = await renderAnnotatedPhoto({ image: photos[n % photos.length], regionSpace, regions: regionsFor(n), surface: SURFACE, classes: REPORT_CLASSES, caption: `Unit OV-CAM-24-${1000 + n} · Front`, maxEdge: 1400 });
          return { caption: `Unit OV-CAM-24-${1000 + n} · Front`, jpeg: out.jpeg, width: out.width, height: out.height };
        }),
      )),
    );
  }
  const middle = performance.now();
  const pdf = await renderLotReportPdf(lotReportFixture({ units: 200, defective: 40, photos: annotated }));
  const end = performance.now();
  console.log(`lot report, 200 units, 40 annotated photos from ${label}: ${ms(end - start)} (annotating ${ms(middle - start)}, PDF ${ms(end - middle)}), ${mb(pdf.length)}`);
}

console.log(`sharp ${sharp.versions.sharp} / libvips ${sharp.versions.vips}, concurrency ${sharp.concurrency()}, cache off; ${availableParallelism()} CPUs`);
sharp.cache(false);
await benchCsv(100_000);

const originals = await Promise.all([1, 2, 3].map((seed) => makePhotoLikeJpeg({ width: 4000, height: 3000, seed })));
const previews = await Promise.all(originals.map((jpeg) => sharp(jpeg).resize(2560, 1920).webp({ quality: 82 }).toBuffer()));
await benchCertificate(previews);
await benchLotReport("the 12 MP originals (4000 × 3000 JPEG)", originals, { width: 4000, height: 3000 });
await benchLotReport("their stored 2560 px previews (WebP)", previews, { width: 4000, height: 3000 });
console.log("  target: lot report <= 5 s");
