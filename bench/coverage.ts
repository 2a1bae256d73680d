/**
 * Benchmark of measureCoverage on a 12-megapixel photo (4000 × 3000) with 50 regions in 3 defect
 * classes (lines, polygons, rects, spots of realistic defect sizes), a polygon surface and 3 zones.
 *
 * Baseline ("naive"): one full-frame crispEdges SVG per defect class, one for the surface and one
 * per zone, each rendered by sharp to a 12 MP single-channel mask and counted with raw pixel loops
 * (it produces px and the zone figures, not counts — that only makes it cheaper).
 * Reference: exact areas from polygon-clipping (union of the class's outlines ∩ surface, shoelace
 * area; circles and caps as 256-gons, ~1e-4 low).
 *
 * Run: npx tsx bench/coverage.ts   (figures are medians of repeated runs on this machine)
 */
import { loadavg } from "node:os";
import sharp from "sharp";
import type { Shape } from "@/lib/geometry/shape";
import type { CoverageInput } from "@/lib/measure/types";
import { measureCoverage } from "@/lib/imaging/coverage";
import { exactUnion, multiPolygonArea, polygonClipping } from "@/support/exact-areas";
import { buildPhotoScene, HEIGHT, WIDTH } from "@/bench/_photo-scene";

const RUNS = 21;
const BASELINE_RUNS = 5;

// ---- naive baseline -------------------------------------------------------------------------

function svgElement(shape: Shape): string {
  switch (shape.kind) {
    case "rect":
      return `<rect x="${shape.x}" y="${shape.y}" width="${shape.width}" height="${shape.height}"/>`;
    case "spot":
      return `<circle cx="${shape.x}" cy="${shape.y}" r="${shape.radius}"/>`;
    case "polygon":
      return `<polygon points="${shape.points.map((p) => p.join(",")).join(" ")}"/>`;
    case "line":
      return `<polyline points="${shape.points.map((p) => p.join(",")).join(" ")}" fill="none" stroke="#fff" stroke-width="${shape.width}" stroke-linecap="round" stroke-linejoin="round"/>`;
  }
}

async function fullFrameMask(shapes: Shape[]): Promise<Uint8Array> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${WIDTH}" height="${HEIGHT}" shape-rendering="crispEdges" fill="#fff">${shapes.map(svgElement).join("")}</svg>`;
  return sharp(Buffer.from(svg)).extractChannel(3).raw().toBuffer();
}

async function naiveCoverage(input: CoverageInput) {
  const defects = [...new Set(input.regions.map((region) => region.defect))];
  const surface = await fullFrameMask(input.surface ?? []);
  const zones = input.zones ?? [];
  const zoneMasks: Uint8Array[] = [];
  for (const zone of zones) zoneMasks.push(await fullFrameMask([zone.shape]));
  const result: Record<string, { px: number; zonePx: number[] }> = {};
  for (const defect of defects) {
    const mask = await fullFrameMask(input.regions.filter((region) => region.defect === defect).map((region) => region.shape));
    let px = 0;
    const zonePx = zones.map(() => 0);
    for (let index = 0; index < mask.length; index++) {
      if (mask[index] > 127 && surface[index] > 127) {
        px++;
        for (let z = 0; z < zoneMasks.length; z++) if (zoneMasks[z][index] > 127) zonePx[z]++;
      }
    }
    result[defect] = { px, zonePx };
  }
  let surfacePx = 0;
  for (let index = 0; index < surface.length; index++) if (surface[index] > 127) surfacePx++;
  return { surfacePx, result };
}

// ---- exact reference (polygon-clipping) -----------------------------------------------------

function exactClassArea(input: CoverageInput, defect: string): number {
  const union = exactUnion(input.regions.filter((region) => region.defect === defect).map((region) => region.shape));
  return multiPolygonArea(polygonClipping.intersection(union, exactUnion(input.surface ?? [])));
}

// ---- run ------------------------------------------------------------------------------------

/** Times `runs` calls after a warm-up; the median is the figure, min and p25 show the noise. */
async function timeRuns(runs: number, task: () => Promise<unknown>) {
  await task();
  const times: number[] = [];
  for (let k = 0; k < runs; k++) {
    const start = performance.now();
    await task();
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  const median = times[Math.floor(times.length / 2)];
  return { median, label: `${median.toFixed(1)} ms (min ${times[0].toFixed(1)}, p25 ${times[Math.floor(times.length / 4)].toFixed(1)})` };
}

const scene = buildPhotoScene();
const measured = await measureCoverage(scene);
const naive = await naiveCoverage(scene);

// The default rasteriser is the exact scanline one (lib/imaging/coverage.ts says why); sharp is the option.
const fast = await timeRuns(RUNS, () => measureCoverage(scene));
const sharpMode = await timeRuns(RUNS, () => measureCoverage(scene, { regionRaster: "sharp" }));
const baseline = await timeRuns(BASELINE_RUNS, () => naiveCoverage(scene));

console.log(`scene: ${WIDTH}×${HEIGHT}, ${scene.regions.length} regions, 3 classes, polygon surface, ${scene.zones?.length} zones`);
console.log(`load average (1 min) at the end: ${loadavg()[0].toFixed(2)}`);
console.log(`measureCoverage (exact scanline, default), median of ${RUNS}: ${fast.label}  (target <= 40 ms)`);
console.log(`measureCoverage (regionRaster "sharp"), median of ${RUNS}: ${sharpMode.label}`);
console.log(`naive full-frame baseline, median of ${BASELINE_RUNS}: ${baseline.label}`);
console.log(`speed-up vs baseline (medians): ${(baseline.median / fast.median).toFixed(1)}×  (target >= 5×)`);

let worstError = 0;
for (const defect of Object.keys(measured.byDefect)) {
  const exact = exactClassArea(scene, defect);
  const px = measured.byDefect[defect].px;
  const error = Math.abs(px - exact) / exact;
  worstError = Math.max(worstError, error);
  console.log(`  ${defect.padEnd(8)} px ${px} (baseline ${naive.result[defect].px}) exact ${exact.toFixed(1)} → error ${(error * 100).toFixed(3)} %, count ${measured.byDefect[defect].count}`);
}
const exactSurface = multiPolygonArea(exactUnion(scene.surface ?? []));
console.log(
  `  surface  px ${measured.surfacePx} (baseline ${naive.surfacePx}) exact ${exactSurface.toFixed(1)} → error ${((Math.abs(measured.surfacePx - exactSurface) / exactSurface) * 100).toFixed(4)} %`,
);
console.log(`relative area error vs exact (worst class): ${(worstError * 100).toFixed(3)} % (target <= 1 %)`);
