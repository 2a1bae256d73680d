import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { BenchWorkspace } from "@/components/bench/bench-workspace";
import { getUnitForGrading } from "@/db/queries/grading";
import { listRubricVersions } from "@/db/queries/rubrics";
import { getUnitDetail, listUnitResults } from "@/db/queries/units";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/auth/require-user";
import { pageIdOrNotFound } from "@/lib/http/page-params";
import { toUnitView } from "@/lib/units/dto";
import { isUuid } from "@/lib/validation";

export const metadata: Metadata = { title: "Bench" };

const uuidOrNull = (value: string | string[] | undefined) => (typeof value === "string" && isUuid(value) ? value.toLowerCase() : null);

/** One unit on the Bench: a thin server composition; BenchWorkspace owns the photos, canvas, autosave and panels. */
export default async function UnitPage(props: PageProps<"/units/[id]">) {
  const [{ id: rawId }, search] = await Promise.all([props.params, props.searchParams]);
  // Inspection work: auditors get 403 here (a blind recheck must not see the first grader's work).
  const user = await requirePageUser({ permission: "inspection.read", from: `/units/${rawId}` });
  const id = pageIdOrNotFound(rawId);
  const key = { workspaceId: user.workspaceId, unitId: id };
  const [detail, grading] = await Promise.all([getUnitDetail(key), getUnitForGrading(key)]);
  if (!detail || !grading) notFound();
  const [results, versions] = await Promise.all([
    listUnitResults({ workspaceId: user.workspaceId, unitIds: [id] }),
    listRubricVersions({ workspaceId: user.workspaceId, partTypeId: grading.partTypeId }),
  ]);
  // The same value the API sends, so the panels' queries start from what they will refetch.
  const initial = toUnitView(detail, results);
  const me = { id: user.id, roles: user.roles, timeZone: user.timeZone };
  const { views, defectClasses, panelResolution } = grading.partType;
  return (
    <BenchWorkspace
      initial={initial}
      me={me}
      canCorrect={can(user, "grades.override")}
      canCertify={can(user, "certificates.manage")}
      partType={{ views, defectClasses, panelResolution }}
      rubricVersions={versions.map((v) => ({ version: v.version, status: v.status }))}
      initialPhotoId={uuidOrNull(search.photo)}
      canPromote={can(user, "gallery.edit")}
    />
  );
}
