import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { ChecklistPanel } from "@/components/bench/checklist-panel";
import { UnitHeader } from "@/components/bench/unit-header";
import type { UnitView } from "@/components/bench/use-unit";
import { getUnitDetail, listUnitResults } from "@/db/queries/units";
import { requirePageUser } from "@/lib/auth/require-user";
import { hasAnyRole } from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";
import { screenByHref } from "@/lib/nav";
import { parseId } from "@/lib/validation";

export const metadata: Metadata = { title: "Bench" };

/** One unit on the Bench: a thin composition of panels (photos and grading are added beside the checklist). */
export default async function UnitPage(props: PageProps<"/units/[id]">) {
  const { id: rawId } = await props.params;
  const user = await requirePageUser({ role: screenByHref("/lots")!.roles, from: `/units/${rawId}` });
  let id: string;
  try {
    id = parseId(rawId, "That unit");
  } catch (err) {
    if (err instanceof AppError) notFound();
    throw err;
  }
  const detail = await getUnitDetail({ workspaceId: user.workspaceId, unitId: id });
  if (!detail) notFound();
  const results = await listUnitResults({ workspaceId: user.workspaceId, unitIds: [id] });
  // The same JSON the API sends, so the panels' queries start from what they will refetch.
  const initial = JSON.parse(JSON.stringify({ ...detail, results })) as UnitView;
  const me = { id: user.id, isLead: hasAnyRole(user.roles, "lead"), canRecord: hasAnyRole(user.roles, "inspector") };
  return (
    <div className="max-w-4xl space-y-6">
      <UnitHeader initial={initial} me={me} />
      <ChecklistPanel initial={initial} me={me} />
    </div>
  );
}
