/**
 * TanStack Query keys of the Part types feature; every key starts with `partTypeKeys.all`, which
 * saving a part type invalidates (its screens are server-rendered; this refreshes whatever the
 * browser holds of them).
 */
export const partTypeKeys = {
  all: ["part-types"] as const,
  /** Photos of one view a lead draws its zones on (the zone drawer). */
  samplePhotos: (partTypeId: string, viewKey: string) => [...partTypeKeys.all, partTypeId, "sample-photos", viewKey] as const,
};
