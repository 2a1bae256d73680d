/**
 * Report production speed. Run: `npm run bench -- reports` (or `npx tsx bench/reports.ts`).
 *
 * 1. csvStream alone: 100 000 unit rows from an async generator through csvStream, read to the
 *    end as a download would (the formatting's share). The export from PostgreSQL through its
 *    pg-cursor, with its memory growth, is bench/csv-export.ts. Measured first, in a process that
 *    has not yet decoded any photo.
 * 2. Condition certificate: one-page PDF with three annotated view thumbnails, drawn from the
 *    stored 320 px thumbnails (and, for comparison, from the 2 560 px previews). Target median
 *    <= 300 ms, thumbnails included.
 * 3. Lot inspection report for a 200-unit lot with 40 defective units, each with one annotated
 *    photo of a 12 MP original, through the app's own path (annotateReportPhotos: fetch each stored
 *    2 560 px preview from an S3 store, draw, encode; then the PDF), one at a time as before and a
 *    few at a time as now; and from the 12 MP originals for comparison. Target <= 5 s.
 * Figures depend on the machine's load (printed with them), so CPU time is printed too; they are
 * printed, never asserted.
 */
import fs from "node:fs";
import os, { availableParallelism, loadavg } from "node:os";
import path from "node:path";
import { spawn } from "node:child_process";
import sharp from "sharp";
import { ANNOTATED_EDGE, renderAnnotatedPhoto } from "@/lib/imaging/annotated-photo";
import { renderCertificatePdf } from "@/lib/reports/certificate-pdf";
import { csvStream, type CsvColumn } from "@/lib/reports/csv-stream";
import { renderLotReportPdf } from "@/lib/reports/lot-report-pdf";
import { annotateReportPhotos, reportPhotoConcurrency, type ReportPhotoRow } from "@/lib/reports/lot-report-photos";
import { createObjectStore, getObjectBuffer, putObject, type ObjectStore } from "@/lib/storage/s3";
import type { Shape } from "@/lib/geometry/shape";
import { makePhotoLikeJpeg } from "@/support/fixtures/make-photos";
import { certificateFixture, lotReportFixture, REPORT_CLASSES } from "@/support/fixtures/report-data";
import { readMeasured } from "./_stream-measure";

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
  const r = await readMeasured(csvStream(csvColumns, unitRows(rows)));
  console.log(
    `CSV export, ${rows.toLocaleString("en")} rows × ${csvColumns.length} columns: ${ms(r.elapsed)} (CPU ${ms(r.cpu)}), ${mb(r.bytes)} written,` +
      ` peak RSS growth ${mb(r.growth)} (before ${mb(r.before)}, peak ${mb(r.peak)})`,
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

/**
 * The lot report as the app makes it (lib/reports/lot-report-load.ts): the photos' stored objects
 * fetched from an S3 store (a local s3rver the bench starts, as `npm start` does) and drawn by
 * annotateReportPhotos, then the PDF. Only the rows come from memory instead of PostgreSQL (one
 * query of a few ms). `concurrency` 1 is how the app did it before (one photo after another).
 */
async function benchLotReport(store: ObjectStore, label: string, keys: string[], concurrency: number) {
  const units = new Map(Array.from({ length: 40 }, (_, n) => [`unit-${n}`, { serial: `OV-CAM-24-${1000 + n}`, sampleIndex: n * 5 + 1, grade: "C" }]));
  const rows: ReportPhotoRow[] = Array.from({ length: 40 }, (_, n) => ({
    unitId: `unit-${n}`,
    viewKey: "front",
    previewKey: keys[n],
    width: 4000,
    height: 3000,
    regions: [...regionsFor(n).map((r) => ({ role: "defect" as const, defect: r.defect, shape: r.shape })), ...SURFACE.map((shape) => ({ role: "surface" as const, defect: null, shape }))],
  }));
  const annotating = await timed(() =>
    annotateReportPhotos(rows, { read: (key) => getObjectBuffer(store, key), units, classes: REPORT_CLASSES, views: [{ key: "front", label: "Front" }], concurrency }),
  );
  if (annotating.value.length !== 40) throw new Error(`expected 40 annotated photos, got ${annotating.value.length}`);
  const pdf = await timed(() => renderLotReportPdf(lotReportFixture({ units: 200, defective: 40, photos: annotating.value })));
  const photoBytes = annotating.value.reduce((sum, p) => sum + p.jpeg.length, 0);
  console.log(
    `lot report, 200 units, 40 photos fetched and annotated from ${label}, ${concurrency} at a time: ${ms(annotating.wall + pdf.wall)}` +
      ` (fetching + annotating ${ms(annotating.wall)}, PDF ${ms(pdf.wall)}); CPU ${ms(annotating.cpu + pdf.cpu)}; PDF ${mb(pdf.value.length)},` +
      ` photos ${annotating.value[0].width} × ${annotating.value[0].height} px, ${mb(photoBytes)} in all`,
  );
}

/**
 * A local S3 store for the time of `work`: s3rver (as scripts/lib/local-s3.ts runs it for `npm
 * start`) in its own process, on a free port, over a temporary folder. Its own process, so the CPU
 * time printed is the app's side only, as with a real store.
 */
async function withLocalStore(work: (store: ObjectStore) => Promise<void>) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "partproof-bench-s3-"));
  const script =
    `const S3rver = require("s3rver");` +
    `new S3rver({ address: "127.0.0.1", port: 0, directory: process.argv[1], silent: true, configureBuckets: [{ name: "bench", configs: [] }] })` +
    `.run().then(({ port }) => console.log(port), (e) => { console.error(e); process.exit(1); });`;
  const child = spawn(process.execPath, ["-e", script, dir], { stdio: ["ignore", "pipe", "inherit"] });
  try {
    const port = await new Promise<number>((resolve, reject) => {
      child.stdout.once("data", (chunk: Buffer) => resolve(Number(String(chunk).trim())));
      child.once("exit", (code) => reject(new Error(`the local S3 store stopped (exit ${code})`)));
    });
    await work(createObjectStore({ endpoint: `http://127.0.0.1:${port}`, region: "us-east-1", bucket: "bench", accessKeyId: "S3RVER", secretAccessKey: "S3RVER", forcePathStyle: true }));
  } finally {
    child.kill();
    fs.rmSync(dir, { recursive: true, force: true });
  }
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
// The web app's sharp settings: `npm start` runs it without MALLOC_ARENA_MAX, so libvips uses one
// thread per image there (sharp's default on glibc); this process was started with it for the photo worker.
const benchConcurrency = sharp.concurrency();
sharp.concurrency(1);
await withLocalStore(async (store) => {
  // 40 photos of 40 units; three different pictures (a 12 MP synthetic photo takes ~1 s to make in JS), each under its own key per unit.
  const previewKeys = await Promise.all(
    Array.from({ length: 40 }, async (_, n) => (await putObject(store, `previews/${n}.webp`, previews[n % 3], { contentType: "image/webp" }), `previews/${n}.webp`)),
  );
  const originalKeys = await Promise.all(
    Array.from({ length: 40 }, async (_, n) => (await putObject(store, `originals/${n}.jpg`, originals[n % 3], { contentType: "image/jpeg" }), `originals/${n}.jpg`)),
  );
  const parallel = reportPhotoConcurrency();
  console.log(`lot report: sharp concurrency ${sharp.concurrency()} per image as in the web app (this process had ${benchConcurrency}); photos from a local S3 store`);
  // Interleaved, so both see the same load.
  await benchLotReport(store, "the stored 2 560 px previews (WebP; what the app reads)", previewKeys, 1);
  await benchLotReport(store, "the stored 2 560 px previews (WebP; what the app reads)", previewKeys, parallel);
  await benchLotReport(store, "the stored 2 560 px previews (WebP; what the app reads)", previewKeys, 1);
  await benchLotReport(store, "the stored 2 560 px previews (WebP; what the app reads)", previewKeys, parallel);
  await benchLotReport(store, "the 12 MP originals (4000 × 3000 JPEG; for comparison)", originalKeys, parallel);
});
console.log(`  target: lot report <= 5 s (report photos ${ANNOTATED_EDGE.report} px on the long edge; the app draws ${reportPhotoConcurrency()} at a time on this machine)`);
console.log(
  `load average while measuring: ${loadavg()
    .map((l) => l.toFixed(1))
    .join(" ")} on ${availableParallelism()} CPUs`,
);
