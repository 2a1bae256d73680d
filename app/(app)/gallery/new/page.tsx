import type { Metadata } from "next";
import Link from "next/link";
import { GalleryUploadForm } from "@/components/gallery/upload-form";
import { GradeBadge } from "@/components/grading/grade-badge";
import { listRecentlyGradedUnits } from "@/db/queries/gallery";
import { listPartTypes } from "@/db/queries/part-types";
import { requirePageUser } from "@/lib/auth/require-user";
import { formatDateTime } from "@/lib/time/format";

export const metadata: Metadata = { title: "Add to the gallery" };

/**
 * The two ways into the Gallery (trainers and leads): a graded unit's photo, promoted from its
 * Bench with "Add to gallery" (recently graded units are listed here to get there), or a photo
 * uploaded straight into the gallery.
 */
export default async function GalleryAddPage() {
  const user = await requirePageUser({ permission: "gallery.edit", from: "/gallery/new" });
  const [partTypes, graded] = await Promise.all([listPartTypes({ workspaceId: user.workspaceId, active: true }), listRecentlyGradedUnits({ workspaceId: user.workspaceId, limit: 30 })]);
  return (
    <div className="max-w-5xl space-y-4">
      <Link href="/gallery" className="text-sm text-gauge-700 underline">
        ← Gallery
      </Link>
      <h1 className="page-title">Add to the gallery</h1>
      <div className="grid gap-4 lg:grid-cols-2">
        <section className="space-y-2" aria-labelledby="from-unit">
          <h2 id="from-unit" className="text-lg font-semibold">
            From a graded unit
          </h2>
          <p className="text-sm text-gauge-700">Open the unit on the Bench, pick the photo and choose “Add to gallery”: its regions and the unit&apos;s grade become a draft.</p>
          {graded.length === 0 ? (
            <p className="card p-4 text-sm text-gauge-700">No unit has been graded yet.</p>
          ) : (
            <ul className="card divide-y divide-gauge-100" data-testid="graded-units">
              {graded.map((u) => (
                <li key={u.id}>
                  <Link href={`/units/${u.id}`} className="flex items-center gap-3 px-3 py-2 text-sm hover:bg-gauge-50">
                    <GradeBadge grade={u.grade} size="sm" />
                    <span className="min-w-0 flex-1 truncate">
                      <span className="font-medium">{u.partTypeName}</span> · {u.serial ?? `sample ${u.sampleIndex}`} ({u.purchaseRef})
                    </span>
                    <span className="shrink-0 text-xs text-gauge-600">{formatDateTime(u.gradedAt, user.timeZone)}</span>
                  </Link>
                </li>
              ))}
            </ul>
          )}
        </section>
        <section className="space-y-2" aria-labelledby="upload">
          <h2 id="upload" className="text-lg font-semibold">
            Upload a photo
          </h2>
          <p className="text-sm text-gauge-700">Say what it shows and the grade it deserves; then mark its regions and write its caption on the item&apos;s page, and publish it.</p>
          <GalleryUploadForm partTypes={partTypes.map((p) => ({ id: p.id, name: p.name, views: p.views.map((v) => ({ key: v.key, label: v.label })) }))} />
        </section>
      </div>
    </div>
  );
}
