/**
 * Benchmark of compareRegionSets as Calibration and Recheck use it: scoring one attempt of 20
 * items means comparing 20 pairs of region sets, each on a 12-megapixel photo (4000 × 3000) with
 * a polygon Surface. Side A is the shared bench scene (50 regions in 3 classes, a new seed per
 * item); side B is A as a second person might mark it: every region moved by up to ±4 px (spots
 * also resized by ±10 %), about one in seven left out, and four extra regions.
 * Target: the 20 comparisons together well under 2 s (issue: calibration scoring of a 20-item
 * set on 12 MP photos <= 2 s in total). Timed with the default exact rasteriser and, for
 * comparison, with sharp's tiles (measureCoverage's default), one after another and two at a time.
 *
 * Run: npm run bench -- compare-regions   (figures are medians of repeated runs on this machine)
 */
import { loadavg } from "node:os";
import { compareRegionSets, type RegionSetComparison, type RegionSetComparisonInput } from "@/lib/imaging/compare-regions";
import type { RegionRaster } from "@/lib/imaging/raster/region-masks";
import { buildComparedPair, HEIGHT, WIDTH } from "@/bench/_photo-scene";

const ITEMS = 20;
const RUNS = 7;

/** Compares the items `concurrency` at a time (1: one after another). */
async function scoreAll(items: RegionSetComparisonInput[], regionRaster: RegionRaster, concurrency = 1) {
  const results: RegionSetComparison[] = [];
  for (let start = 0; start < items.length; start += concurrency) {
    const batch = items.slice(start, start + concurrency);
    results.push(...(await Promise.all(batch.map((item) => compareRegionSets(item, { regionRaster })))));
  }
  return results;
}

/**
 * Wall time of `RUNS` calls after a warm-up (median, min, max), and the process's CPU time (user +
 * system, all threads, sharp's included) per call: on a machine shared with other work the wall
 * time grows with the load, the CPU time much less.
 */
async function timeRuns(task: () => Promise<unknown>) {
  await task();
  const times: number[] = [];
  const cpuBefore = process.cpuUsage();
  for (let run = 0; run < RUNS; run++) {
    const start = performance.now();
    await task();
    times.push(performance.now() - start);
  }
  const cpu = process.cpuUsage(cpuBefore);
  const cpuMs = (cpu.user + cpu.system) / 1000 / RUNS;
  times.sort((x, y) => x - y);
  const median = times[Math.floor(times.length / 2)];
  return { median, label: `${median.toFixed(0)} ms (min ${times[0].toFixed(0)}, max ${times[times.length - 1].toFixed(0)}; CPU ${cpuMs.toFixed(0)} ms)` };
}

const items = Array.from({ length: ITEMS }, (_, index) => buildComparedPair(index));
const exactTimes = await timeRuns(() => scoreAll(items, "exact"));
const sharpTimes = await timeRuns(() => scoreAll(items, "sharp"));
const pairedTimes = await timeRuns(() => scoreAll(items, "sharp", 2));
const results = await scoreAll(items, "exact");

console.log(`${ITEMS} items, ${WIDTH}×${HEIGHT} each, ${items[0].a.length} vs ${items[0].b.length} regions on the first, polygon Surface`);
console.log(`load average (1 min) at the end: ${loadavg()[0].toFixed(2)}`);
console.log(`compare ${ITEMS} pairs of region sets (exact rasteriser, the default), median of ${RUNS}: ${exactTimes.label}  (target well under 2000 ms)`);
console.log(`per item (exact, median total / ${ITEMS}): ${(exactTimes.median / ITEMS).toFixed(1)} ms`);
console.log(`compare ${ITEMS} pairs of region sets (regionRaster "sharp"), median of ${RUNS}: ${sharpTimes.label}`);
console.log(`compare ${ITEMS} pairs of region sets (regionRaster "sharp", two at a time), median of ${RUNS}: ${pairedTimes.label}`);
for (const defect of ["scratch", "dent", "dust"]) {
  const classes = results.map((result) => result.byDefect[defect]).filter(Boolean);
  const meanIou = classes.reduce((sum, entry) => sum + entry.iou, 0) / classes.length;
  const matched = classes.reduce((sum, entry) => sum + entry.matchedA, 0);
  const defects = classes.reduce((sum, entry) => sum + entry.aDefects.length, 0);
  const extra = classes.reduce((sum, entry) => sum + entry.onlyB, 0);
  console.log(`  ${defect.padEnd(8)} mean IoU ${meanIou.toFixed(3)}, A's defects matched ${matched}/${defects}, extra in B ${extra}`);
}
