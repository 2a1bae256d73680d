/**
 * What measuring one 12 MP photo (4000 × 3000) costs on the paths the app uses, and at the limits:
 *
 * 1. The ordinary case: 50 forty-vertex polygons, no Surface. The default path is the exact
 *    scanline rasteriser (lib/imaging/coverage.ts): cost known in advance (raster/cost.ts),
 *    deadline checks inside its loops, no native call; sharp's tiles are the option, shown for
 *    comparison. Targets: default median < 20 ms, p95 < 40 ms. Also the same work as the app
 *    runs it, in a compute thread (lib/compute/pool.ts), round trip included.
 * 2. The worst case the caps allow: a set at the per-photo work budget (MAX_RASTER_ROWS_PER_PHOTO
 *    shape rows) built from the most expensive shapes per row — Lines at the width cap across the
 *    whole photo, and zigzag outlines whose crossings arrive in reverse order on every row — with
 *    every region's box overlapping every other's. It must finish within the inline budget
 *    (MEASURE_INLINE_BUDGET_MS) and far within a background job's (MEASURE_JOB_BUDGET_MS).
 * 3. Beyond the caps: the 4 000 px wide Line, and the same set one row over the budget:
 *    refused with a sentence, from arithmetic on the input (time printed).
 *
 * Run: npm run bench -- measure-cost
 */
import { loadavg } from "node:os";
import type { Point, Shape } from "@/lib/geometry/shape";
import { MAX_RASTER_ROWS_PER_PHOTO } from "@/lib/geometry/limits";
import { closeCompute, runInThread } from "@/lib/compute/pool";
import { MEASURE_INLINE_BUDGET_MS, MEASURE_JOB_BUDGET_MS } from "@/lib/grading/schemas";
import { measureCoverage } from "@/lib/imaging/coverage";
import { rasterRows } from "@/lib/imaging/raster/cost";
import type { CoverageInput } from "@/lib/measure/types";
import { mulberry32 } from "@/support/prng";

const WIDTH = 4000;
const HEIGHT = 3000;
const frame = { width: WIDTH, height: HEIGHT };

function stats(times: number[]) {
  const sorted = [...times].sort((a, b) => a - b);
  const at = (q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];
  return { median: at(0.5), p95: at(0.95), label: `median ${at(0.5).toFixed(1)} ms, p95 ${at(0.95).toFixed(1)} ms (min ${sorted[0].toFixed(1)}, max ${sorted.at(-1)!.toFixed(1)})` };
}

async function time(runs: number, task: () => Promise<unknown>) {
  await task();
  const times: number[] = [];
  for (let k = 0; k < runs; k++) {
    const start = performance.now();
    await task();
    times.push(performance.now() - start);
  }
  return stats(times);
}

function ordinaryScene(): CoverageInput {
  const random = mulberry32(20261214);
  const regions: CoverageInput["regions"] = Array.from({ length: 50 }, (_, k) => {
    const cx = 200 + random() * 3600;
    const cy = 200 + random() * 2600;
    const points: Point[] = Array.from({ length: 40 }, (_, p) => {
      const angle = (2 * Math.PI * p) / 40;
      const radius = 30 + random() * 90;
      return [cx + radius * Math.cos(angle), cy + radius * Math.sin(angle)];
    });
    return { id: `p${k}`, defect: ["scratch", "dent", "chip"][k % 3], shape: { kind: "polygon", points } };
  });
  return { width: WIDTH, height: HEIGHT, regions };
}

/** Shapes worth `rows` shape rows together: half in cap-width Lines across the photo, half in reverse zigzags. */
function worstCaseScene(rows: number): CoverageInput {
  const regions: CoverageInput["regions"] = [];
  const lineRows = HEIGHT; // a Line from the top edge to the bottom edge, clipped
  const lines = Math.floor(rows / 2 / lineRows);
  for (let k = 0; k < lines; k++) {
    const x = (k * 7) % WIDTH;
    regions.push({
      id: `l${k}`,
      defect: "scratch",
      shape: {
        kind: "line",
        points: [
          [x, 0],
          [WIDTH - x, HEIGHT],
        ],
        width: 200,
      },
    });
  }
  // Combs of 200 teeth across all rows (201 points, closed along the top edge, so they enclose
  // area and would pass the save validation), x decreasing: each row's crossings come in reverse order.
  let left =
    rows -
    rasterRows(
      regions.map((r) => r.shape),
      frame,
    );
  for (let k = 0; left > 0; k++) {
    const points: Point[] = Array.from({ length: 201 }, (_, i) => [WIDTH - 1 - i * 15 - (k % 15), i % 2 ? HEIGHT : 0]);
    const shape: Shape = { kind: "polygon", points };
    const cost = rasterRows([shape], frame);
    if (cost > left) {
      // Top up with full-height Lines, then a box of exactly the rows still left.
      for (let j = 0; left >= lineRows; j++, left -= lineRows)
        regions.push({
          id: `t${j}`,
          defect: "scratch",
          shape: {
            kind: "line",
            points: [
              [j * 11, 0],
              [j * 11 + 5, HEIGHT],
            ],
            width: 200,
          },
        });
      if (left > 0) regions.push({ id: `b${k}`, defect: "chip", shape: { kind: "rect", x: 10, y: 0, width: 50, height: left } });
      break;
    }
    regions.push({ id: `z${k}`, defect: "dent", shape });
    left -= cost;
  }
  return { width: WIDTH, height: HEIGHT, regions };
}

console.log(`photo ${WIDTH} × ${HEIGHT}; load average (1 min) at start: ${loadavg()[0].toFixed(2)}`);

const ordinary = ordinaryScene();
const exactOrdinary = await time(201, () => measureCoverage(ordinary));
const sharpOrdinary = await time(51, () => measureCoverage(ordinary, { regionRaster: "sharp" }));
console.log(`ordinary: 50 forty-vertex polygons, no Surface`);
console.log(`  default path (exact scanline), 201 runs: ${exactOrdinary.label}  (targets: median < 20 ms, p95 < 40 ms)`);
console.log(`  sharp tiles (option), 51 runs: ${sharpOrdinary.label}`);
const partType = {
  views: [{ key: "front", label: "Front", required: true, zones: [] }],
  defectClasses: ["scratch", "dent", "chip"].map((key) => ({ key, label: key, severity: "minor" as const })),
  nominalSizeMm: null,
  panelResolution: null,
};
const unitInput = {
  partType,
  rubric: { rules: [] },
  functionalFailures: { critical: 0, major: 0, minor: 0 },
  photos: [{ photoId: "p", viewKey: "front", width: WIDTH, height: HEIGHT, regionsVersion: 1, defects: ordinary.regions, surfaces: [], rulers: [] }],
};
const pooled = await time(101, () => runInThread("measure-unit", unitInput));
console.log(`  as the app runs it (measureUnit in a compute thread, round trip), 101 runs: ${pooled.label}`);

const worst = worstCaseScene(MAX_RASTER_ROWS_PER_PHOTO);
const worstRows = rasterRows([...worst.regions.map((r) => r.shape)], frame);
const worstTime = await time(5, () => measureCoverage(worst));
console.log(`worst case within the caps: ${worst.regions.length} regions, ${(worstRows / 1e6).toFixed(2)} million shape rows (budget ${(MAX_RASTER_ROWS_PER_PHOTO / 1e6).toFixed(1)} million)`);
console.log(`  default path, 5 runs: ${worstTime.label}  (must stay under the inline budget ${MEASURE_INLINE_BUDGET_MS} ms; job budget ${MEASURE_JOB_BUDGET_MS / 1000} s)`);
const worstPooled = await time(3, () => runInThread("measure-unit", { ...unitInput, photos: [{ ...unitInput.photos[0], defects: worst.regions }] }, { timeoutMs: MEASURE_JOB_BUDGET_MS }));
console.log(`  in a compute thread, 3 runs: ${worstPooled.label}`);

async function refusal(label: string, input: CoverageInput) {
  const start = performance.now();
  const outcome = await measureCoverage(input).then(
    () => "measured (not refused!)",
    (err: Error) => err.message,
  );
  console.log(`beyond the caps — ${label}: ${(performance.now() - start).toFixed(1)} ms → ${outcome.slice(0, 220)}`);
}
await refusal("a 4 000 px wide 2-point Line", {
  width: WIDTH,
  height: HEIGHT,
  regions: [
    {
      id: "w",
      defect: "scratch",
      shape: {
        kind: "line",
        points: [
          [0, 1500],
          [4000, 1500],
        ],
        width: 4000,
      },
    },
  ],
});
await refusal("the worst-case set plus one row", { ...worst, regions: [...worst.regions, { id: "extra", defect: "chip", shape: { kind: "rect", x: 0, y: 0, width: 5, height: 1 } }] });
console.log(`load average (1 min) at the end: ${loadavg()[0].toFixed(2)}`);
await closeCompute();
