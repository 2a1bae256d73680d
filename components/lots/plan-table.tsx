import type { StoredSamplingPlan } from "@/db/schema/lots";
import { aqlLabel, judgedOnText } from "@/lib/lots/plan";
import { DEFECT_SEVERITIES, DEFECT_SEVERITY_LABELS } from "@/lib/part-types/severity";
import type { LotVerdict } from "@/lib/lots/verdict";
import { VerdictBadge } from "./badges";

/** The stored plan per defect severity; with a verdict, also what was found against Ac/Re. */
export function PlanTable({ plan, verdict }: { plan: StoredSamplingPlan; verdict?: LotVerdict }) {
  return (
    <div className="overflow-x-auto">
      <table className="min-w-full text-sm" data-testid="plan-table">
        <thead className="text-left text-xs uppercase tracking-wide text-gauge-600">
          <tr>
            <th scope="col" className="py-1.5 pr-3">
              Class
            </th>
            <th scope="col" className="py-1.5 pr-3">
              AQL
            </th>
            <th scope="col" className="py-1.5 pr-3">
              Code letter
            </th>
            <th scope="col" className="py-1.5 pr-3">
              Plan
            </th>
            <th scope="col" className="py-1.5 pr-3">
              Sample
            </th>
            <th scope="col" className="whitespace-nowrap py-1.5 pr-3">
              Ac / Re
            </th>
            {verdict && (
              <>
                <th scope="col" className="py-1.5 pr-3">
                  Inspected
                </th>
                <th scope="col" className="py-1.5 pr-3">
                  Defectives
                </th>
                <th scope="col" className="py-1.5 pr-3">
                  Class verdict
                </th>
              </>
            )}
          </tr>
        </thead>
        <tbody className="divide-y divide-gauge-100">
          {DEFECT_SEVERITIES.map((severity) => {
            const entry = plan.byDefectSeverity[severity];
            const judged = verdict?.classes[severity];
            return (
              <tr key={severity} data-testid={`plan-${severity}`}>
                <th scope="row" className="py-1.5 pr-3 text-left font-medium">
                  {DEFECT_SEVERITY_LABELS[severity]}
                </th>
                <td className="py-1.5 pr-3">{aqlLabel(entry.aql)}</td>
                <td className="py-1.5 pr-3" data-testid={`code-letter-${severity}`}>
                  {entry.codeLetter}
                </td>
                <td className="py-1.5 pr-3">{entry.aql === null ? "zero acceptance" : entry.planLetter}</td>
                <td className="py-1.5 pr-3 tabular-nums" data-testid={`sample-size-${severity}`} title={`Judged on ${judgedOnText(plan, severity)}`}>
                  {entry.sampleSize}
                </td>
                <td className="whitespace-nowrap py-1.5 pr-3 tabular-nums" data-testid={`ac-re-${severity}`}>
                  {entry.accept} / {entry.reject}
                </td>
                {judged && (
                  <>
                    <td className="py-1.5 pr-3 tabular-nums">
                      {judged.inspected} of {judged.sampleSize}
                    </td>
                    <td className="py-1.5 pr-3 tabular-nums" data-testid={`found-${severity}`}>
                      {judged.found}
                      {judged.foundOutsideSample > 0 && <span className="ml-1 text-xs text-gauge-600">(+{judged.foundOutsideSample} beyond this sample, not counted)</span>}
                    </td>
                    <td className="py-1.5 pr-3">
                      <VerdictBadge verdict={judged.status} testId={`class-verdict-${severity}`} />
                      {judged.reinstateNormal && <span className="ml-1 text-xs text-signal-700">back to normal next</span>}
                    </td>
                  </>
                )}
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

/**
 * How the counting works, in words, next to the plan. With a lot: its promised grade, and whether
 * cosmetic grades count yet (they need a published rubric for the part type).
 */
export function CountingNote({ plan, lot }: { plan: StoredSamplingPlan; lot?: { promisedGrade: string; cosmeticGrading: boolean; partTypeName: string } }) {
  const promised = lot ? `the promised grade (${lot.promisedGrade})` : "the grade the purchase promised";
  return (
    <ul className="list-disc space-y-0.5 pl-5 text-xs text-gauge-600">
      <li>
        {plan.hundredPercent ? `Every unit of the lot (${plan.sampleSize}) is inspected.` : `${plan.sampleSize} units are inspected (the largest sample of the three classes).`} Each class is judged on
        its own sample: {DEFECT_SEVERITIES.map((s) => `${s} on ${judgedOnText(plan, s)}`).join("; ")}.
      </li>
      <li data-testid="counting-rule">
        A unit counts once per class in which it has a nonconformity: a failed checklist item of that severity, or a grade worse than {promised}, counted in the severity of each defect class whose
        fired rule made it worse. A critical defect class always counts as critical; a grade overridden below the promise with no class to go by counts as major.
      </li>
      {lot && (
        <li data-testid="inspected-rule">
          {lot.cosmeticGrading
            ? "A unit is inspected once it is graded: until then a cosmetic shortfall could still appear."
            : `${lot.partTypeName} has no published rubric yet, so no unit can be graded: units count on their checklists alone and are inspected once the checklist is complete.`}
        </li>
      )}
      <li>Reaching Re rejects the lot at once; accepting needs the whole sample of each class inspected with at most Ac defectives.</li>
      <li>
        ISO 2859-1 single sampling ({plan.level}, {plan.severity} inspection). Tables are summarised; the licensed standard governs.
      </li>
    </ul>
  );
}
