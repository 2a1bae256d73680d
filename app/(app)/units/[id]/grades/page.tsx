import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { GradeHistory } from "@/components/grading/grade-history";
import { GradePanel } from "@/components/grading/grade-panel";
import { GradeWhatIf } from "@/components/grading/grade-what-if";
import { getUnitForGrading } from "@/db/queries/grading";
import { listRubricVersions } from "@/db/queries/rubrics";
import { requirePageUser } from "@/lib/auth/require-user";
import { hasAnyRole } from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";
import { parseId } from "@/lib/validation";

export const metadata: Metadata = { title: "Grades" };

/** A unit's grading: the current measurement and proposal, the grade history, and other versions' verdicts. */
export default async function UnitGradesPage(props: PageProps<"/units/[id]/grades">) {
  const { id: rawId } = await props.params;
  const user = await requirePageUser({ from: `/units/${rawId}/grades` });
  let id: string;
  try {
    id = parseId(rawId, "That unit");
  } catch (err) {
    if (err instanceof AppError) notFound();
    throw err;
  }
  const unit = await getUnitForGrading({ workspaceId: user.workspaceId, unitId: id });
  if (!unit) notFound();
  const versions = await listRubricVersions({ workspaceId: user.workspaceId, partTypeId: unit.partTypeId });
  const name = unit.serial ?? `Unit ${unit.sampleIndex}`;
  return (
    <div className="max-w-4xl space-y-6">
      <div>
        <p className="text-sm text-gauge-700">
          <Link href={`/units/${id}`} className="underline hover:text-gauge-900">
            Bench
          </Link>{" "}
          ›{" "}
          <Link href={`/rubrics?partType=${unit.partTypeId}`} className="underline hover:text-gauge-900">
            {unit.partType.name} rubric
          </Link>
        </p>
        <h1 className="page-title">Grades of {name}</h1>
        <p className="text-gauge-700">{unit.partType.name}. Grades are decision aids; company policy, supplier contracts and local regulations decide.</p>
      </div>
      <GradePanel unitId={id} canGrade={hasAnyRole(user.roles, "inspector")} canCorrect={hasAnyRole(user.roles, "lead")} />
      <GradeHistory unitId={id} />
      <GradeWhatIf unitId={id} versions={versions.map((v) => ({ version: v.version, status: v.status }))} />
    </div>
  );
}
