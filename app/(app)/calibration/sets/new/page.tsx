import type { Metadata } from "next";
import Link from "next/link";
import { SetBuilder, type BuilderItem } from "@/components/calibration/set-builder";
import { EmptyState } from "@/components/ui/empty-state";
import { listPartTypes } from "@/db/queries/part-types";
import { requirePageUser } from "@/lib/auth/require-user";
import { listGallery } from "@/lib/gallery/items";

export const metadata: Metadata = { title: "New calibration set" };

/** How many published examples the builder offers (the newest first; a set takes at most 50). */
const OFFERED = 100;

/** A trainer assembles a set from published gallery examples: their regions and grades become its key. */
export default async function NewCalibrationSetPage() {
  const user = await requirePageUser({ permission: "calibration.manage", from: "/calibration/sets/new" });
  const [page, partTypeRows] = await Promise.all([listGallery(user, { status: "published", limit: OFFERED }), listPartTypes({ workspaceId: user.workspaceId })]);
  const partTypes = new Map(partTypeRows.map((p) => [p.id, p]));
  const items: BuilderItem[] = page.items.map((item) => {
    const partType = partTypes.get(item.partType.id);
    return {
      ...item,
      viewLabel: partType?.views.find((v) => v.key === item.viewKey)?.label ?? item.viewKey,
      classKeys: partType?.defectClasses.map((d) => d.key) ?? item.defectClasses,
      classLabels: Object.fromEntries(partType?.defectClasses.map((d) => [d.key, d.label]) ?? []),
    };
  });
  return (
    <div className="max-w-7xl space-y-4">
      <div>
        <Link href="/calibration" className="text-sm text-gauge-700 underline">
          Calibration
        </Link>
        <h1 className="page-title">New calibration set</h1>
        <p className="text-gauge-700">
          Choose 5–50 published examples in the order they are to be taken. Each example&apos;s regions and grade, as they are now, become the key; later edits in the Gallery do not change the set.
        </p>
      </div>
      {items.length < 5 ? (
        <EmptyState title="Not enough published examples" testId="builder-empty">
          A set needs at least 5 published gallery examples; this workspace has {items.length}.{" "}
          <Link href="/gallery" className="font-medium underline">
            Publish examples in the Gallery
          </Link>{" "}
          first.
        </EmptyState>
      ) : (
        <SetBuilder items={items} more={page.nextCursor !== null} />
      )}
    </div>
  );
}
