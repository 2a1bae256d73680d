/** TanStack Query keys of the Rubrics feature; every key starts with `rubricKeys.all`. */
export const rubricKeys = {
  all: ["rubrics"] as const,
  /** A part type's rubric versions (drafts and published), with the part type's classes. */
  versions: (partTypeId: string | null) => [...rubricKeys.all, "versions", partTypeId] as const,
};
