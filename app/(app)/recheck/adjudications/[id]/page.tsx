import type { Metadata } from "next";
import { measurementLabels } from "@/components/grading/measurement-labels";
import { AdjudicationScreen } from "@/components/recheck/adjudication-screen";
import { getPartType } from "@/db/queries/part-types";
import { requirePageUser } from "@/lib/auth/require-user";
import { pageIdOrNotFound } from "@/lib/http/page-params";
import { adjudicationView } from "@/lib/recheck/adjudication-view";

export const metadata: Metadata = { title: "Settle a disagreement" };

/** A disagreement between a grade and its recheck, for a lead or an auditor who graded neither side. */
export default async function AdjudicationPage(props: PageProps<"/recheck/adjudications/[id]">) {
  const { id: rawId } = await props.params;
  const user = await requirePageUser({ permission: "recheck.adjudicate", from: `/recheck/adjudications/${rawId}` });
  const view = await adjudicationView(user, pageIdOrNotFound(rawId));
  // The part type's own names for its defect classes and views (the stored comparison keys them).
  const partType = await getPartType({ workspaceId: user.workspaceId, partTypeId: view.unit.partTypeId });
  const labels = partType ? measurementLabels(partType) : { defects: {}, zones: {}, views: {} };
  return <AdjudicationScreen view={view} labels={labels} />;
}
