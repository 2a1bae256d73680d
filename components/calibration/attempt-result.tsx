import Link from "next/link";
import { GradeBadge } from "@/components/grading/grade-badge";
import { percent, twoPlaces } from "@/lib/calibration/format";
import type { CalibrationSummary } from "@/lib/calibration/score-attempt";
import type { CalibrationAnswers, StoredAttemptScore } from "@/lib/calibration/types";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { Grade } from "@/lib/grading/rubric-schema";
import { ResultLegend, ResultOverlay } from "./result-overlay";

export type KeyedItem = {
  position: number;
  partTypeName: string;
  viewLabel: string;
  keyRegions: RegionSetPayload;
  keyGrade: Grade;
  keyCaption: string;
  width: number | null;
  height: number | null;
  classLabels: Record<string, string>;
};

const EMPTY: RegionSetPayload = { regions: [], surfaces: [], ruler: null };

function checkLine(check: CalibrationSummary["checks"][number], classLabels: Record<string, string>) {
  if (check.check === "grade_agreement") return `Grades as the key: ${percent(check.value)} (needs ${percent(check.threshold)})`;
  return `Mean IoU, ${classLabels[check.defect] ?? check.defect}: ${twoPlaces(check.value)} (needs ${twoPlaces(check.threshold)})`;
}

/**
 * A submitted attempt as its taker sees it: the verdict with each check that decided it, the grade
 * agreement figures, then every item with the key over the taker's own marks (missed and extra
 * areas hatched and dotted) and a line saying what matched.
 */
export function AttemptResult({
  attemptId,
  setName,
  items,
  answers,
  result,
}: {
  attemptId: string;
  setName: string;
  items: KeyedItem[];
  answers: CalibrationAnswers;
  result: { passed: boolean | null; summary: StoredAttemptScore["summary"]; items: StoredAttemptScore["items"] };
}) {
  const { summary } = result;
  const scores = new Map(result.items.map((i) => [i.position, i]));
  const allLabels = Object.assign({}, ...items.map((i) => i.classLabels)) as Record<string, string>;
  return (
    <div className="max-w-7xl space-y-5" data-testid="attempt-result" data-passed={String(result.passed)}>
      <div>
        <Link href="/calibration" className="text-sm text-gauge-700 underline">
          Calibration
        </Link>
        <h1 className="page-title">{setName}: your result</h1>
      </div>
      <section className={`card space-y-2 border-l-4 p-4 ${result.passed ? "border-l-ok-600" : "border-l-fault-600"}`} aria-labelledby="verdict">
        <h2 id="verdict" className="text-xl font-semibold" data-testid="attempt-verdict">
          {result.passed ? "Passed" : "Not passed"}
        </h2>
        <ul className="space-y-0.5 text-sm">
          {summary.checks.map((check, i) => (
            <li key={i} data-testid="attempt-check" data-passed={String(check.passed)}>
              <span aria-hidden>{check.passed ? "✓ " : "✗ "}</span>
              <span className="sr-only">{check.passed ? "Met: " : "Not met: "}</span>
              {checkLine(check, allLabels)}
            </li>
          ))}
        </ul>
        <p className="text-sm text-gauge-700" data-testid="attempt-figures">
          {summary.grades.exact} of {summary.items} grades as the key, {summary.grades.withinOne} within one step · Cohen&apos;s kappa {twoPlaces(summary.grades.kappa.kappa)}, quadratic-weighted{" "}
          {twoPlaces(summary.grades.quadraticKappa.kappa)} (A/B/C/Reject scale)
        </p>
      </section>
      <ResultLegend />
      <ol className="grid gap-4 md:grid-cols-2 xl:grid-cols-3" data-testid="result-items">
        {items.map((item) => {
          const score = scores.get(item.position);
          const mine = answers[String(item.position)]?.regions ?? EMPTY;
          const classes = score ? Object.entries(score.classes) : [];
          return (
            <li key={item.position} className="card overflow-hidden" data-testid="result-item" data-position={item.position} data-exact={String(score?.grade.exact ?? false)}>
              <div className="relative aspect-[4/3] bg-gauge-900">
                {/* eslint-disable-next-line @next/next/no-img-element -- the attempt's own access-checked image route */}
                <img
                  src={`/api/calibration/attempts/${attemptId}/image?position=${item.position}&variant=preview`}
                  alt={`Item ${item.position}`}
                  className="absolute inset-0 h-full w-full object-contain"
                  loading="lazy"
                />
                {item.width && item.height && (
                  <ResultOverlay id={`item-${item.position}`} original={{ width: item.width, height: item.height }} keyRegions={item.keyRegions} mine={mine} areas={score?.areas ?? {}} />
                )}
              </div>
              <div className="space-y-1.5 p-3 text-sm">
                <p className="flex flex-wrap items-center gap-1.5 font-medium">
                  Item {item.position}: key <GradeBadge grade={item.keyGrade} size="sm" /> you <GradeBadge grade={score?.grade.given ?? item.keyGrade} size="sm" />
                  <span className={score?.grade.exact ? "text-ok-600" : "text-fault-700"}>
                    {score?.grade.exact ? "same grade" : score?.grade.withinOne ? "one step off" : "more than one step off"}
                  </span>
                </p>
                <p className="text-xs text-gauge-700">
                  {item.partTypeName} · {item.viewLabel}
                </p>
                {score && (
                  <p data-testid="result-line">
                    {score.keyDefects === 0 && score.extra === 0
                      ? "Nothing to mark, nothing marked."
                      : `Found ${score.matched} of ${score.keyDefects} defects, missed ${score.missed}, ${score.extra} extra.`}
                    {classes.length > 0 && ` IoU: ${classes.map(([defect, c]) => `${item.classLabels[defect] ?? defect} ${twoPlaces(c.iou)}`).join(", ")}.`}
                  </p>
                )}
                <p className="rounded bg-gauge-50 p-2 text-xs" data-testid="result-caption">
                  <span className="font-medium">Trainer&apos;s note: </span>
                  {item.keyCaption || "—"}
                </p>
              </div>
            </li>
          );
        })}
      </ol>
    </div>
  );
}
