/**
 * TanStack Query keys of the Gallery, from this one factory (never bare strings), so a change can
 * invalidate exactly what it affects: an edit refreshes the item and its measurement, a publish
 * or retire also the reference panels.
 */
export const galleryKeys = {
  all: ["gallery"] as const,
  item: (id: string) => [...galleryKeys.all, "item", id] as const,
  /** Keyed on the revision: new regions are measured again, an unchanged item is not. */
  measurement: (id: string, revision: number) => [...galleryKeys.item(id), "measurement", revision] as const,
  references: () => [...galleryKeys.all, "reference"] as const,
  reference: (partTypeId: string, viewKey: string, defect: string | null) => [...galleryKeys.references(), partTypeId, viewKey, defect ?? "any"] as const,
};
