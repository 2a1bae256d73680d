import type { Metadata } from "next";
import Link from "next/link";
import { GalleryCard } from "@/components/gallery/gallery-card";
import { GalleryFilters, type FilterPartType } from "@/components/gallery/gallery-filters";
import { EmptyState } from "@/components/ui/empty-state";
import { listPartTypes } from "@/db/queries/part-types";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/auth/require-user";
import { canEditGallery } from "@/lib/gallery/access";
import { isGalleryCursor } from "@/lib/gallery/cursor";
import { listGallery } from "@/lib/gallery/items";
import { GALLERY_PAGE_DEFAULT } from "@/lib/gallery/schemas";
import { galleryHref, parseGallerySearchParams } from "@/lib/gallery/search-params";
import { screenByHref } from "@/lib/nav";

const screen = screenByHref("/gallery")!;
export const metadata: Metadata = { title: screen.label };

/**
 * The Gallery: reference examples as a grid of thumbnails with their regions drawn over them.
 * Filters and the page live in the URL (lib/gallery/search-params.ts); the page is rendered here,
 * on the server, for whatever the URL says.
 */
export default async function GalleryPage(props: PageProps<"/gallery">) {
  const user = await requirePageUser({ permission: screen.permission, from: screen.href });
  const partTypeRows = await listPartTypes({ workspaceId: user.workspaceId });
  const filters = parseGallerySearchParams(await props.searchParams, { partTypeIds: partTypeRows.map((p) => p.id) });
  // A cursor that does not decode (an old or edited link) opens the first page rather than an error.
  if (filters.cursor && !isGalleryCursor(filters.cursor)) delete filters.cursor;
  const canEdit = canEditGallery(user.roles);
  const canManageSuggestions = can(user, "suggestions.manage");
  const page = await listGallery(user, { ...filters, limit: GALLERY_PAGE_DEFAULT });
  const partTypes: FilterPartType[] = partTypeRows.map((p) => ({
    id: p.id,
    name: p.name,
    views: p.views.map((v) => ({ key: v.key, label: v.label })),
    defectClasses: p.defectClasses.map((d) => ({ key: d.key, label: d.label })),
  }));
  const byId = new Map(partTypes.map((p) => [p.id, p]));
  const filtered = Object.keys(filters).some((k) => k !== "cursor");
  return (
    <div className="max-w-7xl space-y-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="page-title">Gallery</h1>
          <p className="text-gauge-700">{screen.summary}</p>
        </div>
        <div className="flex flex-wrap gap-2">
          {canManageSuggestions && (
            <Link href="/gallery/suggestions" className="btn-secondary" data-testid="gallery-suggestions">
              Suggestions
            </Link>
          )}
          {canEdit && (
            <Link href="/gallery/new" className="btn-primary" data-testid="gallery-add">
              Add an example
            </Link>
          )}
        </div>
      </div>
      <GalleryFilters filters={filters} partTypes={partTypes} canEdit={canEdit} />
      {page.items.length === 0 ? (
        <EmptyState title={filtered ? "Nothing matches these filters" : "The gallery is empty"} testId="gallery-empty">
          {filtered ? (
            <>
              No {canEdit ? "" : "published "}item matches.{" "}
              <Link href="/gallery" className="font-medium underline">
                Show every item
              </Link>
              .
            </>
          ) : canEdit ? (
            <>
              Add examples: open a graded unit on the Bench and choose “Add to gallery” under its photo, or upload a photo (
              <Link href="/gallery/new" className="font-medium underline">
                Add an example
              </Link>
              ). Write a caption that says why it has its grade, then publish it.
            </>
          ) : (
            "Trainers publish reference examples here: what a normal part looks like and what each defect looks like, with the grade it deserves."
          )}
        </EmptyState>
      ) : (
        <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4 xl:grid-cols-5" data-testid="gallery-grid">
          {page.items.map((item) => {
            const partType = byId.get(item.partType.id);
            const viewLabel = partType?.views.find((v) => v.key === item.viewKey)?.label ?? item.viewKey;
            const classLabels = Object.fromEntries(partType?.defectClasses.map((d) => [d.key, d.label]) ?? []);
            return (
              <li key={item.id}>
                <GalleryCard
                  item={item}
                  viewLabel={viewLabel}
                  classLabels={classLabels}
                  classKeys={partType?.defectClasses.map((d) => d.key) ?? item.defectClasses}
                  showStatus={canEdit}
                  href={`/gallery/${item.id}`}
                />
              </li>
            );
          })}
        </ul>
      )}
      {(filters.cursor || page.nextCursor) && (
        <nav aria-label="Pages" className="flex gap-2">
          {filters.cursor && (
            <Link href={galleryHref(filters, { cursor: undefined })} className="btn-secondary" data-testid="gallery-first-page">
              First page
            </Link>
          )}
          {page.nextCursor && (
            <Link href={galleryHref(filters, { cursor: page.nextCursor })} className="btn-secondary" data-testid="gallery-next-page">
              Next page
            </Link>
          )}
        </nav>
      )}
    </div>
  );
}
