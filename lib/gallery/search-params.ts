/**
 * The Gallery list's state lives in the URL (`/gallery?partType=…&view=…&defect=…&kind=…&grade=…
 * &status=…&cursor=…`), so back/forward and a shared link show the same view. Pure: the server
 * page parses its searchParams here, the filter bar builds its links here.
 *
 * Decisions: a value that does not parse is dropped with the rest kept (a stale or hand-edited
 * link still opens the gallery, never an error page); changing any filter drops the cursor (page 1).
 */
import { galleryListQuerySchema, type GalleryListQuery } from "./schemas";

export type GalleryFilters = Omit<GalleryListQuery, "limit">;
export const FILTER_KEYS = ["partType", "view", "defect", "kind", "grade", "status"] as const;
export type FilterKey = (typeof FILTER_KEYS)[number];

type RawParams = Record<string, string | string[] | undefined>;

export function parseGallerySearchParams(raw: RawParams): GalleryFilters {
  const out: GalleryFilters = {};
  for (const key of [...FILTER_KEYS, "cursor"] as const) {
    const value = raw[key];
    if (typeof value !== "string" || value === "") continue;
    const parsed = galleryListQuerySchema.shape[key].safeParse(value);
    if (parsed.success && parsed.data !== undefined) Object.assign(out, { [key]: parsed.data });
  }
  return out;
}

/** The list's URL with `changes` applied; any filter change starts again at the first page. */
export function galleryHref(current: GalleryFilters, changes: Partial<Record<FilterKey | "cursor", string | undefined>>): string {
  const next: Record<string, string | undefined> = { ...current, ...changes };
  if (Object.keys(changes).some((k) => k !== "cursor")) delete next.cursor;
  // A view or class belongs to a part type: choosing another part type clears them.
  if ("partType" in changes && changes.partType !== current.partType) {
    delete next.view;
    delete next.defect;
  }
  const params = new URLSearchParams();
  for (const key of [...FILTER_KEYS, "cursor"]) if (next[key]) params.set(key, next[key]!);
  const query = params.toString();
  return query ? `/gallery?${query}` : "/gallery";
}
