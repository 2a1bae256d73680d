import type { Metadata } from "next";
import Link from "next/link";
import { TakeNextRecheck } from "@/components/recheck/take-next-recheck";
import { countWaitingRechecks, listHeldRechecks } from "@/db/queries/rechecks";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/auth/require-user";
import { screenByHref } from "@/lib/nav";
import { adjudicationsFor } from "@/lib/recheck/adjudication-view";
import { formatDateTime } from "@/lib/time/format";

const screen = screenByHref("/recheck")!;
export const metadata: Metadata = { title: screen.label };

/** The recheck queue: take the next blind recheck, go back to one held, settle disagreements. */
export default async function RecheckPage() {
  const user = await requirePageUser({ permission: screen.permission, from: screen.href });
  const key = { workspaceId: user.workspaceId };
  const [waiting, held, adjudications] = await Promise.all([
    countWaitingRechecks(key),
    listHeldRechecks({ ...key, auditorId: user.id }),
    can(user, "recheck.adjudicate") ? adjudicationsFor(user) : Promise.resolve([]),
  ]);
  return (
    <div className="max-w-4xl space-y-6">
      <header className="space-y-1">
        <h1 className="text-2xl font-semibold">Recheck</h1>
        <p className="text-gauge-700">
          Graded units drawn at random (or sent by hand) get a second, blind look: you see the photos and the functional readings, never the first grade, until you submit yours.
        </p>
        {can(user, "reports.read") && (
          <p className="text-sm">
            <Link href="/recheck/scorecards" className="underline">
              Grader scorecards
            </Link>{" "}
            — how often each grader&apos;s grades agree with the rechecks, week by week.
          </p>
        )}
      </header>
      <section className="card space-y-3 p-5" aria-label="Recheck queue">
        <h2 className="text-lg font-semibold">Queue</h2>
        <p className="text-sm text-gauge-700">
          {waiting === 0
            ? "No recheck is waiting."
            : `${waiting} recheck${waiting === 1 ? "" : "s"} waiting in the workspace (you are never given your own grade or a unit whose inspection work you opened).`}
        </p>
        <TakeNextRecheck />
        {held.length > 0 && (
          <ul className="space-y-1 text-sm" aria-label="Rechecks you hold">
            {held.map((r) => (
              <li key={r.id}>
                <Link href={`/recheck/${r.id}`}>Continue a recheck you hold</Link> (reserved until {formatDateTime(r.leaseExpiresAt!, user.timeZone)})
              </li>
            ))}
          </ul>
        )}
      </section>
      {can(user, "recheck.adjudicate") && (
        <section className="card space-y-3 p-5" aria-label="Disagreements to settle">
          <h2 className="text-lg font-semibold">Disagreements to settle</h2>
          {adjudications.length === 0 ? (
            <p className="text-sm text-gauge-700">
              Nothing to settle. A recheck comes here when its grade differs from the first one, or when the two marked the same defect class in clearly different places.
            </p>
          ) : (
            <ul className="divide-y divide-gauge-100 text-sm">
              {adjudications.map((a) => (
                <li key={a.id} className="flex flex-wrap justify-between gap-2 py-2">
                  <Link href={`/recheck/adjudications/${a.id}`}>
                    {a.partTypeName} {a.serial ?? "(no serial)"}
                  </Link>
                  <span className="text-gauge-700">submitted {a.submittedAt ? formatDateTime(a.submittedAt, user.timeZone) : ""}</span>
                </li>
              ))}
            </ul>
          )}
        </section>
      )}
    </div>
  );
}
