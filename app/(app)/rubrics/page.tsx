import type { Metadata } from "next";
import Link from "next/link";
import { RubricScreen } from "@/components/grading/rubric-screen";
import { EmptyState } from "@/components/ui/empty-state";
import { listPartTypesWithRubrics } from "@/db/queries/rubrics";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/auth/require-user";
import { screenByHref } from "@/lib/nav";

const screen = screenByHref("/rubrics")!;
export const metadata: Metadata = { title: screen.label };

export default async function RubricsPage(props: PageProps<"/rubrics">) {
  const user = await requirePageUser({ permission: screen.permission, from: screen.href });
  const { partType } = await props.searchParams;
  const partTypes = await listPartTypesWithRubrics({ workspaceId: user.workspaceId });
  const initial = partTypes.find((p) => p.id === partType)?.id ?? null;
  return (
    <div className="max-w-7xl space-y-6">
      <div>
        <h1 className="page-title">Rubrics</h1>
        <p className="max-w-3xl text-gauge-700">
          How each part type&rsquo;s measurements become a grade. Trainers edit a draft and try it on a sample unit; a QC lead publishes it. A published version never changes, and grades keep the
          version they were given under.
        </p>
      </div>
      {partTypes.length === 0 ? (
        <EmptyState title="No part types yet" testId="rubrics-empty">
          A rubric belongs to a part type.{" "}
          <Link href="/part-types" className="font-medium text-gauge-700 underline">
            Add part types first
          </Link>{" "}
          (the examples come with example rubrics to adapt).
        </EmptyState>
      ) : (
        partTypes.some((p) => p.publishedVersion === null) && (
          <p className="max-w-3xl rounded-md bg-signal-50 px-3 py-2 text-sm text-signal-700" data-testid="rubrics-unpublished">
            {partTypes.filter((p) => p.publishedVersion === null).length} of {partTypes.length} part types have no published rubric: their units cannot be graded, and their lots are judged on the
            checklist alone. Example rubrics start as drafts: adapt the thresholds to your contracts, then a QC lead publishes them.
          </p>
        )
      )}
      <RubricScreen
        partTypes={partTypes.map((p) => ({ id: p.id, name: p.name, publishedVersion: p.publishedVersion, draftVersion: p.draftVersion }))}
        initialPartTypeId={initial}
        canDraft={can(user, "rubrics.edit")}
        canPublish={can(user, "rubrics.publish")}
      />
      <p className="max-w-3xl text-xs text-gauge-600">
        Grades are decision aids; company policy, supplier contracts and local regulations decide. The seeded rubrics are invented examples to adapt. ISO 13406-2 pixel-fault classes are summarised;
        the licensed standard governs.
      </p>
    </div>
  );
}
