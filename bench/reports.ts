/**
 * Report production speed. Run: `npm run bench -- reports` (or `npx tsx bench/reports.ts`).
 *
 * 1. Streamed CSV of 100 000 unit rows from an async generator (standing in for a database
 *    cursor) through csvStream, read to the end as a download would. Target <= 5 s and peak RSS
 *    growth <= 100 MB. Measured first, in a process that has not yet decoded any photo.
 * 2. Condition certificate: one-page PDF with three annotated view thumbnails, drawn from the
 *    stored 320 px thumbnails (and, for comparison, from the 2 560 px previews). Target median
 *    <= 300 ms, thumbnails included.
 * 3. Lot inspection report for a 200-unit lot with 40 defective units, each with one annotated
 *    12 MP photo: from the 12 MP originals and from the stored previews. Target <= 5 s.
 * Figures depend on the machine's load (printed with them), so CPU time is printed too; they are
 * printed, never asserted.
 */
import { availableParallelism, loadavg } from "node:os";
import sharp from "sharp";
import { ANNOTATED_EDGE, renderAnnotatedPhoto } from "@/lib/imaging/annotated-photo";
import { renderCertificatePdf } from "@/lib/reports/certificate-pdf";
import { csvStream, type CsvColumn } from "@/lib/reports/csv-stream";
import { renderLotReportPdf } from "@/lib/reports/lot-report-pdf";
import type { Shape } from "@/lib/geometry/shape";
import { makePhotoLikeJpeg } from "@/support/fixtures/make-photos";
import { certificateFixture, lotReportFixture, REPORT_CLASSES } from "@/support/fixtures/report-data";

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
  const cpuStart = process.cpuUsage();
  let bytes = 0;
  const reader = csvStream(csvColumns, unitRows(rows)).getReader();
  for (let next = await reader.read(); !next.done; next = await reader.read()) {
    bytes += next.value.byteLength;
    peak = Math.max(peak, process.memoryUsage().rss);
  }
  const elapsed = performance.now() - start;
  const cpu = process.cpuUsage(cpuStart);
  clearInterval(sampler);
  console.log(
    `CSV export, ${rows.toLocaleString("en")} rows × ${csvColumns.length} columns: ${ms(elapsed)} (CPU ${ms((cpu.user + cpu.system) / 1000)}), ${mb(bytes)} written,` +
      ` peak RSS growth ${mb(peak - before)} (before ${mb(before)}, peak ${mb(peak)})`,
  );
  console.log("  targets: <= 5 s, peak RSS growth <= 100 MB");
}

/** A few regions of every kind, in 4000 × 3000 original pixels. */
function regionsFor(i: number): { defect: string; shape: Shape }[] {
  const dx = (i % 5) * 300;
  return [
    {
      defect: "scratch",
      shape: {
        kind: "line",
        points: [
          [600 + dx, 700],
          [1400 + dx, 1100],
          [1900 + dx, 1150],
        ],
        width: 6,
      },
    },
    {
      defect: "crack",
      shape: {
        kind: "polygon",
        points: [
          [2200, 900 + dx],
          [2700, 1000 + dx],
          [2500, 1500 + dx],
          [2150, 1300 + dx],
        ],
      },
    },
    { defect: "dent", shape: { kind: "rect", x: 900, y: 1800, width: 500, height: 380 } },
    { defect: "dust", shape: { kind: "spot", x: 3100, y: 2200 - dx / 2, radius: 14 } },
  ];
}
const SURFACE: Shape[] = [{ kind: "rect", x: 300, y: 250, width: 3400, height: 2500 }];

/** Wall and CPU time (all threads of this process) of `work`. */
async function timed<T>(work: () => Promise<T>): Promise<{ value: T; wall: number; cpu: number }> {
  const start = performance.now();
  const cpuStart = process.cpuUsage();
  const value = await work();
  const cpu = process.cpuUsage(cpuStart);
  return { value, wall: performance.now() - start, cpu: (cpu.user + cpu.system) / 1000 };
}

async function benchCertificate(label: string, sources: Buffer[]) {
  const run = async () => {
    const thumbs = await timed(() =>
      Promise.all(
        sources.slice(0, 3).map((image, i) =>
          renderAnnotatedPhoto({
            image,
            regionSpace: { width: 4000, height: 3000 },
            regions: regionsFor(i),
            surface: SURFACE,
            classes: REPORT_CLASSES,
            legend: false,
            maxEdge: ANNOTATED_EDGE.certificate,
          }),
        ),
      ),
    );
    const views = thumbs.value.map((t, i) => ({ label: ["Front", "Back", "Lens"][i], photoSha256: "ab".repeat(32), thumbnail: t.jpeg }));
    const pdf = await timed(() => renderCertificatePdf(certificateFixture(views[0].thumbnail, { views })));
    return { total: thumbs.wall + pdf.wall, cpu: thumbs.cpu + pdf.cpu, thumbs: thumbs.wall, pdf: pdf.wall, bytes: pdf.value.length };
  };
  for (let i = 0; i < 3; i++) await run();
  const runs = [];
  for (let i = 0; i < 21; i++) runs.push(await run());
  console.log(
    `condition certificate (3 annotated thumbnails from ${label} + one-page PDF): median ${ms(median(runs.map((r) => r.total)))}` +
      ` (thumbnails ${ms(median(runs.map((r) => r.thumbs)))}, PDF ${ms(median(runs.map((r) => r.pdf)))}; min ${ms(Math.min(...runs.map((r) => r.total)))},` +
      ` max ${ms(Math.max(...runs.map((r) => r.total)))}, 21 runs; median CPU ${ms(median(runs.map((r) => r.cpu)))}), ${(runs[0].bytes / 1024).toFixed(0)} KB`,
  );
}

async function benchLotReport(label: string, photos: Buffer[]) {
  const caption = (n: number) => `Unit OV-CAM-24-${1000 + n} · Front`;
  const annotate = (n: number) =>
    renderAnnotatedPhoto({
      image: photos[n % photos.length],
      regionSpace: { width: 4000, height: 3000 },
      regions: regionsFor(n),
      surface: SURFACE,
      classes: REPORT_CLASSES,
      caption: caption(n),
      maxEdge: ANNOTATED_EDGE.report,
    });
  const annotating = await timed(async () => {
    const done = [];
    // Two at a time: one per core.
    for (let i = 0; i < 40; i += 2) done.push(...(await Promise.all([annotate(i), annotate(i + 1)])));
    return done.map((out, n) => ({ caption: caption(n), jpeg: out.jpeg, width: out.width, height: out.height }));
  });
  const pdf = await timed(() => renderLotReportPdf(lotReportFixture({ units: 200, defective: 40, photos: annotating.value })));
  console.log(
    `lot report, 200 units, 40 photos annotated from ${label}: ${ms(annotating.wall + pdf.wall)} (annotating ${ms(annotating.wall)}, PDF ${ms(pdf.wall)});` +
      ` CPU ${ms(annotating.cpu + pdf.cpu)}; ${mb(pdf.value.length)}`,
  );
}

console.log(`sharp ${sharp.versions.sharp} / libvips ${sharp.versions.vips}, concurrency ${sharp.concurrency()}, cache off; ${availableParallelism()} CPUs`);
sharp.cache(false);
await benchCsv(100_000);

const originals = await Promise.all([1, 2, 3].map((seed) => makePhotoLikeJpeg({ width: 4000, height: 3000, seed })));
// What the photo worker stores beside each original (lib/imaging/normalize.ts): a 2 560 px WebP preview and a 320 px WebP thumbnail.
const previews = await Promise.all(originals.map((jpeg) => sharp(jpeg).resize(2560, 1920).webp({ quality: 82 }).toBuffer()));
const thumbnails = await Promise.all(originals.map((jpeg) => sharp(jpeg).resize(320, 240).webp({ quality: 80 }).toBuffer()));
await benchCertificate("the stored 320 px thumbnails", thumbnails);
await benchCertificate("the 2 560 px previews", previews);
console.log("  target: median <= 300 ms");
await benchLotReport("the 12 MP originals (4000 × 3000 JPEG)", originals);
await benchLotReport("their stored 2 560 px previews (WebP)", previews);
console.log(`  target: lot report <= 5 s (report photos ${ANNOTATED_EDGE.report} px on the long edge)`);
console.log(
  `load average while measuring: ${loadavg()
    .map((l) => l.toFixed(1))
    .join(" ")} on ${availableParallelism()} CPUs`,
);
