/**
 * normalizePhoto speed and memory. Run: `npx tsx bench/normalize.ts` (optional
 * `--concurrency N` to set libvips threads per image; default leaves sharp's own choice).
 *
 * 1. Median wall time of normalizePhoto (validate + orient + preview + thumbnail) on a 12 MP
 *    photo-like JPEG: upright without a colour profile, and tagged 6 with a Display P3 profile
 *    (a phone held upright; converting colours is a real part of the cost). Target <= 250 ms.
 * 2. Peak RSS while 50 photos are normalised one after another, as a worker would. Target <= 600 MB.
 * Figures depend on what else the machine is doing; they are printed, never asserted.
 *
 * The fixtures are generated here and written to a temporary folder; the measuring runs in a
 * child process that only reads them, so the peak RSS is a worker's, not the generator's
 * (building 12 MP of pixels in JS leaves freed memory that glibc keeps in RSS).
 */
import { fork } from "node:child_process";
import { mkdtemp, readFile, readdir, rm, writeFile } from "node:fs/promises";
import { availableParallelism, tmpdir } from "node:os";
import { join } from "node:path";
import sharp from "sharp";
import { configureSharpForWorker, normalizePhoto } from "@/lib/imaging/normalize";
import { makePhotoLikeJpeg } from "@/support/fixtures/make-photos";

const TIMED_RUNS = 11;
// The first call loads the codecs; the next few grow the allocator's heap to a photo's working set
// (until then every 15 MB buffer is fresh memory whose pages fault in: about 7 000 page faults,
// 60-100 ms of system time per photo). A worker that has handled a few photos is past that.
const WARM_UP_RUNS = Number(process.env.BENCH_WARM_UP ?? 3);
const BATCH_SIZE = 50;
const DISTINCT_PHOTOS = 5;

function argument(name: string): string | undefined {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 ? process.argv[at + 1] : undefined;
}

const mb = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(0)} MB`;
const ms = (value: number) => `${value.toFixed(0)} ms`;
const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
};

async function timeOne(label: string, input: Buffer): Promise<void> {
  for (let i = 0; i < WARM_UP_RUNS; i++) await normalizePhoto(input);
  const times: number[] = [];
  const cpuTimes: number[] = [];
  let last;
  for (let i = 0; i < TIMED_RUNS; i++) {
    const start = performance.now();
    const cpuStart = process.cpuUsage();
    last = await normalizePhoto(input);
    const cpu = process.cpuUsage(cpuStart);
    times.push(performance.now() - start);
    cpuTimes.push((cpu.user + cpu.system) / 1000);
  }
  // CPU time (all threads of this process) is less swayed by other work on the machine than wall time.
  console.log(
    `${label}: median ${ms(median(times))} (min ${ms(Math.min(...times))}, max ${ms(Math.max(...times))}, ${TIMED_RUNS} runs;` +
      ` median CPU ${ms(median(cpuTimes))})` +
      ` — input ${mb(input.length)}, preview ${last!.previewWidth}×${last!.previewHeight} ${(last!.preview.length / 1024).toFixed(0)} KB,` +
      ` thumbnail ${last!.thumbnailWidth}×${last!.thumbnailHeight} ${(last!.thumbnail.length / 1024).toFixed(1)} KB`,
  );
}

async function batchPeakRss(photos: Buffer[]): Promise<void> {
  let peak = process.memoryUsage().rss;
  const before = peak;
  // The event loop stays free while libvips works on the thread pool, so sampling sees the peaks.
  const sampler = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 5);
  const start = performance.now();
  for (let i = 0; i < BATCH_SIZE; i++) {
    await normalizePhoto(photos[i % photos.length]);
    peak = Math.max(peak, process.memoryUsage().rss);
  }
  const elapsed = performance.now() - start;
  clearInterval(sampler);
  const after = process.memoryUsage().rss;
  console.log(
    `batch of ${BATCH_SIZE} (12 MP, ${photos.length} distinct, orientation 6, P3 ICC): peak RSS ${mb(peak)} (before ${mb(before)}, after ${mb(after)}),` +
      ` ${ms(elapsed / BATCH_SIZE)} per photo on average`,
  );
}

async function measure(folder: string): Promise<void> {
  const concurrency = argument("concurrency");
  configureSharpForWorker(concurrency ? { concurrency: Number(concurrency) } : {});
  console.log(
    `sharp ${sharp.versions.sharp} / libvips ${sharp.versions.vips}; concurrency ${sharp.concurrency()}, cache off;` +
      ` MALLOC_ARENA_MAX=${process.env.MALLOC_ARENA_MAX ?? "unset"}; ${availableParallelism()} CPUs`,
  );
  console.log(`RSS at start of the measuring process: ${mb(process.memoryUsage().rss)}`);
  const read = (name: string) => readFile(join(folder, name));
  await timeOne("12 MP JPEG, orientation 1, no ICC", await read("upright.jpg"));
  await timeOne("12 MP JPEG, orientation 6, P3 ICC", await read("portrait.jpg"));
  const names = (await readdir(folder)).filter((name) => name.startsWith("batch-")).sort();
  await batchPeakRss(await Promise.all(names.map(read)));
  console.log("targets: median <= 250 ms, peak RSS <= 600 MB");
}

async function main(): Promise<void> {
  const folder = await mkdtemp(join(tmpdir(), "partproof-bench-normalize-"));
  try {
    const photo = (seed: number, orientation?: number) => makePhotoLikeJpeg({ width: 4000, height: 3000, seed, orientation, icc: orientation ? "p3" : undefined });
    await writeFile(join(folder, "upright.jpg"), await photo(1));
    await writeFile(join(folder, "portrait.jpg"), await photo(1, 6));
    for (let i = 0; i < DISTINCT_PHOTOS; i++) await writeFile(join(folder, `batch-${i}.jpg`), await photo(10 + i, 6));
    const child = fork(process.argv[1], ["--measure", folder, ...process.argv.slice(2)], { stdio: "inherit" });
    const exitCode = await new Promise<number | null>((resolve) => child.on("exit", resolve));
    if (exitCode !== 0) throw new Error(`measuring process exited with ${exitCode}`);
  } finally {
    await rm(folder, { recursive: true, force: true });
  }
}

const measureFolder = argument("measure");
await (measureFolder ? measure(measureFolder) : main());
