import type { Metadata } from "next";
import Link from "next/link";
import { StartAttemptButton } from "@/components/calibration/start-attempt-button";
import { EmptyState } from "@/components/ui/empty-state";
import { TableHead } from "@/components/ui/table-head";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/auth/require-user";
import { listMyAssignments } from "@/lib/calibration/attempts";
import { listCalibrationSets } from "@/lib/calibration/sets";
import { percent } from "@/lib/calibration/format";
import { screenByHref } from "@/lib/nav";

const screen = screenByHref("/calibration")!;
export const metadata: Metadata = { title: screen.label };

/**
 * Calibration: a taker's assigned sets (start, resume, or read the result) and a trainer's sets
 * (make one, open one to assign it and read the attempts). A lead holds both permissions and sees both.
 */
export default async function CalibrationPage() {
  const user = await requirePageUser({ permission: screen.permission, from: screen.href });
  const takes = can(user, "calibration.take");
  const manages = can(user, "calibration.manage");
  const [assignments, sets] = await Promise.all([takes ? listMyAssignments(user) : [], manages ? listCalibrationSets(user) : []]);
  return (
    <div className="max-w-5xl space-y-6">
      <div>
        <h1 className="page-title">Calibration</h1>
        <p className="text-gauge-700">{screen.summary}</p>
      </div>
      {takes && (
        <section className="space-y-2" aria-labelledby="my-sets">
          <h2 id="my-sets" className="text-lg font-semibold">
            Your calibration sets
          </h2>
          {assignments.length === 0 ? (
            <EmptyState title="Nothing assigned to you" testId="no-assignments">
              A trainer assigns calibration sets with a due date; they show here. You grade each photo as on the Bench, without seeing the answer until you submit.
            </EmptyState>
          ) : (
            <div className="card overflow-x-auto">
              <table className="min-w-full text-sm" data-testid="my-assignments">
                <TableHead
                  columns={[
                    "Set",
                    "Items",
                    "Due",
                    "Status",
                    <span key="action" className="sr-only">
                      Action
                    </span>,
                  ]}
                />
                <tbody className="divide-y divide-gauge-100">
                  {assignments.map((a) => (
                    <tr key={a.id} data-testid="assignment-row" data-set-name={a.setName} data-status={a.status}>
                      <td className="px-4 py-2 font-medium">{a.setName}</td>
                      <td className="px-4 py-2 tabular-nums">{a.itemCount}</td>
                      <td className="whitespace-nowrap px-4 py-2 tabular-nums">{a.dueOn}</td>
                      <td className="px-4 py-2">
                        {a.status === "submitted" ? (a.passed ? "Submitted: passed" : "Submitted: not passed") : a.status === "in_progress" ? "Started (paused)" : "Not started"}
                      </td>
                      <td className="px-4 py-2 text-right">
                        {a.status === "submitted" && a.attemptId ? (
                          <Link href={`/calibration/attempts/${a.attemptId}`} className="btn-secondary" data-testid="see-result">
                            See the result
                          </Link>
                        ) : (
                          <StartAttemptButton assignmentId={a.id} label={a.status === "in_progress" ? "Resume" : "Start"} />
                        )}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </section>
      )}
      {manages && (
        <section className="space-y-2" aria-labelledby="sets">
          <div className="flex flex-wrap items-end justify-between gap-3">
            <h2 id="sets" className="text-lg font-semibold">
              Sets
            </h2>
            <Link href="/calibration/sets/new" className="btn-primary" data-testid="new-set">
              New set
            </Link>
          </div>
          {sets.length === 0 ? (
            <EmptyState title="No calibration sets yet" testId="no-sets">
              A set is 5–50 published gallery examples; each example&apos;s regions and grade are the key. Make one with{" "}
              <Link href="/calibration/sets/new" className="font-medium underline">
                New set
              </Link>
              , then assign it to inspectors with a due date.
            </EmptyState>
          ) : (
            <div className="card overflow-x-auto">
              <table className="min-w-full text-sm" data-testid="set-table">
                <TableHead columns={["Set", "Items", "Pass at", "Assigned", "Submitted", "Passed"]} />
                <tbody className="divide-y divide-gauge-100">
                  {sets.map((s) => (
                    <tr key={s.id} data-testid="set-row">
                      <td className="px-4 py-2">
                        <Link href={`/calibration/sets/${s.id}`} className="font-medium text-gauge-700 underline">
                          {s.name}
                        </Link>
                      </td>
                      <td className="px-4 py-2 tabular-nums">{s.itemCount}</td>
                      <td className="px-4 py-2">
                        grades {percent(s.minGradeAgreement)}, IoU {s.minMeanIou.toFixed(2)}
                      </td>
                      <td className="px-4 py-2 tabular-nums">{s.assigned}</td>
                      <td className="px-4 py-2 tabular-nums">{s.submitted}</td>
                      <td className="px-4 py-2 tabular-nums">{s.passed}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </section>
      )}
    </div>
  );
}
