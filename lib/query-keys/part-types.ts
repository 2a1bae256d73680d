/**
 * TanStack Query keys of the Part types feature; every key starts with `partTypeKeys.all`, which
 * saving a part type invalidates (its screens are server-rendered; this refreshes whatever the
 * browser holds of them).
 */
export const partTypeKeys = {
  all: ["part-types"] as const,
};
