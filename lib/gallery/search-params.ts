/**
 * The Gallery list's state lives in the URL (`/gallery?partType=…&view=…&defect=…&kind=…&grade=…
 * &status=…&cursor=…`), read and written with the app's list helpers (lib/url-state/list-params.ts):
 * a value that does not parse, or a part type not among the workspace's, is left out (never an
 * error page), and a filter change starts again at the first page. Pure: the server page parses
 * its searchParams here, the filter bar builds its links here.
 *
 * One decision of the Gallery's own: a view or a class belongs to a part type, so choosing another
 * part type clears the view (and the class, which may not exist on the new one).
 */
import { listParamsSearch, readListParams, type RawSearchParams } from "@/lib/url-state/list-params";
import { galleryListQuerySchema } from "./schemas";

export const galleryListParamsSchema = galleryListQuerySchema.omit({ limit: true });
export type GalleryFilters = ReturnType<typeof galleryListParamsSchema.parse>;
export const FILTER_KEYS = ["partType", "view", "defect", "kind", "grade", "status"] as const;
export type FilterKey = (typeof FILTER_KEYS)[number];
const PAGE_KEYS = ["cursor"] as const;

export function parseGallerySearchParams(raw: RawSearchParams, { partTypeIds }: { partTypeIds?: readonly string[] } = {}): GalleryFilters {
  return readListParams(galleryListParamsSchema, raw, { allowed: partTypeIds ? { partType: partTypeIds } : {}, pageKeys: PAGE_KEYS }).params;
}

/** The list's URL with `changes` applied; any filter change starts again at the first page. */
export function galleryHref(current: GalleryFilters, changes: Partial<Record<FilterKey | "cursor", string | undefined>>): string {
  const next: Record<string, string | undefined> = { ...current, ...changes };
  if (Object.keys(changes).some((k) => k !== "cursor")) delete next.cursor;
  if ("partType" in changes && changes.partType !== current.partType) {
    delete next.view;
    delete next.defect;
  }
  return `/gallery${listParamsSearch(galleryListParamsSchema, next as GalleryFilters)}`;
}
