/**
 * Speed and hit rate of suggestPixelCandidates on generated photos of a lit test screen: a dark
 * table, the device's body, the lit panel with rounded corners (mid grey with a gradient, noise
 * σ 3), JPEG q90 4:4:4, and 24 planted faults (1 to 3 px; lit, dark, one element up, one down)
 * spread over the active area. Searched twice: the whole frame (no area given), and the way the
 * Bench asks — inside the Surface (the body's outline) and the view's active-screen zone, an edge
 * band in from their edges. Prints the median wall-clock and CPU time of 5 runs after a warm-up,
 * faults found and false candidates; asserts nothing. Run: npm run bench -- pixel-candidates
 */
import sharp from "sharp";
import type { Point } from "@/lib/geometry/shape";
import { suggestPixelCandidates, type PixelCandidateOptions } from "@/lib/imaging/pixel-candidates";
import { mulberry32 as prng } from "@/support/prng";

type Rect = { x0: number; y0: number; x1: number; y1: number };

/** Whether (x, y) lies in a rectangle with corners rounded to radius r. */
function inRounded(x: number, y: number, r: Rect, radius: number): boolean {
  if (x < r.x0 || x >= r.x1 || y < r.y0 || y >= r.y1) return false;
  const cx = Math.min(Math.max(x, r.x0 + radius), r.x1 - radius);
  const cy = Math.min(Math.max(y, r.y0 + radius), r.y1 - radius);
  return Math.hypot(x - cx, y - cy) <= radius;
}

/** A rounded rectangle as a polygon (8 points per corner). */
function roundedPolygon(r: Rect, radius: number): Point[] {
  const corners: [number, number, number][] = [
    [r.x1 - radius, r.y0 + radius, -90],
    [r.x1 - radius, r.y1 - radius, 0],
    [r.x0 + radius, r.y1 - radius, 90],
    [r.x0 + radius, r.y0 + radius, 180],
  ];
  return corners.flatMap(([cx, cy, start]) =>
    Array.from({ length: 8 }, (_, k): Point => {
      const a = ((start + (k * 90) / 7) * Math.PI) / 180;
      return [cx + radius * Math.cos(a), cy + radius * Math.sin(a)];
    }),
  );
}

async function screenPhoto(width: number, height: number) {
  const random = prng(width);
  const s = width / 4000;
  const body: Rect = { x0: 560 * s, y0: 220 * s, x1: 3440 * s, y1: 2780 * s };
  const lit: Rect = { x0: 640 * s, y0: 270 * s, x1: 3360 * s, y1: 2730 * s };
  const data = Buffer.alloc(width * height * 3);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const level = inRounded(x, y, lit, 100 * s) ? 128 + 30 * (x / width - 0.5) : inRounded(x, y, body, 140 * s) ? 38 : 18;
      for (let c = 0; c < 3; c++) {
        const n = 3 * Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
        data[(y * width + x) * 3 + c] = Math.max(0, Math.min(255, Math.round(level + n)));
      }
    }
  }
  // The view's zone, as the display part type defines it: 0.04–0.96 × 0.03–0.97 of the Surface box.
  const bw = body.x1 - body.x0;
  const bh = body.y1 - body.y0;
  const zone: Rect = { x0: body.x0 + 0.04 * bw, y0: body.y0 + 0.03 * bh, x1: body.x0 + 0.96 * bw, y1: body.y0 + 0.97 * bh };
  const planted: [number, number][] = [];
  for (let k = 0; k < 24; k++) {
    const size = 1 + (k % 3);
    const x = Math.floor(zone.x0 + 80 * s + ((k % 6) + 0.5) * ((zone.x1 - zone.x0 - 160 * s) / 6));
    const y = Math.floor(zone.y0 + 80 * s + (Math.floor(k / 6) + 0.5) * ((zone.y1 - zone.y0 - 160 * s) / 4));
    const colour = [
      [255, 255, 255],
      [0, 0, 0],
      [255, null, null],
      [null, 0, null],
    ][k % 4];
    for (let yy = y; yy < y + size; yy++) {
      for (let xx = x; xx < x + size; xx++) colour.forEach((v, c) => v !== null && (data[(yy * width + xx) * 3 + c] = v));
    }
    planted.push([x + size / 2, y + size / 2]);
  }
  const jpeg = await sharp(data, { raw: { width, height, channels: 3 } })
    .jpeg({ quality: 90, chromaSubsampling: "4:4:4" })
    .toBuffer();
  const rect = (r: Rect): Point[] => [
    [r.x0, r.y0],
    [r.x1, r.y0],
    [r.x1, r.y1],
    [r.x0, r.y1],
  ];
  const edgeBandPx = Math.max(16, Math.round(0.02 * Math.min(zone.x1 - zone.x0, zone.y1 - zone.y0)));
  const area = { regions: [{ polygons: [roundedPolygon(body, 140 * s)] }, { polygons: [rect(zone)] }], edgeBandPx };
  return { jpeg, planted, area };
}

const RUNS = 5;
const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];

/** RUNS searches; prints the median wall-clock and CPU time (the machine is shared) and what was found. */
async function run(label: string, jpeg: Buffer, planted: [number, number][], options: PixelCandidateOptions) {
  const walls: number[] = [];
  const cpus: number[] = [];
  let result = await suggestPixelCandidates(jpeg, options);
  for (let k = 0; k < RUNS; k++) {
    const cpu = process.cpuUsage();
    const started = performance.now();
    result = await suggestPixelCandidates(jpeg, options);
    walls.push(performance.now() - started);
    const used = process.cpuUsage(cpu);
    cpus.push((used.user + used.system) / 1000);
  }
  const near = (c: { x: number; y: number }, p: [number, number]) => Math.hypot(c.x - p[0], c.y - p[1]) <= 1.5;
  const found = planted.filter((p) => result.candidates.some((c) => near(c, p))).length;
  const falseOnes = result.candidates.filter((c) => !planted.some((p) => near(c, p))).length;
  const searchedMp = (result.searched.width * result.searched.height) / 1e6;
  console.log(
    `  ${label.padEnd(24)} median of ${RUNS}: ${median(walls).toFixed(0).padStart(5)} ms wall (fastest ${Math.min(...walls).toFixed(0)}), ${median(cpus).toFixed(0).padStart(5)} ms CPU; ` +
      `searched ${searchedMp.toFixed(1)} MP; found ${found}/${planted.length}, false ${falseOnes}, left out near the edge ${result.droppedNearEdge}`,
  );
}

for (const [width, height] of [
  [2000, 1500],
  [4000, 3000],
]) {
  const { jpeg, planted, area } = await screenPhoto(width, height);
  console.log(`${width} × ${height} (${((width * height) / 1e6).toFixed(1)} MP), edge band ${area.edgeBandPx} px:`);
  await run("whole frame", jpeg, planted, {});
  await run("Surface ∩ zone (Bench)", jpeg, planted, { area });
}
