import type { Metadata } from "next";
import Link from "next/link";
import { CompareColumn } from "@/components/gallery/compare-column";
import { GalleryCard } from "@/components/gallery/gallery-card";
import { getGradingPartType } from "@/db/queries/rubrics";
import { requirePageUser } from "@/lib/auth/require-user";
import { AppError } from "@/lib/errors";
import type { GalleryItemDto } from "@/lib/gallery/dto";
import { listGallery, readGalleryItem } from "@/lib/gallery/items";
import type { SessionUser } from "@/lib/auth/require-user";
import { isUuid } from "@/lib/validation";

export const metadata: Metadata = { title: "Compare gallery items" };

const one = (value: string | string[] | undefined) => (typeof value === "string" && isUuid(value) ? value.toLowerCase() : null);

/** An item the reader may see, or null (missing, another workspace's, or a draft they may not see). */
async function visibleItem(user: SessionUser, id: string | null): Promise<GalleryItemDto | null> {
  if (!id) return null;
  return readGalleryItem(user, id).catch((err: unknown) => {
    if (err instanceof AppError && err.code === "not_found") return null;
    throw err;
  });
}

/**
 * Two gallery items side by side (`?a=…&b=…`), each on its own read-only canvas with its caption,
 * grade and measured numbers. With only `a`, the page offers the other items of the same part
 * type to pick from, the same view first.
 */
export default async function ComparePage(props: PageProps<"/gallery/compare">) {
  const user = await requirePageUser({ permission: "gallery.read", from: "/gallery/compare" });
  const search = await props.searchParams;
  const [a, b] = await Promise.all([visibleItem(user, one(search.a)), visibleItem(user, one(search.b))]);
  const first = a ?? b;
  if (!first) {
    return (
      <div className="card max-w-xl space-y-3 p-6">
        <h1 className="text-lg font-semibold">Nothing to compare</h1>
        <p className="text-sm text-gauge-700">Open an item in the Gallery and choose “Compare with another…”.</p>
        <Link href="/gallery" className="btn-primary">
          Back to the Gallery
        </Link>
      </div>
    );
  }
  const partTypes = await Promise.all(
    [...new Set([a, b].filter((i): i is GalleryItemDto => i !== null).map((i) => i.partType.id))].map((id) => getGradingPartType({ workspaceId: user.workspaceId, partTypeId: id })),
  );
  const partTypeOf = (item: GalleryItemDto) => partTypes.find((p) => p?.id === item.partType.id)!;

  if (!a || !b) {
    const page = await listGallery(user, { partType: first.partType.id, limit: 48 });
    const pt = partTypeOf(first);
    const others = page.items.filter((i) => i.id !== first.id).sort((x, y) => Number(y.viewKey === first.viewKey) - Number(x.viewKey === first.viewKey));
    return (
      <div className="max-w-7xl space-y-4">
        <Link href={`/gallery/${first.id}`} className="text-sm text-gauge-700 underline">
          ← Back to the item
        </Link>
        <h1 className="page-title">Compare with…</h1>
        <p className="text-gauge-700">Pick another {first.partType.name} item to put beside this one.</p>
        {others.length === 0 ? (
          <p className="text-sm text-gauge-700">There is no other item of this part type yet.</p>
        ) : (
          <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4 xl:grid-cols-5" data-testid="compare-choices">
            {others.map((item) => (
              <li key={item.id}>
                <GalleryCard
                  item={item}
                  viewLabel={pt.views.find((v) => v.key === item.viewKey)?.label ?? item.viewKey}
                  classLabels={Object.fromEntries(pt.defectClasses.map((d) => [d.key, d.label]))}
                  classKeys={pt.defectClasses.map((d) => d.key)}
                  showStatus
                  href={`/gallery/compare?a=${first.id}&b=${item.id}`}
                />
              </li>
            ))}
          </ul>
        )}
      </div>
    );
  }
  return (
    <div className="space-y-3">
      <h1 className="page-title">Compare</h1>
      <div className="grid gap-4 md:grid-cols-2" data-testid="compare">
        {[a, b].map((item) => {
          const pt = partTypeOf(item);
          return <CompareColumn key={item.id} item={item} partType={{ views: pt.views, defectClasses: pt.defectClasses }} />;
        })}
      </div>
    </div>
  );
}
