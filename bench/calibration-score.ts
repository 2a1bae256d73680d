/**
 * Scoring one submitted calibration attempt of 20 items on 12-megapixel photos (4000 × 3000), as
 * POST /api/calibration/attempts/:id/submit does it: scoreCalibrationSet (lib/calibration/score-set.ts)
 * — per item and class IoU / Dice on the rasterised masks clipped to the key's Surface, defects
 * matched / missed / extra, the missed and extra areas for the result view — then the set's grade
 * agreement, kappas and pass/fail. The key of each item is the shared bench scene (50 regions in
 * 3 classes); the answer is that scene as a second person might mark it (bench/_photo-scene.ts:
 * regions moved a few pixels, about one in seven left out, four extra), with every fifth grade
 * one step off. Target (issue 18): <= 2 s for the set.
 *
 * Run: npm run bench -- calibration-score
 */
import { loadavg } from "node:os";
import { scoreCalibrationSet, type ScoreSetInput } from "@/lib/calibration/score-set";
import type { PolygonShape } from "@/lib/geometry/shape";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { GRADES } from "@/lib/grading/rubric-schema";
import { buildComparedPair, HEIGHT, WIDTH } from "@/bench/_photo-scene";

const ITEMS = 20;
const RUNS = 5;
const TARGET_MS = 2000;

function payload(regions: { id: string; defect: string; shape: RegionSetPayload["regions"][number]["shape"] }[], surface?: PolygonShape[]): RegionSetPayload {
  return { regions, surfaces: (surface ?? []).map((shape, i) => ({ id: `surface-${i}`, shape })), ruler: null };
}

const input: ScoreSetInput = {
  thresholds: { minGradeAgreement: 0.8, minMeanIou: 0.5 },
  items: Array.from({ length: ITEMS }, (_, index) => {
    const pair = buildComparedPair(index);
    const keyGrade = GRADES[index % GRADES.length];
    const givenGrade = index % 5 === 4 ? GRADES[Math.max(0, GRADES.indexOf(keyGrade) - 1)] : keyGrade;
    return {
      position: index + 1,
      width: pair.width,
      height: pair.height,
      key: { grade: keyGrade, regions: payload(pair.a, pair.surface as PolygonShape[] | undefined) },
      answer: { grade: givenGrade, regions: payload(pair.b) },
    };
  }),
};

await scoreCalibrationSet(input); // warm-up
const times: number[] = [];
const cpuBefore = process.cpuUsage();
let last: Awaited<ReturnType<typeof scoreCalibrationSet>> | undefined;
for (let run = 0; run < RUNS; run++) {
  const start = performance.now();
  last = await scoreCalibrationSet(input);
  times.push(performance.now() - start);
}
const cpu = process.cpuUsage(cpuBefore);
times.sort((x, y) => x - y);
const median = times[Math.floor(times.length / 2)];
const summary = last!.summary;

console.log(`${ITEMS} items, ${WIDTH}×${HEIGHT} each, ${input.items[0].key.regions.regions.length} key vs ${input.items[0].answer.regions.regions.length} answer regions on the first, polygon Surface`);
console.log(`load average (1 min) at the end: ${loadavg()[0].toFixed(2)}`);
console.log(`score a ${ITEMS}-item calibration set (scoreCalibrationSet), median of ${RUNS}: ${median.toFixed(0)} ms (min ${times[0].toFixed(0)}, max ${times[times.length - 1].toFixed(0)}; CPU ${((cpu.user + cpu.system) / 1000 / RUNS).toFixed(0)} ms per set)  target <= ${TARGET_MS} ms: ${median <= TARGET_MS ? "met" : "NOT met"}`);
console.log(`sanity: grade agreement ${(summary.grades.exactShare * 100).toFixed(0)} % (16 of 20 expected), classes ${Object.keys(summary.classes).join(", ")}, passed ${summary.passed}`);
