/**
 * The scorecards as CSV (GET /api/recheck/scorecards/csv): one row per grader and week, a
 * "period" row per grader, and the same for the team, so a spreadsheet can chart any of them; and
 * one "calibration on <day>" row per calibration attempt submitted in the period, after its
 * grader's rows (the calibration_* columns; the recheck columns are empty there).
 * Shares and kappas are plain numbers (0.83, not "83 %"); undefined figures are empty cells
 * (lib/reports/csv-stream.ts writes NaN as empty); the band is Landis & Koch's name.
 */
import type { CsvColumn } from "@/lib/reports/csv-stream";
import type { AgreementFigures } from "./tally";
import type { DriftFlag } from "./drift";
import { calibrationByPerson, calibrationCheckText, type CalibrationResult } from "./scorecard-calibration";

type Counts = { graded: number; rechecked: number; notBlind: number; figures: AgreementFigures };
type Card = Counts & { weeks: ({ week: string } & Counts)[] };
export type ScorecardCsvSource = {
  from: string;
  to: string;
  graders: (Card & { graderId: string; drift: DriftFlag })[];
  team: Card;
  names: Record<string, string>;
  calibration: readonly CalibrationResult[];
};

export type ScorecardCsvRow = { who: string; graderId: string; period: string; counts?: Counts; drift?: DriftFlag; calibration?: CalibrationResult };

export const SCORECARD_CSV_COLUMNS: CsvColumn<ScorecardCsvRow>[] = [
  { header: "grader", value: (r) => r.who },
  { header: "grader_id", value: (r) => r.graderId },
  { header: "period", value: (r) => r.period },
  { header: "graded", value: (r) => r.counts?.graded },
  { header: "rechecked", value: (r) => r.counts?.rechecked },
  { header: "not_blind", value: (r) => r.counts?.notBlind },
  { header: "n", value: (r) => r.counts?.figures.n },
  { header: "exact_agreement", value: (r) => r.counts?.figures.exact.share },
  { header: "exact_low_95", value: (r) => r.counts?.figures.exact.low },
  { header: "exact_high_95", value: (r) => r.counts?.figures.exact.high },
  { header: "within_one", value: (r) => r.counts?.figures.withinOne },
  { header: "kappa", value: (r) => r.counts?.figures.kappa.kappa },
  { header: "kappa_low_95", value: (r) => r.counts?.figures.kappa.low },
  { header: "kappa_high_95", value: (r) => r.counts?.figures.kappa.high },
  { header: "kappa_band", value: (r) => r.counts?.figures.kappa.band },
  { header: "quadratic_kappa", value: (r) => r.counts?.figures.quadraticKappa.kappa },
  { header: "quadratic_kappa_low_95", value: (r) => r.counts?.figures.quadraticKappa.low },
  { header: "quadratic_kappa_high_95", value: (r) => r.counts?.figures.quadraticKappa.high },
  { header: "quadratic_kappa_band", value: (r) => r.counts?.figures.quadraticKappa.band },
  {
    header: "mean_iou_by_class",
    value: (r) =>
      Object.entries(r.counts?.figures.meanIou ?? {})
        .map(([defect, { mean, n }]) => `${defect}=${mean.toFixed(3)} (n=${n})`)
        .join("; "),
  },
  { header: "drift_flagged", value: (r) => (r.drift ? r.drift.flagged : null) },
  { header: "drift_reasons", value: (r) => (r.drift ? r.drift.reasons.join(" ") : null) },
  { header: "calibration_set", value: (r) => r.calibration?.setName },
  { header: "calibration_items", value: (r) => r.calibration?.items },
  { header: "calibration_grade_agreement", value: (r) => r.calibration?.exactShare },
  { header: "calibration_passed", value: (r) => r.calibration?.passed },
  { header: "calibration_failed_checks", value: (r) => r.calibration?.failedChecks.map((check) => calibrationCheckText(check)).join("; ") },
];

/** Rows in reading order: each grader (by name) week by week, then their period and their calibration attempts; people with attempts but no scorecard; the team last. */
export function scorecardCsvRows(view: ScorecardCsvSource): ScorecardCsvRow[] {
  const periodLabel = `${view.from}..${view.to}`;
  const nameOf = (id: string) => view.names[id] ?? id;
  const attempts = calibrationByPerson(view.calibration);
  const rowsOf = (who: string, graderId: string, card: Card, drift?: DriftFlag): ScorecardCsvRow[] => [
    ...card.weeks.map(({ week, ...counts }) => ({ who, graderId, period: `week of ${week}`, counts })),
    { who, graderId, period: periodLabel, counts: { graded: card.graded, rechecked: card.rechecked, notBlind: card.notBlind, figures: card.figures }, drift },
  ];
  const calibrationRows = (graderId: string): ScorecardCsvRow[] =>
    (attempts.get(graderId) ?? []).map((calibration) => ({ who: nameOf(graderId), graderId, period: `calibration on ${calibration.day}`, calibration }));
  const byName = (a: string, b: string) => nameOf(a).localeCompare(nameOf(b)) || (a < b ? -1 : 1);
  const graders = [...view.graders].sort((a, b) => byName(a.graderId, b.graderId));
  const withCards = new Set(graders.map((g) => g.graderId));
  const others = [...attempts.keys()].filter((id) => !withCards.has(id)).sort(byName);
  return [...graders.flatMap((g) => [...rowsOf(nameOf(g.graderId), g.graderId, g, g.drift), ...calibrationRows(g.graderId)]), ...others.flatMap(calibrationRows), ...rowsOf("Team", "", view.team)];
}
