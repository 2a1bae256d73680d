import type { Metadata } from "next";
import Link from "next/link";
import { ScorecardTrendChart, type TrendPoint } from "@/components/recheck/scorecard-trend-chart";
import { CalibrationTable } from "@/components/recheck/scorecard-calibration";
import { driftText, GraderTable, MeanIouTable, ScorecardWeekTable } from "@/components/recheck/scorecard-tables";
import { IgnoredParamsNote } from "@/components/ui/ignored-params-note";
import { listPartTypes } from "@/db/queries/part-types";
import { requirePageUser } from "@/lib/auth/require-user";
import { calibrationByPerson, calibrationCountText } from "@/lib/recheck/scorecard-calibration";
import { formatPercent } from "@/lib/recheck/scorecard-format";
import { scorecardHref, scorecardPageSchema } from "@/lib/recheck/scorecard-params";
import { readScorecards } from "@/lib/recheck/scorecards-read";
import { readListParams } from "@/lib/url-state/list-params";

export const metadata: Metadata = { title: "Grader scorecards" };

const finite = (value: number) => (Number.isFinite(value) ? value : null);

/**
 * Grader scorecards (auditors and leads): per grader and period the agreement of their grades
 * with blind rechecks, a weekly trend with its table, the drift flag, the team view and the CSV.
 * The period and the grader shown live in the URL (?from=&to=&grader=).
 */
export default async function ScorecardsPage(props: PageProps<"/recheck/scorecards">) {
  const user = await requirePageUser({ permission: "reports.read", from: "/recheck/scorecards" });
  const search = await props.searchParams;
  const first = readListParams(scorecardPageSchema, search);
  const [view, partTypes] = await Promise.all([readScorecards(user, { from: first.params.from, to: first.params.to }), listPartTypes({ workspaceId: user.workspaceId })]);
  // A grader not in this period's scorecards is left out like any other unusable part of a link.
  const { params, ignored } = readListParams(scorecardPageSchema, search, { allowed: { grader: view.graders.map((g) => g.graderId) } });
  const selected = params.grader ? view.graders.find((g) => g.graderId === params.grader)! : null;
  const card = selected ?? view.team;
  const cardLabel = selected ? view.names[selected.graderId] : "Team";
  const period = { from: view.from, to: view.to };
  const classLabels = Object.fromEntries(partTypes.flatMap((pt) => pt.defectClasses.map((c) => [c.key, c.label])));
  const threshold = view.settings.driftAgreement;
  const points: TrendPoint[] = card.weeks.map((w) => ({ week: w.week, exact: finite(w.figures.exact.share), kappa: finite(w.figures.kappa.kappa), n: w.figures.n }));
  const multi = view.multiRater;
  const calibrationOf = calibrationByPerson(view.calibration);
  const calibrationShown = selected ? (calibrationOf.get(selected.graderId) ?? []) : view.calibration;
  const calibrationMulti = view.calibrationMultiRater;
  const csvHref = `/api/recheck/scorecards/csv?from=${view.from}&to=${view.to}`;

  return (
    <div className="max-w-7xl space-y-6">
      <header className="space-y-1">
        <p className="text-sm">
          <Link href="/recheck" className="underline">
            Recheck
          </Link>
        </p>
        <h1 className="page-title">Grader scorecards</h1>
        <p className="max-w-3xl text-gauge-700">
          How often each grader&apos;s grades agree with a blind recheck of the same unit, <span className="whitespace-nowrap">{view.from}</span> to{" "}
          <span className="whitespace-nowrap">{view.to}</span> ({view.timeZone}). A recheck counts in the week of the grade it checks. Rechecks whose auditor had opened the unit&apos;s inspection work
          are &ldquo;not blind&rdquo;: counted, never used in a figure.
        </p>
      </header>

      <form method="get" action="/recheck/scorecards" className="card flex flex-wrap items-end gap-4 p-4" aria-label="Period">
        <label className="space-y-1">
          <span className="field-label">First day</span>
          <input type="date" name="from" defaultValue={view.from} className="field-input" required />
        </label>
        <label className="space-y-1">
          <span className="field-label">Last day</span>
          <input type="date" name="to" defaultValue={view.to} className="field-input" required />
        </label>
        {selected && <input type="hidden" name="grader" value={selected.graderId} />}
        <button type="submit" className="btn-secondary">
          Show period
        </button>
        <a href={csvHref} className="btn-secondary" download>
          Download CSV
        </a>
      </form>
      <IgnoredParamsNote ignored={ignored} labels={{ from: "the first day", to: "the last day", grader: "the grader" }} />

      {view.graders.length === 0 ? (
        <section className="card space-y-2 p-5" aria-label="No scorecards">
          <h2 className="text-lg font-semibold">No grades in this period</h2>
          <p className="text-sm text-gauge-700">Scorecards appear once inspectors have graded units in the period; their figures once auditors have rechecked some of them.</p>
        </section>
      ) : (
        <>
          <section className="space-y-2" aria-labelledby="graders-heading">
            <h2 id="graders-heading" className="text-lg font-semibold">
              Graders
            </h2>
            <GraderTable
              graders={view.graders}
              names={view.names}
              team={view.team}
              selected={selected?.graderId ?? null}
              linkFor={(graderId) => scorecardHref({ ...period, grader: graderId ?? undefined })}
            />
            <p className="text-xs text-gauge-600">
              Kappa and weighted kappa (quadratic weights) on the full A/B/C/Reject scale; 95 % intervals from the analytic standard error (Fleiss, Cohen &amp; Everitt, 1969), exact agreement with the
              Wilson interval; bands as named by Landis &amp; Koch (1977). A grader is flagged for drift when, over the last {view.settings.driftWeeks} weeks, their exact agreement is under{" "}
              {Math.round(threshold * 100)} % (with at least {view.settings.driftMinRechecks} rechecks) or the top of its interval is under the rest of the team.
            </p>
          </section>

          <section className="card space-y-4 p-5" aria-labelledby="trend-heading" data-testid="scorecard-detail">
            <div className="space-y-1">
              <h2 id="trend-heading" className="text-lg font-semibold">
                {cardLabel}: weekly trend
              </h2>
              {selected && (
                <p className={`text-sm ${selected.drift.flagged ? "font-medium text-fault-700" : "text-gauge-700"}`} data-testid="drift-detail">
                  Drift: {driftText(selected.drift)}.
                </p>
              )}
              {!selected && <p className="text-sm text-gauge-700">Everyone&apos;s rechecks together. Choose a grader above for their own card.</p>}
            </div>
            <div className="grid gap-6 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
              <ScorecardTrendChart points={points} driftThreshold={threshold} label={cardLabel} />
              <ScorecardWeekTable weeks={card.weeks} label={cardLabel} />
            </div>
            <div className="space-y-2">
              <h3 className="font-semibold">Where the two marked defects: mean IoU per class</h3>
              <p className="text-xs text-gauge-600">Over the rechecks where the grader or the auditor marked the class (1 = the same pixels, 0 = no overlap).</p>
              <MeanIouTable meanIou={card.figures.meanIou} classLabels={classLabels} />
            </div>
          </section>

          <section className="card space-y-2 p-5" aria-labelledby="team-heading" data-testid="multi-rater">
            <h2 id="team-heading" className="text-lg font-semibold">
              The team beyond two raters
            </h2>
            {multi.units === 0 ? (
              <p className="text-sm text-gauge-700">No unit of this period has two blind grades yet.</p>
            ) : (
              <>
                <p className="text-sm">
                  Krippendorff&apos;s alpha (ordinal): <strong className="tabular-nums">{Number.isFinite(multi.alphaOrdinal) ? multi.alphaOrdinal.toFixed(2) : "n/a"}</strong>; Gwet&apos;s AC1:{" "}
                  <strong className="tabular-nums">{Number.isFinite(multi.ac1) ? multi.ac1.toFixed(2) : "n/a"}</strong> over {multi.units} unit{multi.units === 1 ? "" : "s"} ({multi.grades} grades,{" "}
                  {multi.unitsWithMoreThanTwo} with more than two).
                </p>
                <p className="text-xs text-gauge-600">
                  Each unit&apos;s first grade, its blind recheck and any adjudication. Both figures stay meaningful when nearly every unit gets the same grade, where kappa does not. An adjudication
                  is made after seeing both earlier grades, so it raises agreement a little. Exact agreement of the team: {formatPercent(view.team.figures.exact.share)}.
                </p>
              </>
            )}
            {calibrationMulti.units > 0 && (
              <p className="text-sm" data-testid="calibration-multi-rater">
                Over the period&apos;s calibration items (each item&apos;s key and every taker&apos;s grade): alpha{" "}
                <strong className="tabular-nums">{Number.isFinite(calibrationMulti.alphaOrdinal) ? calibrationMulti.alphaOrdinal.toFixed(2) : "n/a"}</strong>, AC1{" "}
                <strong className="tabular-nums">{Number.isFinite(calibrationMulti.ac1) ? calibrationMulti.ac1.toFixed(2) : "n/a"}</strong> over {calibrationMulti.units} item
                {calibrationMulti.units === 1 ? "" : "s"} ({calibrationMulti.grades} grades, {calibrationMulti.unitsWithMoreThanTwo} with more than two). Kept apart from the rechecks: the items are
                chosen examples graded by people in training against a key.
              </p>
            )}
          </section>
        </>
      )}

      <section className="card space-y-2 p-5" aria-labelledby="calibration-heading">
        <h2 id="calibration-heading" className="text-lg font-semibold">
          {selected ? `${cardLabel}: calibration` : "Calibration"}{" "}
          {calibrationShown.length > 0 && (
            <span className="text-sm font-normal text-gauge-600" data-testid="calibration-count">
              ({calibrationCountText(calibrationShown)})
            </span>
          )}
        </h2>
        <p className="text-xs text-gauge-600">
          Calibration attempts submitted in the period, scored against each set&apos;s key: the share of items graded as the key and whether the set&apos;s thresholds were met.
        </p>
        <CalibrationTable attempts={calibrationShown} names={view.names} showPerson={!selected} classLabels={classLabels} />
      </section>
    </div>
  );
}
