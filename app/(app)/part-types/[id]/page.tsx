import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PartTypeDetails } from "@/components/part-types/part-type-details";
import { PartTypeForm } from "@/components/part-types/part-type-form";
import { BatteryCaution, StaticCaution } from "@/components/ui/cautions";
import { getPartType } from "@/db/queries/part-types";
import { requirePageUser } from "@/lib/auth/require-user";
import { pageIdOrNotFound } from "@/lib/http/page-params";
import { can } from "@/lib/auth/permissions";
import { partTypeToForm } from "@/lib/part-types/form-model";
import { CATEGORY_LABELS, STATIC_SENSITIVE, type PartCategory } from "@/lib/part-types/schemas";

export const metadata: Metadata = { title: "Part type" };

export default async function PartTypePage(props: PageProps<"/part-types/[id]">) {
  const { id: rawId } = await props.params;
  const user = await requirePageUser({ permission: "part-types.read", from: `/part-types/${rawId}` });
  const id = pageIdOrNotFound(rawId);
  const partType = await getPartType({ workspaceId: user.workspaceId, partTypeId: id });
  if (!partType) notFound();
  const category = partType.category as PartCategory;
  return (
    <div className="max-w-5xl space-y-6">
      <Link href="/part-types" className="text-sm text-gauge-600 underline">
        ← Part types
      </Link>
      <div>
        <h1 className="page-title">{partType.name}</h1>
        <p className="text-gauge-700">
          {CATEGORY_LABELS[category] ?? partType.category}
          {partType.modelFamily ? ` · ${partType.modelFamily}` : ""}
          {partType.nominalSizeMm ? ` · ${partType.nominalSizeMm.width} × ${partType.nominalSizeMm.height} mm` : ""}
          {partType.panelResolution ? ` · panel ${partType.panelResolution.width} × ${partType.panelResolution.height} px` : ""}
          {partType.inspectAll ? " · every unit inspected" : ""}
          {partType.active ? "" : " · retired"}
        </p>
      </div>
      {category === "battery" && <BatteryCaution />}
      {STATIC_SENSITIVE.includes(category) && <StaticCaution />}
      <PartTypeDetails partType={partType} />
      {can(user, "part-types.edit") && <PartTypeForm partTypeId={partType.id} initial={partTypeToForm(partType)} />}
    </div>
  );
}
