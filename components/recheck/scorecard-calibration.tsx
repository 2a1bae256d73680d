/**
 * The scorecards' calibration results (server-rendered): the attempts submitted in the period,
 * one row each — set, day, items, grade agreement with the key, pass or fail and why. Only
 * submitted attempts, and nothing of the key (lib/recheck/scorecard-calibration.ts).
 */
import { TableHead } from "@/components/ui/table-head";
import { calibrationVerdictText, type CalibrationResult } from "@/lib/recheck/scorecard-calibration";
import { formatPercent } from "@/lib/recheck/scorecard-format";

const th = "px-3 py-2";
const td = "px-3 py-1.5";

export function CalibrationTable({
  attempts,
  names,
  showPerson,
  classLabels,
}: {
  attempts: readonly CalibrationResult[];
  names: Record<string, string>;
  showPerson: boolean;
  classLabels: Record<string, string>;
}) {
  if (attempts.length === 0) return <p className="text-sm text-gauge-700">No calibration attempt was submitted in this period.</p>;
  const label = (defect: string) => classLabels[defect] ?? defect;
  return (
    <div className="overflow-x-auto">
      <table className="min-w-full text-sm" data-testid="scorecard-calibration">
        <caption className="sr-only">Calibration attempts submitted in the period</caption>
        <TableHead columns={[...(showPerson ? ["Grader"] : []), "Set", "Submitted", "Items", "Grade agreement", "Result"]} cellClassName={th} />
        <tbody className="divide-y divide-gauge-100">
          {attempts.map((a) => (
            <tr key={a.attemptId} data-testid={`calibration-${a.attemptId}`}>
              {showPerson && <td className={`${td} whitespace-nowrap`}>{names[a.userId]}</td>}
              <th scope="row" className={`${td} text-left font-normal`}>
                {a.setName}
              </th>
              <td className={`${td} whitespace-nowrap tabular-nums`}>{a.day}</td>
              <td className={`${td} tabular-nums`}>{a.items}</td>
              <td className={`${td} tabular-nums`}>{formatPercent(a.exactShare)}</td>
              <td className={`${td} ${a.passed ? "" : "font-medium text-fault-700"}`}>{calibrationVerdictText(a, label)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
