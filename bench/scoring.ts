/**
 * Speed of the pure scoring cores of Calibration, Recheck and Reports, at the sizes the issues
 * name. Run: `npm run bench -- scoring` (or `npx tsx bench/scoring.ts`). Figures are printed,
 * never asserted; they depend on the machine's load, printed with them.
 *
 * 1. Calibration: scoring a 20-item attempt on 12 MP photos (4000 × 3000, 50 regions a side,
 *    polygon Surface) with the after-submit areas, then the attempt summary. Target <= 2 s in all.
 * 2. Scorecards for a workspace with 100 000 graded units and 5 000 rechecks over a quarter
 *    (13 weeks, 25 graders, Europe/Berlin): what buildScorecards receives once the SQL has
 *    aggregated — graded counts per grader and day, and one row per recheck with its class IoUs.
 *    The API target is p95 <= 200 ms for the whole request; this is the pure part of it.
 * 3. Team figures (alpha ordinal, AC1) over 5 000 units with 2–3 grades.
 * 4. The week's recheck draw over about 7 700 grades, and over 100 000 for scale.
 * 5. Throughput over 100 000 graded units; grade distribution; supplier scorecards over 3 000 lots;
 *    item difficulty over 200 attempts of 20 items.
 */
import { loadavg } from "node:os";
import { buildComparedPair } from "@/bench/_photo-scene";
import { itemDifficulty } from "@/lib/calibration/item-difficulty";
import { summariseAttempt } from "@/lib/calibration/score-attempt";
import { scoreCalibrationItem, type CalibrationItemScore } from "@/lib/calibration/score-item";
import { DEFAULT_CALIBRATION_THRESHOLDS } from "@/lib/calibration/schemas";
import { GRADES, type Grade } from "@/lib/grading/rubric-schema";
import { drawRechecks, type DrawCandidate } from "@/lib/recheck/draw";
import { buildScorecards, type ScorecardRecheck } from "@/lib/recheck/scorecard";
import { DEFAULT_RECHECK_SETTINGS } from "@/lib/recheck/settings";
import { multiRaterAgreement } from "@/lib/recheck/team";
import { gradeDistribution, type GradeCountRow } from "@/lib/reports/grade-distribution";
import { supplierScorecards, type SupplierLotRow } from "@/lib/reports/supplier-scorecard";
import { inspectorThroughput, type ThroughputRow } from "@/lib/reports/throughput";
import { mulberry32 } from "@/support/prng";

const RUNS = 7;
const DAY_MS = 86_400_000;
const START = Date.parse("2026-03-30T06:00:00Z"); // a Monday
const DAYS = 91;
const GRADERS = Array.from({ length: 25 }, (_, i) => `grader-${String(i).padStart(2, "0")}`);
const PART_TYPES = ["camera", "battery", "back", "display", "port-flex", "speaker"];
const CLASSES = ["scratch", "crack", "dent", "dust", "stain"];

/** Median, min and max wall time of RUNS calls after a warm-up, and CPU time per call. */
async function timeRuns(task: () => unknown) {
  await task();
  const times: number[] = [];
  const cpuBefore = process.cpuUsage();
  for (let run = 0; run < RUNS; run++) {
    const start = performance.now();
    await task();
    times.push(performance.now() - start);
  }
  const cpu = process.cpuUsage(cpuBefore);
  times.sort((a, b) => a - b);
  const p = (ms: number) => ms.toFixed(ms < 10 ? 1 : 0);
  return `${p(times[RUNS >> 1])} ms (min ${p(times[0])}, max ${p(times[RUNS - 1])}; CPU ${p((cpu.user + cpu.system) / 1000 / RUNS)} ms)`;
}

const random = mulberry32(20261202);
const pick = <T>(list: readonly T[]) => list[Math.floor(random() * list.length)];
/** A grade near `grade`: mostly the same, sometimes one step off, rarely further. */
function nearGrade(grade: Grade): Grade {
  const roll = random();
  const rank = GRADES.indexOf(grade);
  const step = roll < 0.82 ? 0 : roll < 0.97 ? (random() < 0.5 ? -1 : 1) : 2;
  return GRADES[Math.min(GRADES.length - 1, Math.max(0, rank + step))];
}

// 1. Calibration.
const pairs = Array.from({ length: 20 }, (_, index) => buildComparedPair(index));
const scoreAttempt = async () => {
  const items: CalibrationItemScore[] = [];
  for (const [index, pair] of pairs.entries()) {
    items.push(
      await scoreCalibrationItem({
        itemId: `item-${index}`,
        width: pair.width,
        height: pair.height,
        surface: pair.surface,
        key: { grade: "B", regions: pair.a },
        attempt: { grade: index % 5 === 0 ? "C" : "B", regions: pair.b },
      }),
    );
  }
  return summariseAttempt(items, DEFAULT_CALIBRATION_THRESHOLDS);
};
const calibration = await timeRuns(scoreAttempt);
const summary = await scoreAttempt();

// 2. Scorecards: 100 000 graded units over 91 days → graded counts per grader and day; 5 000 rechecks.
const gradedAt: number[] = Array.from({ length: 100_000 }, () => START + Math.floor(random() * DAYS) * DAY_MS + Math.floor(random() * 10 * 3_600_000));
const graderOf = gradedAt.map(() => pick(GRADERS));
const gradedCounts = new Map<string, number>();
gradedAt.forEach((ms, i) => {
  const key = `${graderOf[i]}|${new Date(ms).toISOString().slice(0, 10)}`;
  gradedCounts.set(key, (gradedCounts.get(key) ?? 0) + 1);
});
const graded = [...gradedCounts].map(([key, count]) => ({ graderId: key.split("|")[0], day: key.split("|")[1], count }));
const rechecks: ScorecardRecheck[] = Array.from({ length: 5_000 }, (_, i) => {
  const first = pick(GRADES);
  return {
    graderId: graderOf[i * 20],
    gradedAt: gradedAt[i * 20],
    firstGrade: first,
    recheckGrade: nearGrade(first),
    blind: random() > 0.02,
    classes: Object.fromEntries(CLASSES.filter(() => random() < 0.4).map((defect) => [defect, { iou: random(), unionPx: 1 + Math.floor(random() * 50_000) }])),
  };
});
const scorecardInput = { from: "2026-03-30", to: "2026-06-28", timeZone: "Europe/Berlin", graded, rechecks, settings: DEFAULT_RECHECK_SETTINGS };
const scorecards = await timeRuns(() => buildScorecards(scorecardInput));
const cards = buildScorecards(scorecardInput);

// 3. Team figures over 5 000 units with 2–3 grades.
const teamUnits: Grade[][] = Array.from({ length: 5_000 }, () => {
  const first = pick(GRADES);
  return random() < 0.2 ? [first, nearGrade(first), nearGrade(first)] : [first, nearGrade(first)];
});
const team = await timeRuns(() => multiRaterAgreement(teamUnits));

// 4. The draw: one week (about 7 700 grades), and all 100 000 for scale.
const candidates: DrawCandidate[] = gradedAt.map((_, i) => ({ gradeId: `g${String(i).padStart(6, "0")}`, graderId: graderOf[i], partTypeId: PART_TYPES[i % PART_TYPES.length] }));
const week = candidates.filter((_, i) => gradedAt[i] < START + 7 * DAY_MS);
const weekDraw = await timeRuns(() => drawRechecks({ seed: "4242", candidates: week, rate: 0.05 }));
const bigDraw = await timeRuns(() => drawRechecks({ seed: "4242", candidates, rate: 0.05 }));

// 5. Reports.
const throughputRows: ThroughputRow[] = gradedAt.map((ms, i) => ({
  graderId: graderOf[i],
  partTypeId: candidates[i].partTypeId,
  gradedAt: ms,
  minutes: random() < 0.05 ? null : 2 + random() * 20,
  graderMinutes: random() < 0.05 ? null : 2 + random() * 18,
}));
const throughput = await timeRuns(() => inspectorThroughput(throughputRows, { from: "2026-03-30", to: "2026-06-28", timeZone: "Europe/Berlin" }));
const distributionRows: GradeCountRow[] = PART_TYPES.flatMap((partTypeId) =>
  Array.from({ length: 365 }, (_, day) => GRADES.map((grade) => ({ partTypeId, day: new Date(START + day * DAY_MS).toISOString().slice(0, 10), grade, count: Math.floor(random() * 30) }))).flat(),
);
const distribution = await timeRuns(() => gradeDistribution(distributionRows, "week"));
const lots: SupplierLotRow[] = Array.from({ length: 3_000 }, (_, i) => {
  const inspected = 13 + Math.floor(random() * 120);
  const severity = () => ({ inspected, defectives: Math.floor(random() * random() * inspected * 0.2) });
  const decided = random() < 0.95;
  return {
    supplierId: `supplier-${i % 10}`,
    receivedOn: new Date(START - Math.floor(random() * 730) * DAY_MS).toISOString().slice(0, 10),
    status: decided ? "decided" : "open",
    verdict: decided ? (random() < 0.85 ? "accept" : "reject") : null,
    bySeverity: { critical: severity(), major: severity(), minor: severity() },
    inspected,
    classes: Object.fromEntries(
      CLASSES.map((defect) => {
        const units = Math.floor(random() * inspected * 0.1);
        return [defect, { units, defects: units + Math.floor(random() * 3) }];
      }),
    ),
  };
});
const suppliers = await timeRuns(() => supplierScorecards(lots));
const attempts = Array.from({ length: 200 }, (_, a) => ({
  attemptId: `attempt-${a}`,
  items: Array.from({ length: 20 }, (_, i): CalibrationItemScore => {
    const missed = random() < 0.2 ? 1 : 0;
    const key = pick(GRADES);
    const given = nearGrade(key);
    const steps = Math.abs(GRADES.indexOf(key) - GRADES.indexOf(given));
    return {
      itemId: `item-${i}`,
      grade: { key, given, steps, exact: steps === 0, withinOne: steps <= 1 },
      classes: { scratch: { keyPx: 100, attemptPx: 90, sharedPx: 70, unionPx: 120, iou: 70 / 120, dice: 140 / 190, keyDefects: 1, attemptDefects: 1, matched: 1 - missed, missed, extra: 0 } },
      keyDefects: 1,
      matched: 1 - missed,
      missed,
      extra: 0,
    };
  }),
}));
const difficulty = await timeRuns(() => itemDifficulty(attempts));

console.log(`load average (1 min) at the end: ${loadavg()[0].toFixed(2)}; medians of ${RUNS} runs after a warm-up`);
console.log(`1. calibration: score a 20-item attempt on ${pairs[0].width}×${pairs[0].height} photos with missed/extra areas, and summarise: ${calibration}  (target <= 2000 ms)`);
console.log(
  `   (attempt ${summary.passed ? "passes" : "fails"}: exact ${summary.grades.exact}/20, mean IoU ${Object.entries(summary.classes)
    .map(([d, c]) => `${d} ${c.meanIou.toFixed(3)}`)
    .join(", ")})`,
);
console.log(
  `2. scorecards: ${graded.length} graded-count rows (100 000 units), ${rechecks.length} rechecks, ${cards.weeks.length} weeks, ${cards.graders.length} graders: ${scorecards}  (API target p95 <= 200 ms in all)`,
);
console.log(
  `   (team exact ${(cards.team.figures.exact.share * 100).toFixed(1)} %, κ ${cards.team.figures.kappa.kappa.toFixed(3)}, quadratic κ ${cards.team.figures.quadraticKappa.kappa.toFixed(3)}, drift flags ${cards.graders.filter((c) => c.drift.flagged).length})`,
);
console.log(`3. team alpha (ordinal) and AC1 over ${teamUnits.length} units: ${team}`);
console.log(`4. recheck draw over one week (${week.length} grades): ${weekDraw}; over ${candidates.length} grades: ${bigDraw}`);
console.log(`5. throughput over ${throughputRows.length} graded units: ${throughput}`);
console.log(`   grade distribution, ${distributionRows.length} count rows by week: ${distribution}`);
console.log(`   supplier scorecards over ${lots.length} lots of 10 suppliers: ${suppliers}`);
console.log(`   item difficulty over ${attempts.length} attempts × 20 items: ${difficulty}`);
