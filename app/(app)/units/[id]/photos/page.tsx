import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PhotoStrip } from "@/components/photos/photo-strip";
import { PhotoUploader } from "@/components/photos/photo-uploader";
import { BatteryCaution, StaticCaution } from "@/components/ui/cautions";
import { requirePageUser } from "@/lib/auth/require-user";
import { hasAnyRole } from "@/lib/auth/roles";
import { canAddPhotos } from "@/lib/photos/intents";
import { getUnitForPhotos, unitLabel } from "@/lib/photos/queries";
import { STATUS_LABELS } from "@/lib/units/state-machine";
import { parseId } from "@/lib/validation";

export const metadata: Metadata = { title: "Unit photos" };

/** Photo intake for one unit (a later Bench page hosts the same two components). */
export default async function UnitPhotosPage(props: PageProps<"/units/[id]/photos">) {
  const { id } = await props.params;
  const user = await requirePageUser({ from: `/units/${id}/photos` });
  let unitId: string;
  try {
    unitId = parseId(id, "That unit");
  } catch {
    notFound();
  }
  const unit = await getUnitForPhotos({ workspaceId: user.workspaceId, unitId });
  if (!unit) notFound();
  const views = unit.partType.views.map((v) => ({ key: v.key, label: v.label, required: v.required }));
  const mayUpload = hasAnyRole(user.roles, "inspector");
  const open = canAddPhotos(unit);
  const staticSensitive = /flex|camera|display|board/.test(`${unit.partType.category} ${unit.partType.slug}`);

  return (
    <div className="max-w-6xl space-y-6">
      <div>
        <p className="text-sm text-gauge-600">
          {unit.partType.name} ·{" "}
          <Link href={`/units/${unit.id}`} className="underline">
            Back to the unit
          </Link>
        </p>
        <h1 className="page-title">Photos of {unitLabel(unit)}</h1>
        <p className="text-sm text-gauge-700">
          The unit is {STATUS_LABELS[unit.status]}. Photograph every required view: {views.filter((v) => v.required).map((v) => v.label).join(", ") || "none listed"}.
        </p>
      </div>
      {unit.partType.category === "battery" && <BatteryCaution />}
      {staticSensitive && <StaticCaution />}
      {mayUpload && open && <PhotoUploader unitId={unit.id} views={views} />}
      {mayUpload && !open && <p className="text-sm text-gauge-700">This unit has been graded, so no more photos can be added.</p>}
      <PhotoStrip unitId={unit.id} views={views} canManage={mayUpload} />
    </div>
  );
}
