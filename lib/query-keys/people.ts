/** TanStack Query keys of the People feature; every key starts with `peopleKeys.all`. */
export const peopleKeys = {
  all: ["people"] as const,
  /** Everyone in the workspace (sorted in the browser, so one key serves every sort). */
  list: () => [...peopleKeys.all, "list"] as const,
};
