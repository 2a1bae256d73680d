import type { Metadata } from "next";
import { RubricScreen } from "@/components/grading/rubric-screen";
import { listPartTypesWithRubrics } from "@/db/queries/rubrics";
import { requirePageUser } from "@/lib/auth/require-user";
import { hasAnyRole } from "@/lib/auth/roles";
import { screenByHref } from "@/lib/nav";

const screen = screenByHref("/rubrics")!;
export const metadata: Metadata = { title: screen.label };

export default async function RubricsPage(props: PageProps<"/rubrics">) {
  const user = await requirePageUser({ role: screen.roles, from: screen.href });
  const { partType } = await props.searchParams;
  const partTypes = await listPartTypesWithRubrics({ workspaceId: user.workspaceId });
  const initial = partTypes.find((p) => p.id === partType)?.id ?? null;
  return (
    <div className="max-w-7xl space-y-6">
      <div>
        <h1 className="page-title">Rubrics</h1>
        <p className="max-w-3xl text-gauge-700">
          How each part type&rsquo;s measurements become a grade. Trainers edit a draft and try it on a sample unit; a QC lead publishes it. A published version never changes, and grades keep the version they were given under.
        </p>
      </div>
      <RubricScreen
        partTypes={partTypes.map((p) => ({ id: p.id, name: p.name, publishedVersion: p.publishedVersion, draftVersion: p.draftVersion }))}
        initialPartTypeId={initial}
        canDraft={hasAnyRole(user.roles, "trainer")}
        canPublish={hasAnyRole(user.roles, "lead")}
      />
      <p className="max-w-3xl text-xs text-gauge-600">
        Grades are decision aids; company policy, supplier contracts and local regulations decide. The seeded rubrics are invented examples to adapt. ISO 13406-2 pixel-fault classes are summarised; the licensed standard governs.
      </p>
    </div>
  );
}
