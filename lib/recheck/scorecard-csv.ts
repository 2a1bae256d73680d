/**
 * The scorecards as CSV (GET /api/recheck/scorecards/csv): one row per grader and week, a
 * "period" row per grader, and the same for the team, so a spreadsheet can chart any of them.
 * Shares and kappas are plain numbers (0.83, not "83 %"); undefined figures are empty cells
 * (lib/reports/csv-stream.ts writes NaN as empty); the band is Landis & Koch's name.
 */
import type { CsvColumn } from "@/lib/reports/csv-stream";
import type { AgreementFigures } from "./tally";
import type { DriftFlag } from "./drift";

type Counts = { graded: number; rechecked: number; notBlind: number; figures: AgreementFigures };
type Card = Counts & { weeks: ({ week: string } & Counts)[] };
export type ScorecardCsvSource = {
  from: string;
  to: string;
  graders: (Card & { graderId: string; drift: DriftFlag })[];
  team: Card;
  names: Record<string, string>;
};

export type ScorecardCsvRow = Counts & { who: string; graderId: string; period: string; drift?: DriftFlag };

export const SCORECARD_CSV_COLUMNS: CsvColumn<ScorecardCsvRow>[] = [
  { header: "grader", value: (r) => r.who },
  { header: "grader_id", value: (r) => r.graderId },
  { header: "period", value: (r) => r.period },
  { header: "graded", value: (r) => r.graded },
  { header: "rechecked", value: (r) => r.rechecked },
  { header: "not_blind", value: (r) => r.notBlind },
  { header: "n", value: (r) => r.figures.n },
  { header: "exact_agreement", value: (r) => r.figures.exact.share },
  { header: "exact_low_95", value: (r) => r.figures.exact.low },
  { header: "exact_high_95", value: (r) => r.figures.exact.high },
  { header: "within_one", value: (r) => r.figures.withinOne },
  { header: "kappa", value: (r) => r.figures.kappa.kappa },
  { header: "kappa_low_95", value: (r) => r.figures.kappa.low },
  { header: "kappa_high_95", value: (r) => r.figures.kappa.high },
  { header: "kappa_band", value: (r) => r.figures.kappa.band },
  { header: "quadratic_kappa", value: (r) => r.figures.quadraticKappa.kappa },
  { header: "quadratic_kappa_low_95", value: (r) => r.figures.quadraticKappa.low },
  { header: "quadratic_kappa_high_95", value: (r) => r.figures.quadraticKappa.high },
  { header: "quadratic_kappa_band", value: (r) => r.figures.quadraticKappa.band },
  {
    header: "mean_iou_by_class",
    value: (r) =>
      Object.entries(r.figures.meanIou)
        .map(([defect, { mean, n }]) => `${defect}=${mean.toFixed(3)} (n=${n})`)
        .join("; "),
  },
  { header: "drift_flagged", value: (r) => (r.drift ? r.drift.flagged : null) },
  { header: "drift_reasons", value: (r) => (r.drift ? r.drift.reasons.join(" ") : null) },
];

/** Rows in reading order: each grader (by name) week by week, then their period; the team last. */
export function scorecardCsvRows(view: ScorecardCsvSource): ScorecardCsvRow[] {
  const periodLabel = `${view.from}..${view.to}`;
  const rowsOf = (who: string, graderId: string, card: Card, drift?: DriftFlag): ScorecardCsvRow[] => [
    ...card.weeks.map(({ week, ...counts }) => ({ who, graderId, period: `week of ${week}`, ...counts })),
    { who, graderId, period: periodLabel, graded: card.graded, rechecked: card.rechecked, notBlind: card.notBlind, figures: card.figures, drift },
  ];
  const graders = [...view.graders].sort((a, b) => (view.names[a.graderId] ?? "").localeCompare(view.names[b.graderId] ?? "") || (a.graderId < b.graderId ? -1 : 1));
  return [...graders.flatMap((g) => rowsOf(view.names[g.graderId] ?? g.graderId, g.graderId, g, g.drift)), ...rowsOf("Team", "", view.team)];
}
