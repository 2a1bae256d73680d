/**
 * Which graded units go to recheck: a reproducible, stratified random draw over one period's
 * inspection grades (e.g. one week), with the seed recorded so the draw can be checked later.
 *
 * Decisions:
 * - Target per grader: max(minimum, ⌈rate × n⌉), at most n, where n counts the grader's grades
 *   of the period (those drawn before included) and the rate is the grader's own (a raised rate
 *   for graders whose last calibration failed or whose agreement drifts, `recheckRateFor`).
 *   ⌈⌉ so the rate is a floor ("at least 5 %"), with a 1e-9 allowance so 7 % of 100 is 7, not 8.
 * - Never twice for the same grade: grades drawn before (an earlier run of the same period, or
 *   sent to recheck by hand) are not drawn again and count towards the target, so running the
 *   draw again adds nothing, and a unit sent by hand lowers what the draw adds.
 * - `final: false` (a draw run while the period is still open, e.g. as grades are recorded)
 *   skips the minimum: the period's last run applies it once every grade is known.
 * - Spread over part types: the grader's draws are dealt out one at a time to the part type with
 *   the lowest share drawn so far (drawn ÷ its grades), so every part type the grader worked on
 *   gets one before any gets two, and then they fill in proportion. Ties (e.g. all at zero) go by
 *   a seeded random order, so when the target is smaller than the number of part types the ones
 *   drawn vary from period to period. Within a part type, the grades are drawn by the lots'
 *   partial Fisher–Yates draw (lib/units/sample-draw.ts) with a seed taken from the run's stream.
 * - Reproducible: candidates are put in a canonical order (grader id, part type id, grade id)
 *   before anything random happens, so the database's row order does not matter; one XSadd
 *   stream seeded with the recorded seed drives the whole run.
 * - The auditor's own grade: who will take a recheck is decided at claim time (an auditor never
 *   takes their own grade). The draw notes for each drawn grade how many auditors other than its
 *   grader there are, and lists grades nobody could take (`noOtherAuditor`).
 */
import { drawSample, parseSeed } from "@/lib/units/sample-draw";
import { XSadd } from "@/lib/units/xsadd";

export const RECHECK_DRAW_ALGORITHM = "recheck-stratified-xsadd-v1";

export type DrawCandidate = { gradeId: string; graderId: string; partTypeId: string };
export type RecheckDrawInput = {
  /** Decimal text of a 32-bit unsigned integer (node:crypto makes it; the draw record keeps it). */
  seed: string;
  /** The period's inspection grades. */
  candidates: readonly DrawCandidate[];
  /** Grade ids drawn before or sent to recheck by hand. */
  alreadyDrawn?: Iterable<string>;
  /** The usual rate (0 < rate <= 1) and any grader's own rate. */
  rate: number;
  graderRates?: Readonly<Record<string, number>>;
  minimumPerGrader?: number;
  final?: boolean;
  auditorIds?: readonly string[];
};
export type DrawnGrade = DrawCandidate & { otherAuditors: number };
export type GraderDraw = { graderId: string; grades: number; rate: number; target: number; drawnBefore: number; drawn: number };
export type RecheckDrawResult = {
  algorithm: typeof RECHECK_DRAW_ALGORITHM;
  seed: string;
  drawn: DrawnGrade[];
  graders: GraderDraw[];
  noOtherAuditor: string[];
};

const ALLOWANCE = 1e-9;

/** The grader's rate: raised when their last calibration failed or their agreement drifts. */
export function recheckRateFor(settings: { rate: number; raisedRate: number }, grader: { lastCalibrationFailed?: boolean; drifting?: boolean }): number {
  return grader.lastCalibrationFailed || grader.drifting ? Math.max(settings.raisedRate, settings.rate) : settings.rate;
}

function checkRate(rate: number, what: string) {
  if (!(rate > 0 && rate <= 1)) throw new RangeError(`${what} must be above 0 and at most 1, got ${rate}.`);
}

const byText = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);

export function drawRechecks(input: RecheckDrawInput): RecheckDrawResult {
  const random = new XSadd(parseSeed(input.seed));
  const minimum = input.minimumPerGrader ?? 1;
  if (!Number.isInteger(minimum) || minimum < 0) throw new RangeError("The minimum per grader is a whole number of at least 0.");
  checkRate(input.rate, "The recheck rate");
  const before = new Set(input.alreadyDrawn ?? []);
  const auditors = new Set(input.auditorIds ?? []);

  const seen = new Set<string>();
  for (const candidate of input.candidates) {
    if (seen.has(candidate.gradeId)) throw new RangeError(`Grade ${candidate.gradeId} is listed twice.`);
    seen.add(candidate.gradeId);
  }
  const byGrader = new Map<string, Map<string, DrawCandidate[]>>();
  for (const candidate of [...input.candidates].sort((a, b) => byText(a.graderId, b.graderId) || byText(a.partTypeId, b.partTypeId) || byText(a.gradeId, b.gradeId))) {
    let partTypes = byGrader.get(candidate.graderId);
    if (!partTypes) byGrader.set(candidate.graderId, (partTypes = new Map()));
    const grades = partTypes.get(candidate.partTypeId);
    if (grades) grades.push(candidate);
    else partTypes.set(candidate.partTypeId, [candidate]);
  }

  const drawn: DrawnGrade[] = [];
  const graders: GraderDraw[] = [];
  for (const [graderId, partTypes] of byGrader) {
    const rate = input.graderRates?.[graderId] ?? input.rate;
    checkRate(rate, `The recheck rate of grader ${graderId}`);
    const strata = [...partTypes].map(([partTypeId, grades]) => ({
      partTypeId,
      grades: grades.length,
      taken: grades.filter((grade) => before.has(grade.gradeId)).length,
      pool: grades.filter((grade) => !before.has(grade.gradeId)),
      more: 0,
      tieOrder: random.nextUint32(),
    }));
    const total = strata.reduce((sum, stratum) => sum + stratum.grades, 0);
    const drawnBefore = strata.reduce((sum, stratum) => sum + stratum.taken, 0);
    const byRate = Math.ceil(rate * total - ALLOWANCE);
    const target = Math.min(total, input.final === false ? byRate : Math.max(minimum, byRate));
    for (let left = target - drawnBefore; left > 0; left--) {
      const open = strata.filter((stratum) => stratum.more < stratum.pool.length);
      const share = (stratum: (typeof strata)[number]) => (stratum.taken + stratum.more) / stratum.grades;
      open.sort((a, b) => share(a) - share(b) || a.tieOrder - b.tieOrder);
      open[0].more++;
    }
    const otherAuditors = auditors.size - (auditors.has(graderId) ? 1 : 0);
    let count = 0;
    for (const stratum of strata) {
      if (stratum.more === 0) continue;
      for (const grade of drawSample(stratum.pool, stratum.more, String(random.nextUint32()))) {
        drawn.push({ ...grade, otherAuditors });
        count++;
      }
    }
    graders.push({ graderId, grades: total, rate, target, drawnBefore, drawn: count });
  }
  return {
    algorithm: RECHECK_DRAW_ALGORITHM,
    seed: input.seed,
    drawn,
    graders,
    noOtherAuditor: drawn.filter((grade) => grade.otherAuditors === 0).map((grade) => grade.gradeId),
  };
}
