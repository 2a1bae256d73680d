import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { AssignForm, type AssignablePerson } from "@/components/calibration/assign-form";
import { SetAttempts } from "@/components/calibration/set-attempts";
import { KeyThumbnail } from "@/components/calibration/key-thumbnail";
import { GradeBadge } from "@/components/grading/grade-badge";
import { listPartTypes } from "@/db/queries/part-types";
import { listPeople } from "@/db/queries/users";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/auth/require-user";
import { dateInDays, percent } from "@/lib/calibration/format";
import { readSetForTrainer } from "@/lib/calibration/sets";
import { AppError } from "@/lib/errors";
import { pageIdOrNotFound } from "@/lib/http/page-params";

export const metadata: Metadata = { title: "Calibration set" };

/** A new assignment is due in two weeks unless the trainer picks another date. */
const DEFAULT_DUE_DAYS = 14;

/** A set as its trainer sees it: the key, who has it, every submitted attempt per person and per item, and the items most people get wrong. */
export default async function CalibrationSetPage(props: PageProps<"/calibration/sets/[id]">) {
  const { id: rawId } = await props.params;
  const user = await requirePageUser({ permission: "calibration.manage", from: `/calibration/sets/${rawId}` });
  const id = pageIdOrNotFound(rawId);
  const data = await readSetForTrainer(user, id).catch((err: unknown) => {
    if (err instanceof AppError && err.code === "not_found") notFound();
    throw err;
  });
  const [people, partTypeRows] = await Promise.all([listPeople({ workspaceId: user.workspaceId }), listPartTypes({ workspaceId: user.workspaceId })]);
  const partTypes = new Map(partTypeRows.map((p) => [p.id, p]));
  const dueByUser = new Map(data.assignments.map((a) => [a.userId, a.dueOn]));
  const assignable: AssignablePerson[] = people.filter((p) => p.active && can(p, "calibration.take")).map((p) => ({ id: p.id, name: p.name, assignedDue: dueByUser.get(p.id) ?? null }));
  const viewLabel = (partTypeId: string, viewKey: string) => partTypes.get(partTypeId)?.views.find((v) => v.key === viewKey)?.label ?? viewKey;
  const { set } = data;
  return (
    <div className="max-w-7xl space-y-6" data-testid="calibration-set" data-set-id={set.id}>
      <div>
        <Link href="/calibration" className="text-sm text-gauge-700 underline">
          Calibration
        </Link>
        <h1 className="page-title">{set.name}</h1>
        <p className="text-gauge-700">
          {set.itemCount} items · passes at {percent(set.thresholds.minGradeAgreement)} of grades as the key and a mean IoU of {set.thresholds.minMeanIou.toFixed(2)} or more in every defect class the
          key marks.
        </p>
      </div>

      <section className="card space-y-3 p-4" aria-labelledby="assign">
        <h2 id="assign" className="text-lg font-semibold">
          Assign
        </h2>
        <AssignForm setId={set.id} people={assignable} defaultDue={dateInDays(DEFAULT_DUE_DAYS)} />
        {data.assignments.length > 0 && (
          <table className="min-w-full text-sm" data-testid="set-assignments">
            <thead className="text-left text-xs uppercase tracking-wide text-gauge-600">
              <tr>
                <th scope="col" className="py-1 pr-4">
                  Person
                </th>
                <th scope="col" className="py-1 pr-4">
                  Due
                </th>
                <th scope="col" className="py-1">
                  Status
                </th>
              </tr>
            </thead>
            <tbody className="divide-y divide-gauge-100">
              {data.assignments.map((a) => (
                <tr key={a.id} data-testid="set-assignment" data-name={a.userName}>
                  <td className="py-1 pr-4">{a.userName}</td>
                  <td className="py-1 pr-4 tabular-nums">{a.dueOn}</td>
                  <td className="py-1">
                    {a.attemptStatus === "submitted" ? (a.passed ? "Submitted: passed" : "Submitted: not passed") : a.attemptStatus === "in_progress" ? "Started" : "Not started"}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      <SetAttempts attempts={data.attempts} itemCount={set.itemCount} mostMissed={data.mostMissed} />

      <section className="space-y-2" aria-labelledby="key">
        <h2 id="key" className="text-lg font-semibold">
          The key
        </h2>
        <p className="text-sm text-gauge-700">Copied from the gallery when the set was made. Takers see none of this until they submit.</p>
        <ol className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-5" data-testid="set-key">
          {data.items.map((item) => {
            const partType = partTypes.get(item.partTypeId);
            return (
              <li key={item.position} className="card overflow-hidden" data-testid="key-item">
                <KeyThumbnail
                  src={`/api/photos/${item.photoId}/thumbnail`}
                  width={item.width}
                  height={item.height}
                  regions={item.keyRegions}
                  classKeys={partType?.defectClasses.map((d) => d.key) ?? []}
                  label={`Item ${item.position}`}
                />
                <div className="space-y-1 p-2 text-sm">
                  <p className="flex items-center gap-2 font-medium">
                    Item {item.position} <GradeBadge grade={item.keyGrade} size="sm" />
                  </p>
                  <p className="text-xs text-gauge-700">
                    {item.partTypeName} · {viewLabel(item.partTypeId, item.viewKey)}
                  </p>
                  <p className="line-clamp-3 text-xs">{item.keyCaption}</p>
                </div>
              </li>
            );
          })}
        </ol>
      </section>
    </div>
  );
}
