/**
 * The scorecards' tables (server-rendered): the graders of the period side by side, one
 * scorecard's weeks (the chart's figures, for screen readers and for reading exact values), and
 * mean IoU per defect class.
 */
import Link from "next/link";
import type { AgreementFigures } from "@/lib/recheck/tally";
import type { DriftFlag } from "@/lib/recheck/drift";
import { bandLabel, formatKappa, formatKappaInterval, formatPercent, formatShareInterval } from "@/lib/recheck/scorecard-format";

type Counts = { graded: number; rechecked: number; notBlind: number; figures: AgreementFigures };
type GraderRow = Counts & { graderId: string; drift: DriftFlag };

const th = "px-3 py-2";
const td = "px-3 py-1.5";

/** What a drift flag says, in words. */
export function driftText(drift: DriftFlag): string {
  if (!drift.flagged) return "No";
  const parts = drift.reasons.map((reason) =>
    reason === "below_threshold" ? `below the ${Math.round(drift.threshold * 100)} % threshold` : `clearly below the rest of the team (${formatPercent(drift.others.share)})`,
  );
  return `Yes: ${formatPercent(drift.agreement.share)} over the last ${drift.weeks.length} weeks, ${parts.join(" and ")}`;
}

export function GraderTable({
  graders,
  names,
  team,
  linkFor,
  selected,
}: {
  graders: GraderRow[];
  names: Record<string, string>;
  team: Counts;
  linkFor: (graderId: string | null) => string;
  selected: string | null;
}) {
  const sorted = [...graders].sort((a, b) => (names[a.graderId] ?? "").localeCompare(names[b.graderId] ?? ""));
  const row = (key: string, name: React.ReactNode, counts: Counts, drift: DriftFlag | null, isSelected: boolean) => (
    <tr key={key} className={isSelected ? "bg-gauge-50" : undefined} data-testid={`scorecard-row-${key}`} aria-current={isSelected ? "true" : undefined}>
      <th scope="row" className={`${td} whitespace-nowrap text-left font-medium`}>
        {name}
      </th>
      <td className={`${td} tabular-nums`}>{counts.graded}</td>
      <td className={`${td} tabular-nums`}>
        {counts.rechecked}
        {counts.notBlind > 0 && <span className="text-gauge-500"> ({counts.notBlind} not blind)</span>}
      </td>
      <td className={`${td} whitespace-nowrap tabular-nums`}>{formatShareInterval(counts.figures.exact)}</td>
      <td className={`${td} tabular-nums`}>{formatPercent(counts.figures.withinOne)}</td>
      <td className={`${td} whitespace-nowrap tabular-nums`}>{formatKappaInterval(counts.figures.kappa)}</td>
      <td className={td}>{bandLabel(counts.figures.kappa)}</td>
      <td className={`${td} whitespace-nowrap tabular-nums`}>{formatKappaInterval(counts.figures.quadraticKappa)}</td>
      <td className={`${td} min-w-48`} data-testid={`drift-${key}`}>
        {drift ? drift.flagged ? <span className="font-medium text-fault-700">⚑ {driftText(drift)}</span> : "No" : "—"}
      </td>
    </tr>
  );
  return (
    <div className="card overflow-x-auto">
      <table className="min-w-full text-sm" data-testid="scorecard-graders">
        <caption className="sr-only">Agreement of each grader&apos;s grades with the blind rechecks over the period</caption>
        <thead className="bg-gauge-50 text-left text-xs uppercase tracking-wide text-gauge-600">
          <tr>
            <th scope="col" className={th}>
              Grader
            </th>
            <th scope="col" className={th}>
              Graded
            </th>
            <th scope="col" className={th}>
              Rechecked
            </th>
            <th scope="col" className={th}>
              Exact agreement (95 %)
            </th>
            <th scope="col" className={th}>
              Within one
            </th>
            <th scope="col" className={th}>
              Kappa (95 %)
            </th>
            <th scope="col" className={th}>
              Band
            </th>
            <th scope="col" className={th}>
              Weighted kappa (95 %)
            </th>
            <th scope="col" className={th}>
              Drift
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-gauge-100">
          {sorted.map((g) =>
            row(
              g.graderId,
              <Link href={linkFor(g.graderId)} className="underline">
                {names[g.graderId]}
              </Link>,
              g,
              g.drift,
              selected === g.graderId,
            ),
          )}
          {row(
            "team",
            <Link href={linkFor(null)} className="underline">
              Team
            </Link>,
            team,
            null,
            selected === null,
          )}
        </tbody>
      </table>
    </div>
  );
}

export function ScorecardWeekTable({ weeks, label }: { weeks: ({ week: string } & Counts)[]; label: string }) {
  return (
    <div className="overflow-x-auto">
      <table className="min-w-full text-sm" data-testid="scorecard-weeks">
        <caption className="pb-1 text-left text-xs text-gauge-600">{label}, week by week (weeks start on Monday)</caption>
        <thead className="bg-gauge-50 text-left text-xs uppercase tracking-wide text-gauge-600">
          <tr>
            <th scope="col" className={th}>
              Week of
            </th>
            <th scope="col" className={th}>
              Rechecks
            </th>
            <th scope="col" className={th}>
              Exact
            </th>
            <th scope="col" className={th}>
              Kappa
            </th>
            <th scope="col" className={th}>
              Band
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-gauge-100">
          {weeks.map((w) => (
            <tr key={w.week}>
              <th scope="row" className={`${td} whitespace-nowrap text-left font-normal tabular-nums`}>
                {w.week}
              </th>
              <td className={`${td} tabular-nums`}>{w.figures.n}</td>
              <td className={`${td} whitespace-nowrap tabular-nums`}>{formatPercent(w.figures.exact.share)}</td>
              <td className={`${td} tabular-nums`}>{formatKappa(w.figures.kappa.kappa)}</td>
              <td className={td}>{bandLabel(w.figures.kappa)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function MeanIouTable({ meanIou, classLabels }: { meanIou: AgreementFigures["meanIou"]; classLabels: Record<string, string> }) {
  const entries = Object.entries(meanIou);
  if (entries.length === 0) return <p className="text-sm text-gauge-700">No defect class was marked by either side in this period&apos;s rechecks.</p>;
  return (
    <table className="text-sm" data-testid="scorecard-iou">
      <thead className="text-left text-xs uppercase tracking-wide text-gauge-600">
        <tr>
          <th scope="col" className={th}>
            Defect class
          </th>
          <th scope="col" className={th}>
            Mean IoU
          </th>
          <th scope="col" className={th}>
            Rechecks
          </th>
        </tr>
      </thead>
      <tbody className="divide-y divide-gauge-100">
        {entries.map(([defect, { mean, n }]) => (
          <tr key={defect}>
            <th scope="row" className={`${td} text-left font-normal`}>
              {classLabels[defect] ?? defect}
            </th>
            <td className={`${td} tabular-nums`}>{mean.toFixed(2)}</td>
            <td className={`${td} tabular-nums`}>{n}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
