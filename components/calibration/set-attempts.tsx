import type { CalibrationSummary } from "@/lib/calibration/score-attempt";
import type { CalibrationItemScore } from "@/lib/calibration/score-item";
import type { ItemDifficulty } from "@/lib/calibration/item-difficulty";
import { percent, twoPlaces } from "@/lib/calibration/format";
import { TableHead } from "@/components/ui/table-head";

type AttemptRow = {
  id: string;
  userName: string;
  submittedAt: Date | null;
  passed: boolean | null;
  summary: CalibrationSummary | null;
  items: (Omit<CalibrationItemScore, "areas"> & { position: number })[];
};

/**
 * The trainer's reading of a set's submitted attempts: one row per person with the verdict and
 * figures, one column per item (grade given against the key; missed and extra defects), and the
 * items most people get wrong. Text carries every result; colour only helps.
 */
export function SetAttempts({ attempts, itemCount, mostMissed }: { attempts: AttemptRow[]; itemCount: number; mostMissed: (ItemDifficulty & { position: number })[] }) {
  const positions = Array.from({ length: itemCount }, (_, i) => i + 1);
  const hard = mostMissed.filter((d) => d.wrongAttempts > 0).slice(0, 5);
  return (
    <section className="space-y-3" aria-labelledby="attempts">
      <h2 id="attempts" className="text-lg font-semibold">
        Attempts
      </h2>
      {attempts.length === 0 ? (
        <p className="text-sm text-gauge-700" data-testid="no-attempts">
          Nobody has submitted this set yet.
        </p>
      ) : (
        <>
          <div className="card overflow-x-auto">
            <table className="min-w-full text-sm" data-testid="attempt-table">
              <TableHead columns={["Person", "Result", "Grades as key", "Weighted kappa", "Mean IoU by class"]} cellClassName="px-3 py-2">
                {positions.map((p) => (
                  <th key={p} scope="col" className="px-2 py-2 text-center">
                    #{p}
                  </th>
                ))}
              </TableHead>
              <tbody className="divide-y divide-gauge-100">
                {attempts.map((a) => {
                  const byPosition = new Map(a.items.map((i) => [i.position, i]));
                  return (
                    <tr key={a.id} data-testid="attempt-row" data-name={a.userName} data-passed={String(a.passed)}>
                      <th scope="row" className="whitespace-nowrap px-3 py-2 text-left font-medium">
                        {a.userName}
                        <span className="block text-xs font-normal text-gauge-600">{a.submittedAt ? a.submittedAt.toISOString().slice(0, 16).replace("T", " ") + " UTC" : ""}</span>
                      </th>
                      <td className={`px-3 py-2 font-medium ${a.passed ? "text-ok-600" : "text-fault-700"}`}>{a.passed ? "Passed" : "Not passed"}</td>
                      <td className="px-3 py-2 tabular-nums">{a.summary ? `${a.summary.grades.exact} of ${a.summary.items} (${percent(a.summary.grades.exactShare)})` : "—"}</td>
                      <td className="px-3 py-2 tabular-nums">{twoPlaces(a.summary?.grades.quadraticKappa.kappa)}</td>
                      <td className="px-3 py-2 text-xs">
                        {a.summary
                          ? Object.entries(a.summary.classes)
                              .filter(([, c]) => c.gates)
                              .map(([defect, c]) => `${defect} ${twoPlaces(c.meanIou)}`)
                              .join(", ") || "no marks in the key"
                          : "—"}
                      </td>
                      {positions.map((p) => {
                        const item = byPosition.get(p);
                        if (!item)
                          return (
                            <td key={p} className="px-2 py-2 text-center">
                              —
                            </td>
                          );
                        const tone = item.grade.exact && item.missed === 0 ? "bg-ok-50" : "bg-fault-50";
                        return (
                          <td
                            key={p}
                            className={`px-2 py-2 text-center text-xs whitespace-nowrap ${tone}`}
                            data-testid="attempt-cell"
                            title={`Key ${item.grade.key}, given ${item.grade.given}; ${item.matched} found, ${item.missed} missed, ${item.extra} extra`}
                          >
                            {item.grade.given}
                            {item.grade.exact ? " ✓" : ` (key ${item.grade.key})`}
                            {(item.missed > 0 || item.extra > 0) && (
                              <span className="block">
                                {item.missed > 0 && `${item.missed} missed`}
                                {item.missed > 0 && item.extra > 0 && ", "}
                                {item.extra > 0 && `${item.extra} extra`}
                              </span>
                            )}
                          </td>
                        );
                      })}
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          <div className="card p-4" data-testid="most-missed">
            <h3 className="font-semibold">Items most people get wrong</h3>
            {hard.length === 0 ? (
              <p className="text-sm text-gauge-700">Every attempt graded every item as the key and found every defect.</p>
            ) : (
              <ol className="mt-1 list-inside list-decimal space-y-1 text-sm">
                {hard.map((d) => (
                  <li key={d.position} data-testid="most-missed-item" data-position={d.position}>
                    Item {d.position}: wrong in {d.wrongAttempts} of {d.attempts} attempts ({d.missedAttempts} missed a defect, {d.misgradedAttempts} gave another grade
                    {d.extraAttempts > 0 ? `, ${d.extraAttempts} marked something extra` : ""})
                  </li>
                ))}
              </ol>
            )}
          </div>
        </>
      )}
    </section>
  );
}
